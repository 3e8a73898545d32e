import { betterAuth } from 'better-auth';
import { drizzleAdapter } from 'better-auth/adapters/drizzle';
import { organization } from 'better-auth/plugins';

import type { Database } from '@/db/client';
import * as schema from '@/db/schema';
import type { Mailer } from '@/server/auth/mailer';
import { accessControl, roles } from '@/server/contracts/roles';

export type AuthOptions = {
  db: Database;
  /** The origin the app is served from, e.g. http://127.0.0.1:8090. */
  baseURL: string;
  secret: string;
  mailer: Mailer;
};

export function createAuth({ db, baseURL, secret, mailer }: AuthOptions) {
  return betterAuth({
    appName: 'Cyclemoot',
    baseURL,
    basePath: '/api/auth',
    secret,
    trustedOrigins: [baseURL],
    database: drizzleAdapter(db, { provider: 'pg', schema }),
    emailAndPassword: {
      enabled: true,
      minPasswordLength: 10,
      maxPasswordLength: 128,
      autoSignIn: true,
    },
    session: { expiresIn: 60 * 60 * 24 * 30, updateAge: 60 * 60 * 24 },
    advanced: {
      // better-auth skips its origin check under NODE_ENV=test; tests must see production behaviour.
      disableOriginCheck: false,
      // Random UUIDs: invitation ids are then unguessable, so the e-mailed link itself proves the address.
      database: { generateId: 'uuid' },
    },
    // Throttles repeated sign-in attempts per address; the test suite signs up many users from one address.
    // A meeting room signs in from one address (on loopback, everyone does), so the sign-in and
    // sign-up limits are per minute and roomier than better-auth's 3 per 10 s.
    rateLimit: {
      enabled: process.env.VITEST === undefined,
      window: 60,
      max: 100,
      customRules: {
        '/sign-in/*': { window: 60, max: 30 },
        '/sign-up/*': { window: 60, max: 10 },
      },
    },
    plugins: [
      organization({
        ac: accessControl,
        roles,
        creatorRole: 'owner',
        invitationExpiresIn: 60 * 60 * 24 * 7,
        cancelPendingInvitationsOnReInvite: true,
        async sendInvitationEmail({ id, email, role, organization: team, inviter }) {
          const link = `${baseURL}/invitation/${id}`;
          await mailer.send({
            to: email,
            subject: `${inviter.user.name} invited you to ${team.name} on Cyclemoot`,
            text:
              `${inviter.user.name} (${inviter.user.email}) invited you to join the team ` +
              `"${team.name}" on Cyclemoot as ${role}.\n\n` +
              `Open this link to accept: ${link}\n\n` +
              `The invitation expires in 7 days. If you did not expect it, ignore this e-mail.`,
          });
        },
      }),
    ],
  });
}

export type Auth = ReturnType<typeof createAuth>;
