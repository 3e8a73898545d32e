import { z } from 'zod';

import { teamRole } from './team';
import { plainText } from './text';

/**
 * The bodies of the better-auth endpoints the app uses, checked before better-auth reads
 * them (server/auth/gate.ts). The sign-in and sign-up forms import the same fields.
 */

export const personName = plainText({ label: 'Your name', min: 1, max: 80 });

export const emailAddress = z
  .string({ error: 'Enter a valid e-mail address.' })
  .trim()
  .toLowerCase()
  .max(254, 'An e-mail address has at most 254 characters.')
  .pipe(z.email({ error: 'Enter a valid e-mail address.' }));

export const newPassword = z
  .string({ error: 'Password must be text.' })
  .min(10, 'Password needs at least 10 characters.')
  .max(128, 'Password must be at most 128 characters.');

export const currentPassword = z
  .string({ error: 'Password must be text.' })
  .min(1, 'Enter your password.')
  .max(128, 'Password must be at most 128 characters.');

/** Where to go after a mailed link: a path on this site only. */
export const returnPath = z
  .string({ error: 'callbackURL must be text.' })
  .max(500, 'callbackURL must be at most 500 characters.')
  .refine((v) => /^\/(?![/\\])[^\s\\]*$/.test(v), 'callbackURL must be a path on this site.');

const id = z.string({ error: 'An id must be text.' }).min(1, 'An id is required.').max(100, 'That id is too long.');

export const signUpInput = z.strictObject({
  name: personName,
  email: emailAddress,
  password: newPassword,
  callbackURL: returnPath.optional(),
  rememberMe: z.boolean().optional(),
});

export const signInInput = z.strictObject({
  email: emailAddress,
  password: currentPassword,
  callbackURL: returnPath.optional(),
  rememberMe: z.boolean().optional(),
});

export const resendVerificationInput = z.strictObject({
  email: emailAddress,
  callbackURL: returnPath.optional(),
});

export const verifyEmailQuery = z.strictObject({
  token: z.string().min(1, 'The link has no token.').max(4096, 'The link is too long.'),
  callbackURL: returnPath.optional(),
});

export const inviteMemberInput = z.strictObject({
  email: emailAddress,
  role: teamRole,
  organizationId: id,
  resend: z.boolean().optional(),
});

export const updateMemberRoleInput = z.strictObject({ memberId: id, role: teamRole, organizationId: id });
export const removeMemberInput = z.strictObject({ memberIdOrEmail: id, organizationId: id });
export const invitationInput = z.strictObject({ invitationId: id });
export const teamIdInput = z.strictObject({ organizationId: id });
export const emptyInput = z.strictObject({});
