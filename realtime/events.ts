import { z } from 'zod';

import type { Review } from '@/server/contracts/review';

/** Events the server sends to a team's room `team:<id>`. */
export type ServerToClientEvents = {
  'review:created': (payload: { review: Review }) => void;
  'review:updated': (payload: { review: Review }) => void;
};

export type Ack = (result: { ok: true } | { error: { code: string; message: string } }) => void;

/** Events a client sends; every payload is checked with the schemas below. */
export type ClientToServerEvents = {
  'team:join': (payload: { teamId: string }, ack?: Ack) => void;
  'team:leave': (payload: { teamId: string }, ack?: Ack) => void;
};

export const teamRoomPayload = z.strictObject({
  teamId: z.string({ error: 'teamId must be text.' }).min(1, 'teamId is required.').max(100),
});

export const teamRoom = (teamId: string) => `team:${teamId}`;

/** What services use to tell the room about a change; a no-op stand-in where nobody listens. */
export type Broadcast = {
  toTeam<E extends keyof ServerToClientEvents>(
    teamId: string,
    event: E,
    ...args: Parameters<ServerToClientEvents[E]>
  ): void;
};
