import type { Listener, ReviewNews, ReviewNewsEvent, TeamNews, TeamNewsEvent } from '@/server/contracts/news';

/** A payload the same for everyone, or made per listener (a round's `votedBy` for the Lead). */
export type Payload<T> = T | ((listener: Listener) => T);

/**
 * How services tell a room about a committed change. Declared here, on the services'
 * side; `realtime/server.ts` implements it with socket.io, tests with a recorder.
 */
export type Broadcast = {
  toTeam<E extends TeamNewsEvent>(teamId: string, event: E, payload: TeamNews[E]): void;
  /** To everyone on a Review's board who is still a member of its Team. */
  toReview<E extends ReviewNewsEvent>(reviewId: string, event: E, payload: Payload<ReviewNews[E]>): void;
};

/** For work nobody watches live (the demo seed, scripts). */
export const noBroadcast: Broadcast = { toTeam() {}, toReview() {} };
