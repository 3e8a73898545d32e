import { and, asc, eq, gt, isNull, ne, or, sql } from 'drizzle-orm';

import type { Database } from '@/db/client';
import { candidate, comment, review, teamMember, user, userSetting } from '@/db/schema';
import type { Mail, Mailer } from '@/server/auth/mailer';

import type { JobQueue } from './queue';

/** How far back the first digest of a person who never had one looks. */
const firstDigestHours = 24;
const excerptLength = 280;
const oneLine = (s: string) => s.replace(/\s+/g, ' ').trim();

type DigestComment = {
  reviewId: string;
  reviewName: string;
  candidateName: string | null;
  author: string;
  body: string;
  createdAt: Date;
};

/** The daily mail: the comments posted in the person's Reviews since the last one, by Review. */
export function digestMail(
  to: { email: string; name: string },
  comments: DigestComment[],
  origin: string,
  since: Date,
): Mail {
  const byReview = new Map<string, DigestComment[]>();
  for (const c of comments) byReview.set(c.reviewId, [...(byReview.get(c.reviewId) ?? []), c]);
  const sections = [...byReview.entries()].map(([reviewId, list]) => {
    const lines = list.map((c) => {
      const where = c.candidateName ? ` on “${c.candidateName}”` : '';
      const body = c.body.length > excerptLength ? `${c.body.slice(0, excerptLength)}…` : c.body;
      return `- ${c.author}${where}, ${c.createdAt.toISOString().slice(0, 16).replace('T', ' ')} UTC:\n  ${oneLine(body)}`;
    });
    return `${list[0].reviewName} (${list.length} new)\n${lines.join('\n')}\n${origin}/reviews/${encodeURIComponent(reviewId)}`;
  });
  const count = comments.length;
  return {
    to: to.email,
    subject: `Cyclemoot: ${count} new comment${count === 1 ? '' : 's'} in your Reviews`,
    text:
      `Hello ${to.name},\n\n` +
      `Since ${since.toISOString().slice(0, 16).replace('T', ' ')} UTC, ${count} comment${count === 1 ? ' was' : 's were'} posted in your Reviews:\n\n` +
      `${sections.join('\n\n')}\n\n` +
      `You get this e-mail because you chose the daily digest in Settings; turn it off there.`,
  };
}

/**
 * The daily digest: for each person who chose it, the comments others posted in the
 * Reviews of their Teams since their last digest (the last 24 hours the first time). Each
 * person is handled in a transaction that locks their settings row, so a second run at the
 * same moment waits and then finds nothing new. A person with nothing new gets no mail.
 * Returns how many mails were sent to `mailer`.
 */
export async function sendDailyDigests({
  db,
  mailer,
  origin,
  now = new Date(),
}: {
  db: Database;
  mailer: Mailer;
  origin: string;
  now?: Date;
}): Promise<number> {
  const subscribers = await db
    .select({ userId: userSetting.userId })
    .from(userSetting)
    .where(eq(userSetting.dailyDigest, true));
  let sent = 0;
  for (const { userId } of subscribers) {
    const mailed = await db.transaction(async (tx) => {
      const [who] = await tx
        .select({
          email: user.email,
          name: user.name,
          dailyDigest: userSetting.dailyDigest,
          digestSentAt: userSetting.digestSentAt,
        })
        .from(userSetting)
        .innerJoin(user, eq(user.id, userSetting.userId))
        .where(eq(userSetting.userId, userId))
        .for('update', { of: userSetting });
      if (!who?.dailyDigest) return false;
      const since = who.digestSentAt ?? new Date(now.getTime() - firstDigestHours * 3600_000);
      if (since >= now) return false;
      const rows = await tx
        .select({
          reviewId: review.id,
          reviewName: review.name,
          candidateName: candidate.name,
          author: user.name,
          body: comment.body,
          createdAt: comment.createdAt,
        })
        .from(comment)
        .innerJoin(review, eq(review.id, comment.reviewId))
        .innerJoin(teamMember, and(eq(teamMember.organizationId, review.teamId), eq(teamMember.userId, userId)))
        .leftJoin(candidate, eq(candidate.id, comment.candidateId))
        .leftJoin(user, eq(user.id, comment.authorId))
        .where(
          and(
            gt(comment.createdAt, since),
            sql`${comment.createdAt} <= ${now.toISOString()}`,
            or(isNull(comment.authorId), ne(comment.authorId, userId)),
          ),
        )
        .orderBy(asc(review.name), asc(comment.createdAt));
      await tx.update(userSetting).set({ digestSentAt: now }).where(eq(userSetting.userId, userId));
      if (rows.length === 0) return false;
      const comments = rows.map((r) => ({ ...r, author: r.author ?? 'A former member' }));
      await mailer.send(digestMail({ email: who.email, name: who.name }, comments, origin, since));
      return true;
    });
    if (mailed) sent += 1;
  }
  return sent;
}

/**
 * Puts the product's mail on the queue: `queue.mailer` is what the app and better-auth send
 * through; this process's worker hands each job to `smtp` (retried with back-off while the
 * mail server fails), and the daily digest is scheduled.
 */
export async function startMailJobs({
  db,
  queue,
  smtp,
  origin,
}: {
  db: Database;
  queue: JobQueue;
  smtp: Mailer;
  origin: string;
}): Promise<Mailer> {
  await queue.workMail(smtp);
  await queue.scheduleDigest(async () => {
    const sent = await sendDailyDigests({ db, mailer: queue.mailer, origin });
    if (sent > 0) console.log(`[mail] daily digest: ${sent} mail${sent === 1 ? '' : 's'} queued`);
  });
  return queue.mailer;
}
