import { z } from 'zod';

import { reviewNews, teamNews, type ReviewNews, type TeamNews } from '@/server/contracts/news';

export { reviewNews, teamNews };

/** Events the server sends: to a Team's room `team:<id>`, and to a Review's board `review:<id>`. */
export type ServerToClientEvents = { [E in keyof TeamNews]: (payload: TeamNews[E]) => void } & {
  [E in keyof ReviewNews]: (payload: ReviewNews[E]) => void;
};

export type AckError = { error: { code: string; message: string; field?: string } };
export type Ack = (result: { ok: true } | AckError) => void;

/** Events a client sends; every payload is checked with the schemas below. */
export type ClientToServerEvents = {
  'team:join': (payload: { teamId: string }, ack?: Ack) => void;
  'team:leave': (payload: { teamId: string }, ack?: Ack) => void;
  'review:join': (payload: { reviewId: string }, ack?: Ack) => void;
  'review:leave': (payload: { reviewId: string }, ack?: Ack) => void;
  'presence:viewing': (payload: { reviewId: string; candidateId: string | null }, ack?: Ack) => void;
  'room:gather': (payload: { reviewId: string; candidateId: string | null }, ack?: Ack) => void;
};

export const teamRoomPayload = z.strictObject({
  teamId: z.string({ error: 'teamId must be text.' }).min(1, 'teamId is required.').max(100),
});

export const teamRoom = (teamId: string) => `team:${teamId}`;
export const reviewRoom = (reviewId: string) => `review:${reviewId}`;
