import type { Socket } from 'socket.io';

import type { Database } from '@/db/client';
import { requireTeam } from '@/server/services/access';

import { teamRoom, teamRoomPayload, type ClientToServerEvents, type ServerToClientEvents } from '../events';
import type { SocketData } from '../server';
import { handle } from './handle';

type TeamSocket = Socket<ClientToServerEvents, ServerToClientEvents, Record<string, never>, SocketData>;

/** `team:join` and `team:leave`: parse → access → join the room → ack. */
export function teamRoomHandlers(socket: TeamSocket, db: Database) {
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
}
