import type { Server as HttpServer } from 'node:http';

import { fromNodeHeaders } from 'better-auth/node';
import { eq } from 'drizzle-orm';
import { Server } from 'socket.io';
import type { z } from 'zod';

import type { Database } from '@/db/client';
import { member } from '@/db/schema';
import type { Auth } from '@/server/auth/auth';
import { ApiError } from '@/server/http/errors';
import { requireTeam } from '@/server/http/guard';

import {
  teamRoom,
  teamRoomPayload,
  type Ack,
  type Broadcast,
  type ClientToServerEvents,
  type ServerToClientEvents,
} from './events';

type SocketData = { user: { id: string; name: string; email: string } };
export type RealtimeServer = Server<ClientToServerEvents, ServerToClientEvents, Record<string, never>, SocketData>;

function failure(error: unknown) {
  if (error instanceof ApiError) return { error: { code: error.code, message: error.message } };
  console.error('[realtime] handler failed:', error);
  return { error: { code: 'internal', message: 'Something went wrong on the server.' } };
}

/** Wraps a handler: validates the payload, checks access, answers the ack with ok or an error. */
function handle<P>(schema: z.ZodType<P>, run: (payload: P) => Promise<void>) {
  return async (raw: unknown, ack?: Ack) => {
    const reply: Ack = typeof ack === 'function' ? ack : () => {};
    const parsed = schema.safeParse(raw);
    if (!parsed.success) {
      reply({ error: { code: 'invalid_input', message: parsed.error.issues[0]?.message ?? 'Invalid payload.' } });
      return;
    }
    try {
      await run(parsed.data);
      reply({ ok: true });
    } catch (error) {
      reply(failure(error));
    }
  };
}

/** Attaches socket.io to the HTTP server: session from the cookie, rooms per team. */
export function attachRealtime(
  httpServer: HttpServer,
  { db, auth, origin }: { db: Database; auth: Auth; origin: string },
) {
  const io: RealtimeServer = new Server(httpServer, {
    cors: { origin, credentials: true },
    maxHttpBufferSize: 64 * 1024,
    serveClient: false,
  });

  io.use(async (socket, next) => {
    try {
      const session = await auth.api.getSession({ headers: fromNodeHeaders(socket.request.headers) });
      if (!session) return next(new Error('unauthorized'));
      socket.data.user = { id: session.user.id, name: session.user.name, email: session.user.email };
      next();
    } catch (error) {
      next(error as Error);
    }
  });

  io.on('connection', (socket) => {
    socket.on(
      'team:join',
      handle(teamRoomPayload, async ({ teamId }) => {
        await requireTeam(db, socket.data.user.id, teamId);
        await socket.join(teamRoom(teamId));
      }),
    );
    socket.on(
      'team:leave',
      handle(teamRoomPayload, async ({ teamId }) => {
        await socket.leave(teamRoom(teamId));
      }),
    );
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
    const rows = await db.select({ userId: member.userId }).from(member).where(eq(member.organizationId, teamId));
    const members = new Set(rows.map((r) => r.userId));
    for (const socket of sockets) {
      if (members.has(socket.data.user.id)) socket.emit(event, ...args);
      else socket.leave(room);
    }
  };
  const broadcast: Broadcast = {
    toTeam(teamId, event, ...args) {
      sendToMembers(teamId, event, ...args).catch((error: unknown) =>
        console.error('[realtime] broadcast failed:', error),
      );
    },
  };
  return { io, broadcast };
}
