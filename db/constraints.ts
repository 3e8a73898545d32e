/**
 * The database's own rules that application code may need to recognise in an error, by the
 * constraint names db/migrations gives them.
 */

/** PostgreSQL's SQLSTATE for check_violation, which the Team Owner rule raises too. */
const checkViolation = '23514';

/**
 * True when `error`, or any error in its `cause` chain (Drizzle wraps the pg error in its own),
 * is the database refusing a change that would leave a Team without an Owner.
 */
export function isTeamOwnerRuleViolation(error: unknown): boolean {
  const seen = new Set<unknown>();
  for (let e = error; typeof e === 'object' && e !== null && !seen.has(e); e = (e as { cause?: unknown }).cause) {
    seen.add(e);
    const { code, constraint } = e as { code?: unknown; constraint?: unknown };
    if (code === checkViolation && constraint === 'team_keeps_an_owner') return true;
  }
  return false;
}
