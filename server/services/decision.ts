import { and, asc, desc, eq } from 'drizzle-orm';
import type { z } from 'zod';

import type { Database, Reader, Tx } from '@/db/client';
import { candidate, decisionRevision, score, teamMember, user } from '@/db/schema';
import type {
  DecisionRecord,
  DecisionRevision,
  DecisionRevisionNews,
  DecisionSnapshot,
  updateDecisionInput,
} from '@/server/contracts/decision';
import type { Listener } from '@/server/contracts/news';
import { violatedUnique } from '@/server/http/database-errors';
import { ApiError } from '@/server/http/errors';

import { recordActivity } from './activity';
import type { Broadcast } from './broadcast';
import { listCandidates, updateCandidate } from './candidates';
import { readBasis, toDesignBasis } from './design-basis';
import { matrixOf } from './matrix';
import { getReview, reviewOf } from './reviews';
import { getRobustness } from './robustness';
import { listRounds } from './rounds';
import { getSiteYear } from './site-year';

export type DecisionContext = { db: Database; broadcast: Broadcast; actorId: string };

type Row = typeof decisionRevision.$inferSelect;
type Input = z.output<typeof updateDecisionInput>;

const selectRevisions = (db: Reader) =>
  db
    .select({
      row: decisionRevision,
      updaterName: user.name,
    })
    .from(decisionRevision)
    .leftJoin(user, eq(user.id, decisionRevision.updatedById));

type Selected = Awaited<ReturnType<typeof selectRevisions>>[number];

function toNews({ row, updaterName }: Selected): DecisionRevisionNews {
  return {
    id: row.id,
    reviewId: row.reviewId,
    number: row.number,
    status: row.status,
    chosenCandidateId: row.chosenCandidateId,
    rationale: row.rationale,
    assumptions: row.assumptions,
    rejected: row.rejected,
    dissent: row.dissent,
    actions: row.actions,
    signedBy: row.signedAt ? { id: row.signedById ?? '', name: row.signedByName ?? '' } : null,
    signedAt: row.signedAt ? row.signedAt.toISOString() : null,
    updatedBy: row.updatedById ? { id: row.updatedById, name: updaterName ?? '' } : null,
    updatedAt: row.updatedAt.toISOString(),
  };
}

function toRevision(selected: Selected): DecisionRevision {
  return { ...toNews(selected), snapshot: (selected.row.snapshot as DecisionSnapshot | null) ?? null };
}

/** Revision 1 as an empty draft, unless the review has a revision already. */
async function ensureFirst(db: Reader, reviewId: string) {
  await db.insert(decisionRevision).values({ reviewId, number: 1 }).onConflictDoNothing();
}

async function revisionsOf(db: Reader, reviewId: string): Promise<Selected[]> {
  return selectRevisions(db).where(eq(decisionRevision.reviewId, reviewId)).orderBy(desc(decisionRevision.number));
}

/**
 * GET decision: the current revision (the draft, or the latest signed when none is open:
 * a draft is always the highest number) and every revision, newest first, each in full.
 */
export async function getDecision(db: Database, reviewId: string): Promise<DecisionRecord> {
  await ensureFirst(db, reviewId);
  const rows = await revisionsOf(db, reviewId);
  const revisions = rows.map(toRevision);
  return { current: revisions[0]!, revisions };
}

/** One revision by number, or 404. */
export async function getRevision(db: Database, reviewId: string, number: number): Promise<DecisionRevision> {
  const [row] = await selectRevisions(db)
    .where(and(eq(decisionRevision.reviewId, reviewId), eq(decisionRevision.number, number)))
    .limit(1);
  if (!row) throw ApiError.notFound(`Revision ${number} of the decision record`);
  return toRevision(row);
}

/** The latest revision, locked for the rest of the transaction (created as revision 1 first if none). */
async function lockLatest(tx: Tx, reviewId: string): Promise<Row> {
  await ensureFirst(tx, reviewId);
  const [row] = await tx
    .select()
    .from(decisionRevision)
    .where(eq(decisionRevision.reviewId, reviewId))
    .orderBy(desc(decisionRevision.number))
    .limit(1)
    .for('update');
  return row!;
}

const signedReadOnly = (row: Row) =>
  new ApiError(
    409,
    'decision_signed',
    `Revision ${row.number} of the decision record is signed and read-only; reopen it to make revision ${row.number + 1}.`,
  );

async function candidateIdsOf(db: Reader, reviewId: string): Promise<Set<string>> {
  const rows = await db.select({ id: candidate.id }).from(candidate).where(eq(candidate.reviewId, reviewId));
  return new Set(rows.map((r) => r.id));
}

