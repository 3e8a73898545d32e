import type { Database } from '@/db/client';
import type { Presence } from '@/server/contracts/board';
import type { TeamRole } from '@/server/contracts/roles';
import { ApiError } from '@/server/http/errors';
import { requireReview, reviewListeners } from '@/server/services/access';
import type { Broadcast } from '@/server/services/broadcast';
import { endGathering, gather, gatheringOf, requireCandidateOf } from '@/server/services/live';

import { gatherPayload, reviewRoom, reviewRoomPayload, viewingPayload } from '../events';
import type { RealtimeServer, RealtimeSocket } from '../server';
import { handle } from './handle';

/**
 * A gatherer whose last socket leaves the board (a reload, a dropped network) keeps the room
 * gathered this long, so coming straight back changes nothing for the others.
 */
export const gatherGraceMs = 5_000;

/** fetchSockets waits for every other process; one that does not answer is skipped after this. */
const otherProcessesMs = 2_000;

/** A person's own room on a review's board: what a send to the board addresses (`review:<id>:<userId>`). */
export const listenerRoom = (reviewId: string, userId: string) => `${reviewRoom(reviewId)}:${userId}`;

type BoardSocket = Awaited<ReturnType<ReturnType<RealtimeServer['in']>['fetchSockets']>>[number];

/**
 * The live board of a Review (`review:<id>`): join and leave, who is here and which candidate
 * each looks at, and Gather the room. Every handler reads parse → access → service → ack;
 * what the room is told is computed from the sockets in the room across every server process
 * (their socket.data), so it holds with the Postgres adapter and more than one process.
 */
