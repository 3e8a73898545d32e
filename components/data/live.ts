import type { RealtimeSocket } from '@/realtime/client';
import { reviewNews } from '@/realtime/events';
import type { ReviewNews, ReviewNewsEvent } from '@/server/contracts/news';

/**
 * Listens for one event of a review's room with its payload checked against the contract
 * schema first: one that does not fit never reaches `apply` (it is dropped with a warning).
 * Returns the function that stops listening.
 */
export function onReviewNews<E extends ReviewNewsEvent>(
  socket: RealtimeSocket,
  event: E,
  apply: (payload: ReviewNews[E]) => void,
): () => void {
  const listener = (raw: unknown) => {
    const parsed = reviewNews[event].safeParse(raw);
    if (!parsed.success) {
      console.warn(`[live] dropped a ${event} that does not match the contract`);
      return;
    }
    apply(parsed.data as ReviewNews[E]);
  };
  socket.on(event as never, listener as never);
  return () => socket.off(event as never, listener as never);
}

/**
 * Calls `then` after any of `events`, whatever they carry (for news that only makes a cached
 * read out of date: the read is fetched afresh, so the payload is not parsed again here).
 * Returns the function that stops listening.
 */
export function onAnyReviewNews(socket: RealtimeSocket, events: readonly ReviewNewsEvent[], then: () => void) {
  const listener = () => then();
  for (const e of events) socket.on(e as never, listener as never);
  return () => {
    for (const e of events) socket.off(e as never, listener as never);
  };
}