/** Refuses candidate ids that are not of this review, and a chosen candidate listed as rejected. */
function checkCandidates(known: Set<string>, next: Pick<Row, 'chosenCandidateId' | 'rejected'>, input: Input) {
  if (input.chosenCandidateId && !known.has(input.chosenCandidateId))
    throw ApiError.invalidField('chosenCandidateId', 'This is not a candidate of this Review.');
  input.rejected?.forEach((r, i) => {
    if (!known.has(r.candidateId))
      throw ApiError.invalidField(`rejected.${i}.candidateId`, 'This is not a candidate of this Review.');
  });
  const clash = next.rejected.findIndex((r) => r.candidateId === next.chosenCandidateId);
  if (next.chosenCandidateId && clash !== -1) {
    throw input.rejected !== undefined
      ? ApiError.invalidField(`rejected.${clash}.candidateId`, 'The chosen candidate cannot also be rejected.')
      : ApiError.invalidField(
          'chosenCandidateId',
          'This candidate is listed as rejected; take it off that list first.',
        );
  }
}

async function readSelected(db: Reader, id: string): Promise<Selected> {
  const [row] = await selectRevisions(db).where(eq(decisionRevision.id, id)).limit(1);
  return row!;
}

/** The fields of a change that differ from the stored draft (for the Activity line). */
function changedFields(row: Row, input: Input): string[] {
  return (Object.keys(input) as Array<keyof Input>).filter(
    (k) => input[k] !== undefined && JSON.stringify(input[k]) !== JSON.stringify(row[k]),
  );
}

/**
 * Edits the open draft with any of its fields. Refused with 409 when the latest revision is
 * signed; candidate ids must be of this review (422 naming the field). One Activity line in
 * the same transaction, then the room hears `decision:updated`.
 */
export async function updateDecision(
  { db, broadcast, actorId }: DecisionContext,
  reviewId: string,
  input: Input,
): Promise<DecisionRevision> {
  const selected = await db.transaction(async (tx) => {
    const row = await lockLatest(tx, reviewId);
    if (row.status !== 'draft') throw signedReadOnly(row);
    const next = {
      chosenCandidateId: input.chosenCandidateId === undefined ? row.chosenCandidateId : input.chosenCandidateId,
      rejected: input.rejected ?? row.rejected,
    };
    checkCandidates(await candidateIdsOf(tx, reviewId), next, input);
    const fields = changedFields(row, input);
    if (fields.length === 0) return { selected: await readSelected(tx, row.id), changed: false };
    await tx
      .update(decisionRevision)
      .set({
        ...(input.chosenCandidateId !== undefined && { chosenCandidateId: input.chosenCandidateId }),
        ...(input.rationale !== undefined && { rationale: input.rationale }),
        ...(input.assumptions !== undefined && { assumptions: input.assumptions }),
        ...(input.rejected !== undefined && { rejected: input.rejected }),
        ...(input.dissent !== undefined && { dissent: input.dissent }),
        ...(input.actions !== undefined && { actions: input.actions }),
        updatedById: actorId,
        updatedAt: new Date(),
      })
      .where(eq(decisionRevision.id, row.id));
    const target = await reviewOf(tx, reviewId);
    await recordActivity(tx, {
      teamId: target.teamId,
      reviewId,
      actorId,
      kind: 'decision:updated',
      detail: { reviewName: target.name, number: row.number, fields },
    });
    return { selected: await readSelected(tx, row.id), changed: true };
  });
  if (selected.changed)
    broadcast.toReview(reviewId, 'decision:updated', { reviewId, revision: toNews(selected.selected) });
  return toRevision(selected.selected);
}

/**
 * What a signed revision rests on, read as the signer sees the board now: the design basis,
 * the candidates with parameters and results, every score, the comparison matrix and the
 * preference rounds with their tallies. Stored as data, so later board edits do not touch it.
 */
export async function takeSnapshot(db: Database, reviewId: string, viewer: Listener): Promise<DecisionSnapshot> {
  const [review, basisRow, candidates, scores, matrix, rounds, robustness, siteYear] = await Promise.all([
    getReview(db, reviewId),
    readBasis(db, reviewId),
    listCandidates(db, reviewId),
    db
      .select({
        candidateId: score.candidateId,
        criterionId: score.criterionId,
        userId: score.userId,
        name: user.name,
        score: score.score,
        reason: score.reason,
      })
      .from(score)
      .innerJoin(user, eq(user.id, score.userId))
      .where(eq(score.reviewId, reviewId))
      .orderBy(asc(score.candidateId), asc(score.criterionId), asc(user.name)),
    matrixOf(db, reviewId, viewer.userId),
    listRounds(db, reviewId, viewer),
    getRobustness(db, reviewId),
    getSiteYear(db, reviewId),
  ]);
  return {
    takenAt: new Date().toISOString(),
    designBasis: toDesignBasis(basisRow, review.createdAt),
    candidates,
    scores,
    matrix,
    // A blind round still open has no tally to keep; the rest are kept as the signer saw them.
    rounds: rounds.map((r) => ({ ...r, myBallot: null })),
    // Only a finished run says how sure; its `stale` tells whether the board moved on since.
    robustness: robustness.status === 'done' ? robustness : null,
    siteYear,
  };
}

