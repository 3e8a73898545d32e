import { Router } from 'express';
import { z } from 'zod';

import type { Database } from '@/db/client';
import type { Mail, Mailer } from '@/server/auth/mailer';
import { postCommentInput } from '@/server/contracts/board';
import { parse } from '@/server/http/errors';
import { reviewParams } from '@/server/http/params';
import { requireReview } from '@/server/services/access';
import type { Broadcast } from '@/server/services/broadcast';
import { listComments, listMentionable, postComment, type MentionNotice } from '@/server/services/comments';

const listCommentsQuery = z.object({
  candidateId: z.string({ error: 'candidateId must be a candidate id.' }).min(1).max(64).optional(),
});

type Deps = { db: Database; broadcast: Broadcast; mailer: Mailer; origin: string };

/** Comments on a Review and its candidates, one level of replies, @mentions told by e-mail. */
export function commentsRouter({ db, broadcast, mailer, origin }: Deps): Router {
  const router = Router();

  router.get('/reviews/:reviewId/comments', async (req, res) => {
    const { reviewId } = parse(reviewParams, req.params);
    const { candidateId } = parse(listCommentsQuery, req.query);
    await requireReview(db, res.locals.user.id, reviewId);
    res.json(await listComments(db, reviewId, candidateId));
  });

  router.post('/reviews/:reviewId/comments', async (req, res) => {
    const { reviewId } = parse(reviewParams, req.params);
    const input = parse(postCommentInput, req.body);
    const userId = res.locals.user.id;
    await requireReview(db, userId, reviewId, { comment: ['create'] });
    const posted = await postComment({ db, broadcast, actorId: userId }, reviewId, input);
    // The answer does not wait for the mail server; a failed mail is logged, the comment stands.
    for (const notice of posted.mentionNotices) {
      mailer
        .send(mentionMail(notice, origin))
        .catch((error: unknown) => console.error(`[mail] mention mail to ${notice.to.email} failed:`, error));
    }
    // A retry answers as the first post did (201, the stored comment); the header tells it apart.
    if (!posted.created) res.setHeader('Idempotent-Replayed', 'true');
    res.status(201).json(posted.comment);
  });

  router.get('/reviews/:reviewId/mentionable', async (req, res) => {
    const { reviewId } = parse(reviewParams, req.params);
    await requireReview(db, res.locals.user.id, reviewId);
    res.json(await listMentionable(db, reviewId));
  });

  return router;
}

const oneLine = (s: string) => s.replace(/\s+/g, ' ').trim();
const excerptLength = 600;

/** The mail that tells a member someone @mentioned them, with a link to the Review. */
export function mentionMail(n: MentionNotice, origin: string): Mail {
  const where = n.candidateName
    ? `on the candidate “${n.candidateName}” in the Review “${n.reviewName}”`
    : `in the Review “${n.reviewName}”`;
  const body = n.body.length > excerptLength ? `${n.body.slice(0, excerptLength)}…` : n.body;
  const quoted = body
    .split('\n')
    .map((line) => `> ${line}`)
    .join('\n');
  return {
    to: n.to.email,
    subject: oneLine(`${n.author} mentioned you in “${n.reviewName}” on Cyclemoot`),
    text:
      `Hello ${n.to.name},\n\n` +
      `${n.author} mentioned you in a comment ${where}:\n\n${quoted}\n\n` +
      `Open the Review to answer: ${origin}/reviews/${encodeURIComponent(n.reviewId)}\n\n` +
      `You get this e-mail because you are a member of the Review's Team.`,
  };
}
