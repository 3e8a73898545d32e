import type { Server as HttpServer } from 'node:http';

import { createAdapter } from '@socket.io/postgres-adapter';
import { fromNodeHeaders } from 'better-auth/node';
import { RateLimiterMemory, RateLimiterRes } from 'rate-limiter-flexible';
import { Server, type Socket } from 'socket.io';

import type { Database } from '@/db/client';
import type { Auth } from '@/server/auth/auth';
import { isDatabaseUnavailable } from '@/server/http/database-errors';
import { reviewListeners, teamMemberIds } from '@/server/services/access';
import type { Broadcast } from '@/server/services/broadcast';
import { closeAdapterPool, ensureSocketAttachments, openAdapterPool } from '@/server/services/live';

import { reviewRoom, teamRoom, type Ack, type ClientToServerEvents, type ServerToClientEvents } from './events';
import { createReviewRoom, listenerRoom } from './handlers/review-room';
import { teamRoomHandlers } from './handlers/team-room';

export type SocketData = {
  user: { id: string; name: string; email: string };
  /** Per joined review: the candidate this tab looks at (null: the board) and when it chose (ms). */
  viewing?: Record<string, { candidateId: string | null; at: number }>;
};
export type RealtimeServer = Server<ClientToServerEvents, ServerToClientEvents, Record<string, never>, SocketData>;
export type RealtimeSocket = Socket<ClientToServerEvents, ServerToClientEvents, Record<string, never>, SocketData>;

/** A limit: at most `points` in `seconds`. */
export type SocketLimitRule = { points: number; seconds: number };

export type SocketLimits = {
  /** Events one socket may send; past it they are refused, past twice it the socket is closed. */
  eventsPerSocket: SocketLimitRule;
  /** Events one user may send over all their sockets (tabs, phones). */
  eventsPerUser: SocketLimitRule;
  /** Connections one user may open (a reconnecting client needs a few a minute). */
  connectionsPerUser: SocketLimitRule;
};

/**
 * A live board sends a handful of events per click; a person never needs more than a few
 * dozen a second. A flood is answered from memory, before any database work.
 */
export const productionSocketLimits: SocketLimits = {
  eventsPerSocket: { points: 40, seconds: 2 },
  eventsPerUser: { points: 120, seconds: 2 },
  connectionsPerUser: { points: 60, seconds: 60 },
};

const limiter = ({ points, seconds }: SocketLimitRule) => new RateLimiterMemory({ points, duration: seconds });

