import { betterAuth } from 'better-auth';
import { drizzleAdapter } from 'better-auth/adapters/drizzle';
import { organization } from 'better-auth/plugins';

import type { Database } from '@/db/client';
import * as schema from '@/db/schema';
import { clientAddressHeader } from '@/server/auth/client-address';
import { recordAuthError } from '@/server/auth/gate';
import type { Mailer } from '@/server/auth/mailer';
import { accountExistsMail, invitationMail, verificationMail } from '@/server/auth/mails';
import { accessControl, roles } from '@/server/contracts/roles';

export type AuthOptions = {
  db: Database;
  /** The origin the app is served from, e.g. http://127.0.0.1:8090. */
  baseURL: string;
  secret: string;
  mailer: Mailer;
};

export const verificationLinkHours = 24;

export function createAuth({ db, baseURL, secret, mailer }: AuthOptions) {
  return betterAuth({
    appName: 'Cyclemoot',
    baseURL,
    basePath: '/api/auth',
    secret,
    trustedOrigins: [baseURL],
    database: drizzleAdapter(db, { provider: 'pg', schema, transaction: true }),
    emailAndPassword: {
      enabled: true,
      minPasswordLength: 10,
      maxPasswordLength: 128,
      // An address is an account's only once its owner opened the mailed link: before that,
      // anyone could sign up as an invited address and accept the invitation.
      requireEmailVerification: true,
      // Sign-up answers the same for a new and a known address; the known one's owner hears by mail.
      async onExistingUserSignUp({ user }) {
        await mailer.send(accountExistsMail({ to: user.email, name: user.name, signInURL: `${baseURL}/sign-in` }));
      },
    },
    emailVerification: {
      sendOnSignUp: true,
      // The sign-in form asks for a new link itself, with the page to come back to.
      sendOnSignIn: false,
      autoSignInAfterVerification: true,
      expiresIn: verificationLinkHours * 60 * 60,
      async sendVerificationEmail({ user, url }) {
        await mailer.send(verificationMail({ to: user.email, name: user.name, url, hours: verificationLinkHours }));
      },
    },
    session: { expiresIn: 60 * 60 * 24 * 30, updateAge: 60 * 60 * 24 },
    advanced: {
      // better-auth skips its origin check under NODE_ENV=test; tests must see production behaviour.
      disableOriginCheck: false,
      // Random UUIDs: invitation ids are then unguessable, so the e-mailed link itself proves the address.
      database: { generateId: 'uuid' },
      // The gate writes the client's address (from the socket, or from a configured proxy) into
      // this header and drops any copy the client sent; X-Forwarded-For is never read as sent.
      ipAddress: { ipAddressHeaders: [clientAddressHeader] },
      useSecureCookies: baseURL.startsWith('https://'),
    },
    // Limits live in server/auth/gate.ts, per address and per account: better-auth's own are
    // one bucket per path for everyone behind one address.
    rateLimit: { enabled: false },
    // The gate reads these back when better-auth answers 500 (a lost database, the owner rule).
    onAPIError: { onError: recordAuthError },
    plugins: [
      organization({
        ac: accessControl,
        roles,
        creatorRole: 'owner',
        invitationExpiresIn: 60 * 60 * 24 * 7,
        cancelPendingInvitationsOnReInvite: true,
        requireEmailVerificationOnInvitation: true,
        async sendInvitationEmail({ id, email, role, organization: team, inviter }) {
          await mailer.send(
            invitationMail({
              to: email,
              inviter: { name: inviter.user.name, email: inviter.user.email },
              teamName: team.name,
              role,
              link: `${baseURL}/invitation/${id}`,
            }),
          );
        },
      }),
    ],
  });
}

export type Auth = ReturnType<typeof createAuth>;