export function createReviewRoom({
  io,
  db,
  broadcast,
  graceMs = gatherGraceMs,
}: {
  io: RealtimeServer;
  db: Database;
  broadcast: Broadcast;
  graceMs?: number;
}) {
  const refreshes = new Map<string, { again: boolean }>();
  const endChecks = new Map<string, NodeJS.Timeout>();
  let closed = false;

  /** The sockets on a review's board in every process, and the Team's members now. */
  async function board(reviewId: string) {
    const room = reviewRoom(reviewId);
    let sockets: BoardSocket[];
    try {
      sockets = await io.in(room).timeout(otherProcessesMs).fetchSockets();
    } catch (error) {
      console.warn(`[realtime] another process did not answer for ${room}; using this one's sockets:`, error);
      sockets = await io.in(room).local.fetchSockets();
    }
    const listeners = await reviewListeners(db, reviewId);
    return { sockets, listeners };
  }

  /** One entry per person (their tabs folded; the tab that chose last says what they look at). */
  function peopleOn(reviewId: string, sockets: BoardSocket[], listeners: Map<string, TeamRole>): Presence[] {
    const people = new Map<string, Presence & { at: number }>();
    for (const socket of sockets) {
      const { user, viewing } = socket.data;
      const role = listeners.get(user.id);
      if (!role) continue;
      const view = viewing?.[reviewId] ?? { candidateId: null, at: 0 };
      const known = people.get(user.id);
      if (!known || view.at > known.at) {
        people.set(user.id, { userId: user.id, name: user.name, role, candidateId: view.candidateId, at: view.at });
      }
    }
    return [...people.values()]
      .map(({ at: _at, ...person }) => person)
      .sort((a, b) => a.name.localeCompare(b.name) || a.userId.localeCompare(b.userId));
  }

  async function isOnBoard(reviewId: string, userId: string) {
    const { sockets, listeners } = await board(reviewId);
    return listeners.has(userId) && sockets.some((s) => s.data.user.id === userId);
  }

  /**
   * Tells the room who is here. Runs one at a time per review; changes that arrive meanwhile
   * fold into one more run, so a burst of joins costs a few runs, not one per join.
   */
  function refresh(reviewId: string) {
    if (closed) return;
    const pending = refreshes.get(reviewId);
    if (pending) {
      pending.again = true;
      return;
    }
    const state = { again: false };
    refreshes.set(reviewId, state);
    const loop = async () => {
      do {
        state.again = false;
        await tellPresence(reviewId);
      } while (state.again && !closed);
      refreshes.delete(reviewId);
    };
    loop().catch((error: unknown) => {
      refreshes.delete(reviewId);
      console.error('[realtime] presence failed:', error);
    });
  }

  async function tellPresence(reviewId: string) {
    const room = reviewRoom(reviewId);
    const { sockets, listeners } = await board(reviewId);
    if (closed) return;
    const people = peopleOn(reviewId, sockets, listeners);
    const members: string[] = [];
    for (const socket of sockets) {
      // As every send to a room: someone no longer in the Team is taken out instead of told.
      if (listeners.has(socket.data.user.id)) members.push(socket.id);
      else {
        socket.leave(room);
        socket.leave(listenerRoom(reviewId, socket.data.user.id));
      }
    }
    if (members.length > 0) io.to(members).emit('presence:changed', { reviewId, people });
    const gathering = await gatheringOf(db, reviewId);
    if (gathering && !closed && !people.some((p) => p.userId === gathering.by.id))
      watchGatherer(reviewId, gathering.by);
  }

  /** The gatherer has left the board: end the gathering unless they are back within the grace. */
  function watchGatherer(reviewId: string, holder: { id: string; name: string }) {
    if (endChecks.has(reviewId) || closed) return;
    const timer = setTimeout(() => {
      endChecks.delete(reviewId);
      (async () => {
        if (await isOnBoard(reviewId, holder.id)) return;
        if (await endGathering(db, reviewId, holder.id)) {
          broadcast.toReview(reviewId, 'room:gathered', { reviewId, candidateId: null, by: holder });
        }
      })().catch((error: unknown) => console.error('[realtime] ending a gathering failed:', error));
    }, graceMs);
    timer.unref();
    endChecks.set(reviewId, timer);
  }

  /** Runs after the handler's ack has gone out (the ack is answered in the same turn). */
  const afterAck = (work: () => void) => setImmediate(work);

  const notJoined = () =>
    new ApiError(409, 'not_joined', 'Join the Review first (review:join), then send this.', { field: 'reviewId' });

  function register(socket: RealtimeSocket) {
    const userId = socket.data.user.id;

    socket.on(
      'review:join',
      handle(reviewRoomPayload, async ({ reviewId }) => {
        await requireReview(db, userId, reviewId);
        await socket.join([reviewRoom(reviewId), listenerRoom(reviewId, userId)]);
        socket.data.viewing = { ...socket.data.viewing, [reviewId]: { candidateId: null, at: 0 } };
        afterAck(() => {
          refresh(reviewId);
          // A rejoining client goes where the gatherer is now.
          gatheringOf(db, reviewId)
            .then((gathering) => {
              if (gathering && socket.rooms.has(reviewRoom(reviewId))) {
                socket.emit('room:gathered', { reviewId, ...gathering });
              }
            })
            .catch((error: unknown) => console.error('[realtime] reading the gathering failed:', error));
        });
      }),
    );

    socket.on(
      'review:leave',
      handle(reviewRoomPayload, async ({ reviewId }) => {
        if (!socket.rooms.has(reviewRoom(reviewId))) return;
        await socket.leave(reviewRoom(reviewId));
        await socket.leave(listenerRoom(reviewId, userId));
        const { [reviewId]: _left, ...rest } = socket.data.viewing ?? {};
        socket.data.viewing = rest;
        afterAck(() => refresh(reviewId));
      }),
    );

    socket.on(
      'presence:viewing',
      handle(viewingPayload, async ({ reviewId, candidateId }) => {
        await requireReview(db, userId, reviewId);
        if (!socket.rooms.has(reviewRoom(reviewId))) throw notJoined();
        if (candidateId !== null) await requireCandidateOf(db, reviewId, candidateId);
        socket.data.viewing = { ...socket.data.viewing, [reviewId]: { candidateId, at: Date.now() } };
        afterAck(() => refresh(reviewId));
      }),
    );

    socket.on(
      'room:gather',
      handle(gatherPayload, async ({ reviewId, candidateId }) => {
        await requireReview(db, userId, reviewId, { liveSession: ['gather'] });
        if (!socket.rooms.has(reviewRoom(reviewId))) throw notJoined();
        const change = await gather(db, {
          reviewId,
          candidateId,
          by: { id: userId, name: socket.data.user.name },
          isOnBoard: (holderId) => isOnBoard(reviewId, holderId),
        });
        if (change) broadcast.toReview(reviewId, 'room:gathered', { reviewId, ...change });
      }),
    );

    // The rooms are gone by `disconnect`; note them while they are still there.
    let boards: string[] = [];
    socket.on('disconnecting', () => {
      boards = [...socket.rooms].flatMap((r) => /^review:([^:]+)$/.exec(r)?.[1] ?? []);
    });
    socket.on('disconnect', () => {
      for (const reviewId of boards) refresh(reviewId);
    });
  }

  return {
    register,
    close() {
      closed = true;
      for (const timer of endChecks.values()) clearTimeout(timer);
      endChecks.clear();
    },
  };
}