/** Attaches socket.io to the HTTP server: session from the cookie, rooms per team. */
export function attachRealtime(
  httpServer: HttpServer,
  {
    db,
    auth,
    origin,
    limits = productionSocketLimits,
  }: { db: Database; auth: Auth; origin: string; limits?: SocketLimits },
) {
  // More than one server process: rooms, broadcasts and fetchSockets span every process on
  // this database through LISTEN/NOTIFY (payloads over 8000 bytes go through a table).
  const adapterPool = openAdapterPool(db);
  ensureSocketAttachments(adapterPool).catch((error: unknown) =>
    console.error('[realtime] the adapter table could not be made:', error),
  );
  const io: RealtimeServer = new Server(httpServer, {
    adapter: createAdapter(adapterPool, {
      // A process that stops says so; one that dies is dropped after `heartbeatTimeout`.
      heartbeatInterval: 2_000,
      heartbeatTimeout: 6_000,
      errorHandler: (error) => console.error('[realtime] adapter:', error.message),
    }),
    cors: { origin, credentials: true },
    maxHttpBufferSize: 64 * 1024,
    serveClient: false,
    // `cors` covers polling only; a WebSocket upgrade carries the cookie from any page, so
    // every request of the handshake must come from the app's own origin.
    allowRequest: (req, callback) => {
      if (req.headers.origin === origin) callback(null, true);
      else callback('foreign_origin', false);
    },
  });
  const socketEvents = limiter(limits.eventsPerSocket);
  const userEvents = limiter(limits.eventsPerUser);
  const userConnections = limiter(limits.connectionsPerUser);

  io.use(async (socket, next) => {
    try {
      const session = await auth.api.getSession({ headers: fromNodeHeaders(socket.request.headers) });
      if (!session) return next(new Error('unauthorized'));
      try {
        await userConnections.consume(session.user.id);
      } catch {
        return next(new Error('rate_limited'));
      }
      socket.data.user = { id: session.user.id, name: session.user.name, email: session.user.email };
      next();
    } catch (error) {
      // The client learns the kind of failure, never the driver's message.
      if (isDatabaseUnavailable(error)) return next(new Error('database_unavailable'));
      console.error('[realtime] handshake failed:', error);
      next(new Error('internal'));
    }
  });

  io.on('connection', (socket) => {
    // Every event is counted before its handler runs; refused events are answered on their
    // ack, and a socket that keeps sending past twice its allowance is closed.
    socket.use((packet, next) => {
      const ack = packet[packet.length - 1];
      const refuse = (seconds: number) => {
        if (typeof ack === 'function') {
          (ack as Ack)({
            error: { code: 'rate_limited', message: `Too many events; wait ${seconds} s and try again.` },
          });
        }
      };
      Promise.all([socketEvents.consume(socket.id), userEvents.consume(socket.data.user.id)]).then(
        () => next(),
        (limited: unknown) => {
          if (!(limited instanceof RateLimiterRes)) return next(limited as Error);
          refuse(Math.ceil(limited.msBeforeNext / 1000));
          if (socket.connected && limited.consumedPoints > 2 * limits.eventsPerSocket.points) {
            console.warn(`[realtime] closing a socket of user ${socket.data.user.id}: event flood`);
            socket.disconnect(true);
          }
        },
      );
    });

    teamRoomHandlers(socket, db);
    boards.register(socket);
  });

  // Membership is checked again at every send: someone removed from the Team since joining
  // the room is taken out of it instead of hearing its news.
  const sendToMembers = async <E extends keyof ServerToClientEvents>(
    teamId: string,
    event: E,
    ...args: Parameters<ServerToClientEvents[E]>
  ) => {
    const room = teamRoom(teamId);
    const sockets = await io.in(room).fetchSockets();
    if (sockets.length === 0) return;
    const members = await teamMemberIds(db, teamId);
    for (const socket of sockets) {
      if (members.has(socket.data.user.id)) socket.emit(event, ...args);
      else socket.leave(room);
    }
  };
  // A Review's room: the same check, and a payload made per listener where it must differ.
  // Each joined socket is also in its person's room on that board (`listenerRoom`), so a send
  // addresses the Team's members now by those rooms: one publish per distinct payload, in
  // every process, with no round trip to ask the others for their sockets first.
  const sendToReview = async (reviewId: string, event: string, payload: unknown) => {
    const listeners = await reviewListeners(db, reviewId);
    const groups = new Map<string, { body: unknown; rooms: string[] }>();
    for (const [userId, role] of listeners) {
      const body = typeof payload === 'function' ? payload({ userId, role }) : payload;
      const key = typeof payload === 'function' ? JSON.stringify(body) : '';
      const group = groups.get(key) ?? { body, rooms: [] as string[] };
      group.rooms.push(listenerRoom(reviewId, userId));
      groups.set(key, group);
    }
    const emitTo = (rooms: string[], body: unknown) =>
      (io.to(rooms).emit as (event: string, body: unknown) => boolean)(event, body);
    for (const { rooms, body } of groups.values()) emitTo(rooms, body);
    // Sockets of people no longer in the Team are not addressed; take them off the board too.
    const members = [...groups.values()].flatMap((g) => g.rooms);
    io.in(reviewRoom(reviewId)).except(members).socketsLeave(reviewRoom(reviewId));
  };
  const broadcast: Broadcast = {
    toTeam(teamId, event, payload) {
      sendToMembers(teamId, event, ...([payload] as Parameters<ServerToClientEvents[typeof event]>)).catch(
        (error: unknown) => console.error('[realtime] broadcast failed:', error),
      );
    },
    toReview(reviewId, event, payload) {
      sendToReview(reviewId, event, payload).catch((error: unknown) =>
        console.error('[realtime] broadcast failed:', error),
      );
    },
  };
  const boards = createReviewRoom({ io, db, broadcast });
  // Closing: no new presence work, sockets out, tell the other processes, then the pool.
  const closeIo = io.close.bind(io);
  io.close = async (fn) => {
    boards.close();
    await closeIo();
    await closeAdapterPool(adapterPool).catch(() => {});
    fn?.();
  };
  return { io, broadcast };
}
