import { Router } from 'express';

import type { Database } from '@/db/client';
import type { Mail, Mailer } from '@/server/auth/mailer';
import { decisionPdfQuery, emptyInput, updateDecisionInput } from '@/server/contracts/decision';
import { parse } from '@/server/http/errors';
import { reviewParams } from '@/server/http/params';
import { requireReview } from '@/server/services/access';
import type { Broadcast } from '@/server/services/broadcast';
import { getDecision, reopenDecision, signDecision, updateDecision, type Signed } from '@/server/services/decision';
import { decisionPdfOf } from '@/server/services/exports/decision-pdf';

type Deps = { db: Database; broadcast: Broadcast; mailer: Mailer; origin: string };

/** The decision record of a Review: read by every member, edited, signed and reopened by the Lead or Owner. */
export function decisionRouter({ db, broadcast, mailer, origin }: Deps): Router {
  const router = Router();

  router.get('/reviews/:reviewId/decision', async (req, res) => {
    const { reviewId } = parse(reviewParams, req.params);
    await requireReview(db, res.locals.user.id, reviewId);
    res.json(await getDecision(db, reviewId));
  });

  router.put('/reviews/:reviewId/decision', async (req, res) => {
    const { reviewId } = parse(reviewParams, req.params);
    const input = parse(updateDecisionInput, req.body);
    const userId = res.locals.user.id;
    await requireReview(db, userId, reviewId, { decision: ['edit'] });
    res.json(await updateDecision({ db, broadcast, actorId: userId }, reviewId, input));
  });

  router.post('/reviews/:reviewId/decision/sign', async (req, res) => {
    const { reviewId } = parse(reviewParams, req.params);
    parse(emptyInput, req.body ?? {});
    const { id: userId, name } = res.locals.user;
    const access = await requireReview(db, userId, reviewId, { decision: ['sign'] });
    const signed = await signDecision({ db, broadcast, actorId: userId }, reviewId, {
      userId,
      role: access.role,
      name,
    });
    // The answer does not wait for the mail server; a failed mail is logged, the signature stands.
    for (const mail of signedMails(signed, origin)) {
      mailer.send(mail).catch((error: unknown) => console.error(`[mail] decision mail to ${mail.to} failed:`, error));
    }
    res.json(signed.revision);
  });

  router.post('/reviews/:reviewId/decision/reopen', async (req, res) => {
    const { reviewId } = parse(reviewParams, req.params);
    parse(emptyInput, req.body ?? {});
    const userId = res.locals.user.id;
    await requireReview(db, userId, reviewId, { decision: ['reopen'] });
    res.status(201).json(await reopenDecision({ db, broadcast, actorId: userId }, reviewId));
  });

  router.get('/reviews/:reviewId/decision.pdf', async (req, res) => {
    const { reviewId } = parse(reviewParams, req.params);
    const { revision } = parse(decisionPdfQuery, req.query);
    const userId = res.locals.user.id;
    const access = await requireReview(db, userId, reviewId);
    const pdf = await decisionPdfOf(db, reviewId, revision, { userId, role: access.role });
    res
      .status(200)
      .type('application/pdf')
      .setHeader('Content-Disposition', `attachment; filename="${pdf.fileName}"`)
      .setHeader('Cache-Control', 'no-store')
      .send(pdf.bytes);
  });

  return router;
}

const oneLine = (s: string) => s.replace(/\s+/g, ' ').trim();

/** "Decision signed" to every member of the Review's Team, with a link to the decision page. */
export function signedMails({ revision, review, members }: Signed, origin: string): Mail[] {
  const link = `${origin}/reviews/${encodeURIComponent(review.id)}/decision`;
  const signer = revision.signedBy?.name ?? 'The Lead';
  const chosen = revision.snapshot?.candidates.find((c) => c.id === revision.chosenCandidateId)?.name ?? 'a candidate';
  const excerpt = revision.rationale.length > 600 ? `${revision.rationale.slice(0, 600)}…` : revision.rationale;
  return members.map((m) => ({
    to: m.email,
    subject: oneLine(`Decision signed in “${review.name}”: ${chosen}`),
    text:
      `Hello ${m.name},\n\n` +
      `${signer} signed revision ${revision.number} of the decision record of the Review “${review.name}”.\n\n` +
      `Chosen candidate: ${chosen}\n\nRationale:\n${excerpt
        .split('\n')
        .map((line) => `> ${line}`)
        .join('\n')}\n\n` +
      `Read the record or download it as PDF: ${link}\n\n` +
      `You get this e-mail because you are a member of the Review's Team.`,
  }));
}
