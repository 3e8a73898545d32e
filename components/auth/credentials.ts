import { currentPassword, emailAddress, newPassword, personName } from '@/server/contracts/auth';

/** The sign-in and sign-up fields: the same schemas the server checks before better-auth reads a body. */
export const emailField = emailAddress;
export const passwordField = newPassword;
export const signInPassword = currentPassword;
export { personName };

/** Only same-site paths are followed after sign-in. */
export function safeNext(next: unknown): string {
  return typeof next === 'string' && next.startsWith('/') && !next.startsWith('//') ? next : '/';
}

/**
 * Where the mailed link lands: sign-in, which passes a signed-in person straight on to
 * `returnTo` and explains a link that has expired or was used (better-auth adds `error`).
 */
export function confirmationLanding(returnTo: string): string {
  return returnTo === '/' ? '/sign-in' : `/sign-in?next=${encodeURIComponent(returnTo)}`;
}
