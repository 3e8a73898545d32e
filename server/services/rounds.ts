import { and, asc, desc, eq, inArray, max, sql } from 'drizzle-orm';

import type { Database, Reader, Tx } from '@/db/client';
import { ballot, candidate, round, user } from '@/db/schema';
import type { Round } from '@/server/contracts/board';
import type { Listener } from '@/server/contracts/news';
import { roleAllows } from '@/server/contracts/roles';
import { violatedUnique } from '@/server/http/database-errors';
import { ApiError } from '@/server/http/errors';

import { recordActivity } from './activity';
import type { Broadcast } from './broadcast';
import { reviewOf } from './reviews';

export type RoundContext = { db: Database; broadcast: Broadcast; actorId: string };

const uuidPattern = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

type RoundRow = typeof round.$inferSelect;
type BallotRow = { roundId: string; userId: string; name: string; votes: Record<string, number> };

/** Whoever runs rounds (Lead, Owner) sees who has voted, so the meeting moves on when all are in. */
const seesVoters = (role: string) => roleAllows(role, { round: ['close'] });

/**
 * A round as one listener may see it. The tally counts every candidate of the review (0
 * included) and is withheld while a blind round is open; `votedBy` names people, never their
 * votes; `myBallot` is the listener's own, or null (always null in a broadcast).
 */
function shapeRound(
  row: RoundRow,
  ballots: BallotRow[],
  candidateIds: string[],
  listener: Listener,
  withMyBallot: boolean,
): Round {
  let tally: Record<string, number> | null = null;
  if (!(row.blind && row.status === 'open')) {
    tally = Object.fromEntries(candidateIds.map((id) => [id, 0]));
    for (const b of ballots) {
      for (const [id, n] of Object.entries(b.votes)) if (Object.hasOwn(tally, id)) tally[id] += n;
    }
  }
  const mine = withMyBallot ? ballots.find((b) => b.userId === listener.userId) : undefined;
  return {
    id: row.id,
    number: row.number,
    status: row.status,
    votesPerPerson: row.votesPerPerson,
    blind: row.blind,
    tally,
    voters: ballots.length,
    votedBy: seesVoters(listener.role)
      ? ballots
          .map((b) => ({ id: b.userId, name: b.name }))
          .sort((a, b) => a.name.localeCompare(b.name) || a.id.localeCompare(b.id))
      : null,
    myBallot: mine ? { ...mine.votes } : null,
    openedAt: row.openedAt.toISOString(),
    closedAt: row.closedAt ? row.closedAt.toISOString() : null,
  };
}

async function candidateIdsOf(db: Reader, reviewId: string): Promise<string[]> {
  const rows = await db
    .select({ id: candidate.id })
    .from(candidate)
    .where(eq(candidate.reviewId, reviewId))
    .orderBy(asc(candidate.position), asc(candidate.createdAt));
  return rows.map((r) => r.id);
}

async function ballotsOf(db: Reader, roundIds: string[]): Promise<BallotRow[]> {
  if (roundIds.length === 0) return [];
  return db
    .select({ roundId: ballot.roundId, userId: ballot.userId, name: user.name, votes: ballot.votes })
    .from(ballot)
    .innerJoin(user, eq(user.id, ballot.userId))
    .where(inArray(ballot.roundId, roundIds));
}

/** Everything a round's JSON is made of, read in one go (inside a transaction when given one). */
async function loadRound(db: Reader, row: RoundRow) {
  const [ballots, candidateIds] = await Promise.all([ballotsOf(db, [row.id]), candidateIdsOf(db, row.reviewId)]);
  return { row, ballots, candidateIds };
}

type Loaded = Awaited<ReturnType<typeof loadRound>>;

const view = (l: Loaded, listener: Listener, withMyBallot = true) =>
  shapeRound(l.row, l.ballots, l.candidateIds, listener, withMyBallot);

/** Tells the review's room; each listener gets the round as they may see it, without a ballot. */
function tell(broadcast: Broadcast, event: 'round:opened' | 'round:tallied' | 'round:closed', l: Loaded) {
  broadcast.toReview(l.row.reviewId, event, (listener) => ({ round: view(l, listener, false) }));
}

/** Every round of a review, oldest first; closed ones with their tallies. */
export async function listRounds(db: Database, reviewId: string, listener: Listener): Promise<Round[]> {
  const rows = await db.select().from(round).where(eq(round.reviewId, reviewId)).orderBy(asc(round.number));
  const [ballots, candidateIds] = await Promise.all([
    ballotsOf(
      db,
      rows.map((r) => r.id),
    ),
    candidateIdsOf(db, reviewId),
  ]);
  return rows.map((row) =>
    shapeRound(
      row,
      ballots.filter((b) => b.roundId === row.id),
      candidateIds,
      listener,
      true,
    ),
  );
}

/** The open round of a review, else the latest closed one, else null. */
export async function currentRound(db: Database, reviewId: string, listener: Listener): Promise<Round | null> {
  const [row] = await db
    .select()
    .from(round)
    .where(eq(round.reviewId, reviewId))
    .orderBy(sql`${round.status} = 'open' desc`, desc(round.number))
    .limit(1);
  if (!row) return null;
  return view(await loadRound(db, row), listener);
}

const roundAlreadyOpen = () =>
  new ApiError(409, 'round_open', 'A preference round is already open in this Review; close it first.');

