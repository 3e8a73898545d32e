/** How long fetched data counts as fresh before react-query refetches it in the background. */
export const STALE = {
  /** Lists that live updates keep current. */
  seconds: { ten: 10_000, thirty: 30_000 },
  minutes: { one: 60_000, five: 5 * 60_000 },
  /** Data that changes only by the user's own action here (cache is patched on mutation). */
  infinity: Infinity,
} as const;
