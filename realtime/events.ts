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

const id = (name: string) =>
  z
    .string({ error: `${name} must be text.` })
    .min(1, `${name} is required.`)
    .max(100, `${name} is at most 100 characters.`);

export const reviewRoomPayload = z.strictObject({ reviewId: id('reviewId') });
export type ReviewRoomPayload = z.infer<typeof reviewRoomPayload>;

/** `candidateId: null` is the board as a whole (or, for `room:gather`, stop gathering). */
const candidateChoice = z.strictObject({
  reviewId: id('reviewId'),
  candidateId: id('candidateId').nullable(),
});
export const viewingPayload = candidateChoice;
export type ViewingPayload = z.infer<typeof viewingPayload>;
export const gatherPayload = candidateChoice;
export type GatherPayload = z.infer<typeof gatherPayload>;

export const teamRoom = (teamId: string) => `team:${teamId}`;
export const reviewRoom = (reviewId: string) => `review:${reviewId}`;
