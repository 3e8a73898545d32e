// Node socket errors and PostgreSQL SQLSTATEs that mean "the database is not there right now":
// class 08 (connection exception) and 57P01–57P03 (shut down, crashed, starting up).
const unavailableCodes = new Set([
  'ECONNREFUSED',
  'ECONNRESET',
  'ETIMEDOUT',
  'EPIPE',
  'ENOTFOUND',
  'EHOSTUNREACH',
  '57P01',
  '57P02',
  '57P03',
  '08000',
  '08001',
  '08003',
  '08004',
  '08006',
]);
const unavailableMessages = [
  /Connection terminated/i,
  /timeout exceeded when trying to connect/i,
  /connect ECONNREFUSED/i,
];

/**
 * True when `error` (or an error it wraps: Drizzle and better-auth put the driver's error
 * in `cause`) says the database cannot be reached, as opposed to a query it refused.
 */
export function isDatabaseUnavailable(error: unknown): boolean {
  const seen = new Set<unknown>();
  for (let e: unknown = error; e && typeof e === 'object' && !seen.has(e); e = (e as { cause?: unknown }).cause) {
    seen.add(e);
    const { code, message } = e as { code?: unknown; message?: unknown };
    if (typeof code === 'string' && unavailableCodes.has(code)) return true;
    if (typeof message === 'string' && unavailableMessages.some((m) => m.test(message))) return true;
    if (e instanceof AggregateError && e.errors.some(isDatabaseUnavailable)) return true;
  }
  return false;
}

/**
 * The unique constraint `error` (or an error it wraps) broke, if it is a unique violation
 * (SQLSTATE 23505): how a service tells "that name is taken" from any other failure.
 */
export function violatedUnique(error: unknown): string | undefined {
  const seen = new Set<unknown>();
  for (let e: unknown = error; e && typeof e === 'object' && !seen.has(e); e = (e as { cause?: unknown }).cause) {
    seen.add(e);
    const { code, constraint } = e as { code?: unknown; constraint?: unknown };
    if (code === '23505') return typeof constraint === 'string' ? constraint : '';
  }
  return undefined;
}
