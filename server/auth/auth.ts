import { betterAuth } from 'better-auth';
import { drizzleAdapter } from 'better-auth/adapters/drizzle';
import { organization } from 'better-auth/plugins';

import type { Database } from '@/db/client';
import * as schema from '@/db/schema';
import { clientAddressHeader } from '@/server/auth/client-address';
import type { Mailer } from '@/server/auth/mailer';
import { accountExistsMail, invitationMail, verificationMail } from '@/server/auth/mails';
import { accessControl, roles } from '@/server/contracts/roles';

/** better-auth's log lines, kept short and free of query parameters. */
function logAuthLine(level: 'debug' | 'info' | 'warn' | 'error', message: string, ...args: unknown[]) {
  if (level === 'debug' || level === 'info') return;
  const details = args.map((arg) => {
    if (!(arg instanceof Error)) return typeof arg === 'string' ? arg : '';
    const cause = (arg as { cause?: { code?: unknown; message?: unknown } }).cause;
    const first = arg.message.split('\n')[0].replace(/^Failed query: .*/, 'a database query failed');
    return `${arg.name}: ${first}${cause?.code ? ` (${String(cause.code)})` : ''}`;
  });
  console[level](`[auth] ${message} ${details.join(' ')}`.trim());
}

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
      // Joins: a session and its user come back in one query, not two, on every request.
      database: { generateId: 'uuid', joins: true },
      // The gate writes the client's address (from the socket, or from a configured proxy) into
      // this header and drops any copy the client sent; X-Forwarded-For is never read as sent.
      ipAddress: { ipAddressHeaders: [clientAddressHeader] },
      useSecureCookies: baseURL.startsWith('https://'),
    },
    // Limits live in server/auth/gate.ts, per address and per account: better-auth's own are
    // one bucket per path for everyone behind one address.
    rateLimit: { enabled: false },
    // Unexpected failures (a lost database, the owner rule) reach the gate as thrown errors.
    onAPIError: { throw: true },
    // One line per failure, without the failed query's parameters (a session token is one).
    logger: { log: logAuthLine },
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
