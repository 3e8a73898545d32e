import { and, asc, eq, sql } from 'drizzle-orm';
import type { z } from 'zod';

import type { Database, Reader } from '@/db/client';
import { candidate, score, user } from '@/db/schema';
import type { Criterion } from '@/server/contracts/board';
import type { ScoreChanged } from '@/server/contracts/matrix';
import type { putScoresInput, Score, Scores } from '@/server/contracts/scores';
import { ApiError, type FieldErrors } from '@/server/http/errors';

import { recordActivity } from './activity';
import type { Broadcast } from './broadcast';
import { listCandidates } from './candidates';
import { lockBasis, readBasis, toDesignBasis } from './design-basis';
import { matrixOf, preScores } from './matrix';
import { reviewOf } from './reviews';

export type ScoreContext = { db: Database; broadcast: Broadcast; actorId: string };

type Entry = z.output<typeof putScoresInput>['scores'][number];

const pairKey = (candidateId: string, criterionId: string) => `${candidateId}\u0000${criterionId}`;

/** Every score on the review's candidates, with the scorer's name; oldest candidate first. */
async function scoresRead(db: Reader, reviewId: string, userId?: string): Promise<Score[]> {
  const rows = await db
    .select({
      candidateId: score.candidateId,
      criterionId: score.criterionId,
      userId: score.userId,
      name: user.name,
      score: score.score,
      reason: score.reason,
      updatedAt: score.updatedAt,
    })
    .from(score)
    .innerJoin(candidate, and(eq(candidate.id, score.candidateId), eq(candidate.reviewId, reviewId)))
    .innerJoin(user, eq(user.id, score.userId))
    .where(userId ? and(eq(score.reviewId, reviewId), eq(score.userId, userId)) : eq(score.reviewId, reviewId))
    .orderBy(asc(candidate.position), asc(score.criterionId), asc(user.name));
  return rows.map((r) => ({ ...r, updatedAt: r.updatedAt.toISOString() }));
}

async function criteriaOf(db: Reader, reviewId: string): Promise<Criterion[]> {
  return toDesignBasis(await readBasis(db, reviewId), new Date(0).toISOString()).criteria;
}

/** GET /api/reviews/:reviewId/scores: mine and everyone's (with names) on the basis's criteria. */
export async function scoresOf(db: Database, reviewId: string, viewerId: string): Promise<Scores> {
  const [criteria, everyone] = await Promise.all([criteriaOf(db, reviewId), scoresRead(db, reviewId)]);
  const inBasis = new Set(criteria.map((c) => c.id));
  const shown = everyone.filter((s) => inBasis.has(s.criterionId));
  return { mine: shown.filter((s) => s.userId === viewerId), everyone: shown };
}

/**
 * Stores some of the actor's scores in one transaction: a score sets (or replaces) theirs of
 * that candidate on that criterion, null withdraws it. Refused whole, naming each bad entry
 * (`scores.2.criterionId`), when a candidate is not of this review, a criterion is not in the
 * design basis, or an override of a pre-scored criterion has no reason. After the commit the
 * room hears `score:changed` with the touched cells, the totals and the ranks.
 */
