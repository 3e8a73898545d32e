/** What the processes of `npm run bench:live` share: one clock, the bare room, their messages. */

/** The same clock in every process of the bench: milliseconds since the epoch, sub-millisecond. */
export const clock = () => performance.timeOrigin + performance.now();

export const benchRoom = 'review:bench';

/** Server process → parent: its URL once listening; for a floor broadcast, when it was sent. */
export type ServerMessage = { url: string } | { sentAt: number; key: number };
/** Parent → server process. */
export type ParentMessage = { floor: { key: number; bytes: number } } | { stop: true };

export type ClientsSetup = { urls: string[]; cookies: string[]; reviewId: string | null; clients: number };
/** Clients process → parent. */
export type ClientsMessage =
  { ready: true; connectMs: number } | { all: true; key: number; lastAt: number; bytes: number } | { failed: string };