function isOpenRoundClash(error: unknown) {
  const constraint = violatedUnique(error);
  return constraint === 'round_one_open_key' || constraint === 'round_review_number_key';
}

/** Opens round number (previous + 1); one open round per review, by the database's own index. */
export async function openRound(
  { db, broadcast, actorId }: RoundContext,
  reviewId: string,
  input: { votesPerPerson: number; blind: boolean },
  listener: Listener,
): Promise<Round> {
  let loaded: Loaded;
  try {
    loaded = await db.transaction(async (tx) => {
      const target = await reviewOf(tx, reviewId);
      const [open] = await tx
        .select({ id: round.id })
        .from(round)
        .where(and(eq(round.reviewId, reviewId), eq(round.status, 'open')))
        .limit(1);
      if (open) throw roundAlreadyOpen();
      const [{ last }] = await tx
        .select({ last: max(round.number) })
        .from(round)
        .where(eq(round.reviewId, reviewId));
      const [row] = await tx
        .insert(round)
        .values({
          reviewId,
          number: (last ?? 0) + 1,
          votesPerPerson: input.votesPerPerson,
          blind: input.blind,
          openedById: actorId,
        })
        .returning();
      await recordActivity(tx, {
        teamId: target.teamId,
        reviewId,
        actorId,
        kind: 'round:opened',
        detail: { reviewName: target.name, number: row.number, votesPerPerson: row.votesPerPerson, blind: row.blind },
      });
      return loadRound(tx, row);
    });
  } catch (error) {
    // Two Leads opening at the same moment: the unique indexes decide, the second hears 409.
    if (isOpenRoundClash(error)) throw roundAlreadyOpen();
    throw error;
  }
  tell(broadcast, 'round:opened', loaded);
  return view(loaded, listener);
}

/**
 * The round row, locked until the transaction ends: a ballot and a close of the same round
 * take turns, so no ballot lands after the round closed.
 */
async function lockRound(tx: Tx, reviewId: string, roundId: string): Promise<RoundRow> {
  if (!uuidPattern.test(roundId)) throw ApiError.notFound('The preference round');
  const [row] = await tx
    .select()
    .from(round)
    .where(and(eq(round.id, roundId), eq(round.reviewId, reviewId)))
    .for('update');
  if (!row) throw ApiError.notFound('The preference round');
  return row;
}

const roundClosed = (row: RoundRow) =>
  new ApiError(409, 'round_closed', `Preference round ${row.number} is closed; it takes no more ballots.`);

/**
 * Stores the caller's ballot (replacing an earlier one in the same round). Refused whole when
 * it spends more votes than the round allows, names a candidate that is not of this review,
 * or comes after the round closed. A ballot of no votes withdraws the caller's ballot.
 */
export async function castBallot(
  { db, broadcast, actorId }: RoundContext,
  reviewId: string,
  roundId: string,
  votes: Record<string, number>,
  listener: Listener,
): Promise<Round> {
  const loaded = await db.transaction(async (tx) => {
    const row = await lockRound(tx, reviewId, roundId);
    if (row.status !== 'open') throw roundClosed(row);
    const known = new Set(await candidateIdsOf(tx, reviewId));
    const stranger = Object.keys(votes).find((id) => !known.has(id));
    if (stranger !== undefined) {
      throw ApiError.invalidField(`votes.${stranger}`, 'This is not a candidate of this Review.');
    }
    const spent = Object.values(votes).reduce((sum, n) => sum + n, 0);
    if (spent > row.votesPerPerson) {
      throw ApiError.invalidField(
        'votes',
        `This ballot spends ${spent} votes; round ${row.number} allows ${row.votesPerPerson} per person.`,
      );
    }
    const kept = Object.fromEntries(Object.entries(votes).filter(([, n]) => n > 0));
    if (spent === 0) {
      await tx.delete(ballot).where(and(eq(ballot.roundId, roundId), eq(ballot.userId, actorId)));
    } else {
      await tx
        .insert(ballot)
        .values({ roundId, userId: actorId, votes: kept })
        .onConflictDoUpdate({ target: [ballot.roundId, ballot.userId], set: { votes: kept, updatedAt: sql`now()` } });
    }
    return loadRound(tx, row);
  });
  tell(broadcast, 'round:tallied', loaded);
  return view(loaded, listener);
}

/** Closes an open round; its tally (blind or not) is then shown to everyone. */
export async function closeRound(
  { db, broadcast, actorId }: RoundContext,
  reviewId: string,
  roundId: string,
  listener: Listener,
): Promise<Round> {
  const loaded = await db.transaction(async (tx) => {
    const locked = await lockRound(tx, reviewId, roundId);
    if (locked.status !== 'open') {
      throw new ApiError(409, 'round_closed', `Preference round ${locked.number} is already closed.`);
    }
    const [row] = await tx
      .update(round)
      // The moment it closed (after the lock), not when this transaction began: a ballot that
      // took its turn first is then always stamped earlier.
      .set({ status: 'closed', closedAt: sql`clock_timestamp()` })
      .where(eq(round.id, roundId))
      .returning();
    const target = await reviewOf(tx, reviewId);
    const result = await loadRound(tx, row);
    await recordActivity(tx, {
      teamId: target.teamId,
      reviewId,
      actorId,
      kind: 'round:closed',
      detail: { reviewName: target.name, number: row.number, voters: result.ballots.length },
    });
    return result;
  });
  tell(broadcast, 'round:closed', loaded);
  return view(loaded, listener);
}
