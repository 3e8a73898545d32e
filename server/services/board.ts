import { randomUUID } from 'node:crypto';
import { isDeepStrictEqual } from 'node:util';

import { eq, sql } from 'drizzle-orm';
import type { z } from 'zod';

import type { Database } from '@/db/client';
import { designBasis } from '@/db/schema';
import type { Board, CandidateWire, Criterion, DesignBasis, designBasisInput } from '@/server/contracts/board';
import type { Listener } from '@/server/contracts/news';
import type { TeamRole } from '@/server/contracts/roles';

import { recordActivity } from './activity';
import type { Broadcast } from './broadcast';
import { listCandidates, recomputeAll } from './candidates';
import { commentCounts } from './comments';
import { coreOf, lockBasis, readBasis, toDesignBasis, type BasisCore } from './design-basis';
import { gatheringOf } from './live';
import { getReview } from './reviews';
import { currentRound } from './rounds';

/**
 * The board as a whole: what GET board shows, and the design-basis change that recomputes
 * every candidate on it.
 */

/** GET /api/reviews/:reviewId/board for one member (the round as their role may see it). */
export async function getBoard(
  db: Database,
  reviewId: string,
  listener: Listener & { role: TeamRole },
): Promise<Board> {
  const [review, basisRow, candidates, round, counts, gathering] = await Promise.all([
    getReview(db, reviewId),
    readBasis(db, reviewId),
    listCandidates(db, reviewId),
    currentRound(db, reviewId, listener),
    commentCounts(db, reviewId),
    gatheringOf(db, reviewId),
  ]);
  return {
    review,
    designBasis: toDesignBasis(basisRow, review.createdAt),
    candidates,
    round,
    myRole: listener.role,
    commentCounts: counts,
    gathering,
  };
}

export type BasisContext = { db: Database; broadcast: Broadcast; actorId: string };

type BasisInput = z.output<typeof designBasisInput>;

/**
 * Ids of the criteria sent: an id of a criterion the basis holds is kept (once); a
 * criterion without one, or with one the basis does not hold, is new and gets a uuid.
 */
function withIds(sent: BasisInput['criteria'], stored: Criterion[]): Criterion[] {
  const known = new Set(stored.map((c) => c.id));
  const used = new Set<string>();
  return sent.map((c) => {
    const id = c.id !== undefined && known.has(c.id) && !used.has(c.id) ? c.id : randomUUID();
    used.add(id);
    return { id, name: c.name, weight: c.weight, measure: c.measure };
  });
}

/**
 * Replaces a review's design basis. When what the engine takes from it changed, every
 * candidate is recomputed in the same transaction (a new row revision each); a change of
 * the criteria alone recomputes nothing. One Activity line; after the commit the room hears
 * `basis:updated`, then `candidate:recomputed` for each recomputed candidate.
 */
export async function updateDesignBasis(
  { db, broadcast, actorId }: BasisContext,
  reviewId: string,
  input: BasisInput,
): Promise<{ designBasis: DesignBasis; candidates: CandidateWire[] }> {
  const { criteria: sentCriteria, ...core } = input;
  const review = await getReview(db, reviewId);
  const recomputed = await db.transaction(async (tx) => {
    const before = await lockBasis(tx, reviewId, 'update');
    const criteria = withIds(sentCriteria, before.criteria as Criterion[]);
    // Fired hours are no engine input: a change of them alone recomputes nothing.
    const engineChanged = engineGroupsChanged(coreOf(before), core).length > 0;
    await tx
      .update(designBasis)
      .set({
        basis: core as Record<string, unknown>,
        criteria,
        revision: before.revision + 1,
        updatedById: actorId,
        updatedAt: sql`now()`,
      })
      .where(eq(designBasis.reviewId, reviewId));
    const count = engineChanged ? await recomputeAll(tx, reviewId, core as BasisCore, actorId) : 0;
    await recordActivity(tx, {
      teamId: review.teamId,
      reviewId,
      actorId,
      kind: 'basis:updated',
      detail: {
        reviewName: review.name,
        changed: changedGroups(coreOf(before), core, before.criteria, criteria),
        recomputed: count,
      },
    });
    return engineChanged;
  });
  const [basisRow, candidates] = await Promise.all([readBasis(db, reviewId), listCandidates(db, reviewId)]);
  const basis = toDesignBasis(basisRow, review.createdAt);
  broadcast.toReview(reviewId, 'basis:updated', { designBasis: basis });
  if (recomputed)
    for (const candidate of candidates) broadcast.toReview(reviewId, 'candidate:recomputed', { candidate });
  return { designBasis: basis, candidates };
}

/** The groups of the basis the engine takes (see engineInputOf), in the contract's names. */
const engineGroups = ['ambient', 'fuel', 'fluid', 'netPowerKW', 'generatorEfficiency', 'limits'] as const;

function engineGroupsChanged(before: BasisCore, after: BasisCore): string[] {
  return engineGroups.filter((g) => !isDeepStrictEqual(before[g], after[g]));
}

/** Which groups of the basis a change touched, in the contract's names. */
function changedGroups(before: BasisCore, after: BasisCore, criteriaBefore: unknown, criteriaAfter: unknown): string[] {
  const groups = engineGroupsChanged(before, after);
  return isDeepStrictEqual(criteriaBefore, criteriaAfter) ? groups : [...groups, 'criteria'];
}
