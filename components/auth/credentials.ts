import { z } from 'zod';

/** Client checks for the sign-in and sign-up forms; better-auth checks the same on the server. */
export const emailField = z.email({ error: 'Enter a valid e-mail address.' }).trim();
export const passwordField = z
  .string()
  .min(10, 'Password needs at least 10 characters.')
  .max(128, 'Password must be at most 128 characters.');
export const signInPassword = z.string().min(1, 'Enter your password.');
export const personName = z.string().trim().min(1, 'Enter your name.').max(80, 'Name must be at most 80 characters.');

/** Only same-site paths are followed after sign-in. */
export function safeNext(next: unknown): string {
  return typeof next === 'string' && next.startsWith('/') && !next.startsWith('//') ? next : '/';
}
