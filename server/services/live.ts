import { and, eq, sql } from 'drizzle-orm';
import { Pool } from 'pg';

import type { Database } from '@/db/client';
import { candidate, liveGathering, user } from '@/db/schema';
import { ApiError } from '@/server/http/errors';

/**
 * The live session's state that outlives a socket: who gathers a Review's room, and to which
 * candidate. Presence lives on the sockets themselves (socket.data), so it needs no table.
 */

export type Gathering = { candidateId: string; by: { id: string; name: string } };

/** Where the room is gathered now, or null: for a rejoining client and GET board. */
export async function gatheringOf(db: Database, reviewId: string): Promise<Gathering | null> {
  const [row] = await db
    .select({ candidateId: liveGathering.candidateId, byId: liveGathering.byId, byName: user.name })
    .from(liveGathering)
    .innerJoin(user, eq(user.id, liveGathering.byId))
    .where(eq(liveGathering.reviewId, reviewId))
    .limit(1);
  return row ? { candidateId: row.candidateId, by: { id: row.byId, name: row.byName } } : null;
}

const uuidPattern = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** A candidate of this review, or 404 naming `candidateId` (one of another review is not found). */
export async function requireCandidateOf(db: Database, reviewId: string, candidateId: string): Promise<void> {
  const notFound = () =>
    new ApiError(404, 'not_found', 'candidateId: the Candidate was not found in this Review.', {
      field: 'candidateId',
    });
  if (!uuidPattern.test(candidateId)) throw notFound();
  const [row] = await db
    .select({ id: candidate.id })
    .from(candidate)
    .where(and(eq(candidate.id, candidateId), eq(candidate.reviewId, reviewId)))
    .limit(1);
  if (!row) throw notFound();
}

export type GatherRequest = {
  reviewId: string;
  /** null: stop gathering. */
  candidateId: string | null;
  by: { id: string; name: string };
  /**
   * Whether a user still has a socket on this review's board (any server process). A
   * gathering whose holder is gone (a crashed process never ran its grace timer) is taken over.
   */
  isOnBoard: (userId: string) => Promise<boolean>;
};

/** What the room is told: the new gathering, or `candidateId: null` when it ended. */
export type GatherChange = { candidateId: string | null; by: { id: string; name: string } };

/**
 * One gatherer at a time, decided by the database (so two processes cannot both win): the
 * holder moves or stops its gathering; anyone else is refused with `conflict` while the holder
 * is on the board, and takes over when the holder is gone. Returns the change to announce, or
 * null when nothing changed (stopping when nobody gathers).
 */
export async function gather(db: Database, request: GatherRequest): Promise<GatherChange | null> {
  const { reviewId, candidateId, by } = request;
  const announced = { id: by.id, name: by.name };
  if (candidateId === null) {
    for (let attempt = 0; attempt < 3; attempt++) {
      const current = await gatheringOf(db, reviewId);
      if (!current) return null;
      if (current.by.id !== by.id) await refuseWhileHere(request, current);
      if (await endGathering(db, reviewId, current.by.id)) return { candidateId: null, by: announced };
    }
    throw busy();
  }
  await requireCandidateOf(db, reviewId, candidateId);
  for (let attempt = 0; attempt < 3; attempt++) {
    // Insert, or move one's own gathering; another holder's row is left alone.
    const [mine] = await db
      .insert(liveGathering)
      .values({ reviewId, candidateId, byId: by.id })
      .onConflictDoUpdate({
        target: liveGathering.reviewId,
        set: { candidateId, startedAt: sql`now()` },
        setWhere: eq(liveGathering.byId, by.id),
      })
      .returning({ reviewId: liveGathering.reviewId });
    if (mine) return { candidateId, by: announced };
    const current = await gatheringOf(db, reviewId);
    if (!current) continue;
    await refuseWhileHere(request, current);
    // The holder is gone: take over, only if the row still names that holder.
    const [taken] = await db
      .update(liveGathering)
      .set({ candidateId, byId: by.id, startedAt: sql`now()` })
      .where(and(eq(liveGathering.reviewId, reviewId), eq(liveGathering.byId, current.by.id)))
      .returning({ reviewId: liveGathering.reviewId });
    if (taken) return { candidateId, by: announced };
  }
  throw busy();
}

async function refuseWhileHere(request: GatherRequest, current: Gathering) {
  if (current.by.id === request.by.id) return;
  if (await request.isOnBoard(current.by.id)) {
    throw new ApiError(
      409,
      'conflict',
      `${current.by.name} is gathering the room now; one gatherer at a time. Ask them to stop first.`,
    );
  }
}

const busy = () =>
  new ApiError(409, 'conflict', 'The gathering changed while you asked; try again.', { field: 'candidateId' });

/** Ends the gathering if `holderId` still holds it; true when it did. */
export async function endGathering(db: Database, reviewId: string, holderId: string): Promise<boolean> {
  const rows = await db
    .delete(liveGathering)
    .where(and(eq(liveGathering.reviewId, reviewId), eq(liveGathering.byId, holderId)))
    .returning({ reviewId: liveGathering.reviewId });
  return rows.length > 0;
}

// ── The socket.io Postgres adapter's own connections ───────────────────────────────────────

/**
 * A small pool of its own for the socket.io Postgres adapter (one connection LISTENs, the
 * others NOTIFY), beside the product's pool so live traffic never waits behind queries. A
 * lost connection (Postgres restarted) is reported by `end`, on which the adapter reconnects;
 * the `error` it also emits is taken here so it cannot end the process.
 */
export function openAdapterPool(db: Database, max = 4): Pool {
  const pool = new Pool({ ...db.$client.options, max });
  let lastLogged = 0;
  const report = (error: Error) => {
    if (Date.now() - lastLogged < 10_000) return;
    lastLogged = Date.now();
    console.error(`[realtime] the adapter lost its database connection: ${error.message}`);
  };
  pool.on('connect', (client) => {
    client.on('error', report);
    // The adapter drops a LISTEN connection that ended without handing it back; hand it back
    // here (with the error, so the pool discards it), or the pool would wait for it forever
    // when it ends. An idle one the pool has already taken back refuses this, which is fine.
    client.on('end', () => {
      try {
        client.release(new Error('The connection ended.'));
      } catch {
        // already back in the pool
      }
    });
  });
  pool.on('error', report);
  return pool;
}

/**
 * Ends the adapter's pool once what it has queued has gone out (the `ADAPTER_CLOSE` that tells
 * the other processes this one is leaving), waiting at most `ms`.
 */
export async function closeAdapterPool(pool: Pool, ms = 1_000): Promise<void> {
  const deadline = Date.now() + ms;
  while ((pool.waitingCount > 0 || pool.idleCount < pool.totalCount) && Date.now() < deadline) {
    await new Promise((resolve) => setTimeout(resolve, 5));
  }
  await pool.end();
}

/**
 * The table the socket.io Postgres adapter keeps payloads over NOTIFY's 8000-byte limit in
 * (its documented set-up; the adapter deletes rows older than its cleanup interval). Made by
 * the server at start, not by a migration: it belongs to the adapter, not to the product.
 */
export async function ensureSocketAttachments(pool: Pool): Promise<void> {
  const create = `create table if not exists socket_io_attachments (
    id bigserial unique,
    created_at timestamptz default now(),
    payload bytea
  )`;
  try {
    await pool.query(create);
  } catch (error) {
    // Two processes starting at once can race on the catalogue; the loser finds the table made.
    const code = (error as { code?: string }).code;
    if (code !== '23505' && code !== '42P07') throw error;
  }
}