export async function putScores(
  { db, broadcast, actorId }: ScoreContext,
  reviewId: string,
  entries: Entry[],
): Promise<{ mine: Score[] }> {
  const { scorersBefore, scorersAfter } = await db.transaction(async (tx) => {
    const target = await reviewOf(tx, reviewId);
    // Shared lock: a basis change (criteria removed) waits for this change, and the reverse.
    const basis = await lockBasis(tx, reviewId, 'share');
    const criteria = new Map((basis.criteria as Criterion[]).map((c) => [c.id, c]));
    const candidates = await listCandidates(tx, reviewId);
    const known = new Set(candidates.map((c) => c.id));
    const pre = new Map<string, Record<string, number | null>>();
    for (const c of criteria.values()) if (c.measure) pre.set(c.id, preScores(c, candidates));

    const fieldErrors: FieldErrors = {};
    entries.forEach((e, i) => {
      if (!known.has(e.candidateId)) {
        fieldErrors[`scores.${i}.candidateId`] = ['This is not a candidate of this Review.'];
        return;
      }
      const criterion = criteria.get(e.criterionId);
      if (!criterion) {
        fieldErrors[`scores.${i}.criterionId`] = ['This criterion is not in the design basis of this Review.'];
        return;
      }
      const preScore = pre.get(criterion.id)?.[e.candidateId] ?? null;
      if (e.score !== null && preScore !== null && e.reason === '') {
        fieldErrors[`scores.${i}.reason`] = [
          `${criterion.name} is pre-scored ${preScore.toFixed(2)} from the results; give a reason to override it.`,
        ];
      }
    });
    const [field, messages] = Object.entries(fieldErrors)[0] ?? [];
    if (field) throw new ApiError(422, 'invalid_input', `${field}: ${messages![0]}`, { field, fieldErrors });

    const countScorers = async () => {
      const [{ n }] = await tx
        .select({ n: sql<number>`count(distinct ${score.userId})::int` })
        .from(score)
        .where(eq(score.reviewId, reviewId));
      return n;
    };
    const before = await countScorers();
    let set = 0;
    let withdrawn = 0;
    for (const e of entries) {
      const where = and(
        eq(score.candidateId, e.candidateId),
        eq(score.criterionId, e.criterionId),
        eq(score.userId, actorId),
      );
      if (e.score === null) {
        const gone = await tx.delete(score).where(where).returning({ userId: score.userId });
        withdrawn += gone.length;
        continue;
      }
      await tx
        .insert(score)
        .values({
          reviewId,
          candidateId: e.candidateId,
          criterionId: e.criterionId,
          userId: actorId,
          score: e.score,
          reason: e.reason,
        })
        .onConflictDoUpdate({
          target: [score.candidateId, score.criterionId, score.userId],
          set: { score: e.score, reason: e.reason, updatedAt: sql`now()` },
        });
      set += 1;
    }
    await recordActivity(tx, {
      teamId: target.teamId,
      reviewId,
      actorId,
      kind: 'score:changed',
      detail: {
        reviewName: target.name,
        scored: set,
        withdrawn,
        candidates: [...new Set(entries.map((e) => candidates.find((c) => c.id === e.candidateId)!.name))],
      },
    });
    return { scorersBefore: before, scorersAfter: await countScorers() };
  });

  const [mine, matrix] = await Promise.all([
    scoresRead(db, reviewId, actorId),
    matrixOf(db, reviewId, actorId, { withYear: false }),
  ]);
  const [{ name }] = await db.select({ name: user.name }).from(user).where(eq(user.id, actorId));
  const kept = new Map(mine.map((s) => [pairKey(s.candidateId, s.criterionId), s]));
  const payload: ScoreChanged = {
    reviewId,
    by: { id: actorId, name },
    scores: entries.map(
      (e) =>
        kept.get(pairKey(e.candidateId, e.criterionId)) ?? {
          candidateId: e.candidateId,
          criterionId: e.criterionId,
          userId: actorId,
          name,
          score: null,
          reason: '',
          updatedAt: new Date().toISOString(),
        },
    ),
    cells: entries.flatMap((e) => {
      const cell = matrix.rows.find((r) => r.criterionId === e.criterionId)?.cells[e.candidateId];
      return cell ? [{ ...cell, candidateId: e.candidateId, criterionId: e.criterionId }] : [];
    }),
    totals: matrix.totals,
    ranks: matrix.ranks,
    scorers: matrix.scorers,
    refetch: scorersBefore !== scorersAfter,
    madeAt: matrix.madeAt,
  };
  broadcast.toReview(reviewId, 'score:changed', payload);
  const inBasis = new Set(matrix.criteria.map((c) => c.id));
  return { mine: mine.filter((s) => inBasis.has(s.criterionId)) };
}