export type Signed = {
  revision: DecisionRevision;
  review: { id: string; name: string };
  members: Array<{ name: string; email: string }>;
};

/**
 * Signs the open draft: refused (422 naming the field) without a chosen candidate or a
 * rationale, 409 when it is signed already. Stores the signer, the time and the snapshot in
 * one transaction with the Activity line; after the commit the room hears `decision:signed`
 * and the chosen candidate is marked Chosen through the candidates service (which tells the
 * room as it always does). Returns the members to mail.
 */
export async function signDecision(
  { db, broadcast, actorId }: DecisionContext,
  reviewId: string,
  signer: Listener & { name: string },
): Promise<Signed> {
  const snapshot = await takeSnapshot(db, reviewId, signer);
  const done = await db.transaction(async (tx) => {
    const row = await lockLatest(tx, reviewId);
    if (row.status !== 'draft') throw signedReadOnly(row);
    if (!row.chosenCandidateId)
      throw ApiError.invalidField('chosenCandidateId', 'Choose a candidate before signing.', 'decision_incomplete');
    if (!row.rationale.trim())
      throw ApiError.invalidField('rationale', 'Write the rationale before signing.', 'decision_incomplete');
    if (!(await candidateIdsOf(tx, reviewId)).has(row.chosenCandidateId))
      throw ApiError.invalidField('chosenCandidateId', 'The chosen candidate is no longer in this Review.');
    const now = new Date();
    await tx
      .update(decisionRevision)
      .set({
        status: 'signed',
        signedById: actorId,
        signedByName: signer.name,
        signedAt: now,
        snapshot: snapshot as unknown as Record<string, unknown>,
        updatedById: actorId,
        updatedAt: now,
      })
      .where(eq(decisionRevision.id, row.id));
    const target = await reviewOf(tx, reviewId);
    const chosen = snapshot.candidates.find((c) => c.id === row.chosenCandidateId);
    await recordActivity(tx, {
      teamId: target.teamId,
      reviewId,
      actorId,
      kind: 'decision:signed',
      detail: { reviewName: target.name, number: row.number, chosenName: chosen?.name ?? '' },
    });
    const members = await tx
      .select({ name: user.name, email: user.email })
      .from(teamMember)
      .innerJoin(user, eq(user.id, teamMember.userId))
      .where(eq(teamMember.organizationId, target.teamId))
      .orderBy(asc(user.name));
    return {
      selected: await readSelected(tx, row.id),
      review: { id: reviewId, name: target.name },
      members,
      chosen,
    };
  });
  broadcast.toReview(reviewId, 'decision:signed', { reviewId, revision: toNews(done.selected) });
  if (done.chosen && done.chosen.status !== 'chosen') {
    // The signature stands whatever happens here; the mark is a convenience on the board.
    try {
      await updateCandidate({ db, broadcast, actorId }, reviewId, done.chosen.id, { status: 'chosen' });
    } catch (error) {
      console.error(`[decision] marking candidate ${done.chosen.id} chosen after signing failed:`, error);
    }
  }
  return { revision: toRevision(done.selected), review: done.review, members: done.members };
}

const draftOpen = (number: number) =>
  new ApiError(409, 'decision_draft_open', `Revision ${number} of the decision record is still a draft; edit it.`);

/**
 * Reopens the latest signed revision n as revision n+1, a draft with n's fields (no
 * signature, no snapshot). Revision n stays as it was. 409 when a draft is open.
 */
export async function reopenDecision(
  { db, broadcast, actorId }: DecisionContext,
  reviewId: string,
): Promise<DecisionRevision> {
  let selected: Selected;
  try {
    selected = await db.transaction(async (tx) => {
      const row = await lockLatest(tx, reviewId);
      if (row.status === 'draft') throw draftOpen(row.number);
      const [made] = await tx
        .insert(decisionRevision)
        .values({
          reviewId,
          number: row.number + 1,
          chosenCandidateId: row.chosenCandidateId,
          rationale: row.rationale,
          assumptions: row.assumptions,
          rejected: row.rejected,
          dissent: row.dissent,
          actions: row.actions,
          updatedById: actorId,
        })
        .returning({ id: decisionRevision.id });
      const target = await reviewOf(tx, reviewId);
      await recordActivity(tx, {
        teamId: target.teamId,
        reviewId,
        actorId,
        kind: 'decision:reopened',
        detail: { reviewName: target.name, number: row.number + 1, from: row.number },
      });
      return readSelected(tx, made!.id);
    });
  } catch (error) {
    const clash = violatedUnique(error);
    if (clash === 'decision_one_draft_key' || clash === 'decision_review_number_key')
      throw new ApiError(409, 'decision_draft_open', 'The decision record was reopened a moment ago; edit that draft.');
    throw error;
  }
  broadcast.toReview(reviewId, 'decision:updated', { reviewId, revision: toNews(selected) });
  return toRevision(selected);
}
