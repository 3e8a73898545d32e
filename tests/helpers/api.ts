import type { Express } from 'express';
import supertest from 'supertest';
import { inject } from 'vitest';

import { createDatabase, type Database } from '@/db/client';
import { createApp } from '@/server/app';
import { createAuth, type Auth } from '@/server/auth/auth';
import type { AuthLimits } from '@/server/auth/gate';
import { createSmtpMailer } from '@/server/auth/mailer';
import type { Broadcast } from '@/server/services/broadcast';

import { roomyAuthLimits, testSecret, uniqueEmail, verificationLink } from './test-server';

/** The origin the test app believes it is served from; clients send it as `Origin`. */
export const testOrigin = 'http://127.0.0.1:3999';

export type Sent = { event: string; teamId?: string; reviewId?: string; payload: unknown };

/** `createApp()` on the test database, without listening; broadcasts are recorded. */
export function createTestApp(databaseUrl = inject('databaseUrl'), authLimits: AuthLimits = roomyAuthLimits) {
  const db = createDatabase(databaseUrl, 4);
  const mailer = createSmtpMailer({ host: '127.0.0.1', port: inject('smtpPort'), from: 'test@cyclemoot.test' });
  const auth = createAuth({ db, baseURL: testOrigin, secret: testSecret, mailer });
  const sent: Sent[] = [];
  const broadcast: Broadcast = {
    toTeam: (teamId, event, payload) => void sent.push({ teamId, event, payload }),
    toReview: (reviewId, event, payload) => void sent.push({ reviewId, event, payload }),
  };
  const app = createApp({ db, auth, broadcast, origin: testOrigin, authLimits, mailer });
  return { app, db, auth, sent, close: () => db.$client.end() };
}

export type TestUser = {
  agent: ReturnType<typeof supertest.agent>;
  id: string;
  email: string;
  name: string;
  /** The session cookie, for clients other than the agent (socket.io). */
  cookie: string;
};

export const testPassword = 'correct-horse-battery';

/**
 * Signs a new user up through the real auth routes and confirms the address by opening the
 * link from the mail fake, as a person would; the agent keeps the session cookie that the
 * link sets. `target` is the app (not listening) or the URL of a running server.
 */
export async function signUp(
  target: Express | string,
  name = 'Test User',
  email = uniqueEmail(name.split(' ')[0].toLowerCase()),
): Promise<TestUser> {
  const agent = supertest.agent(target).set('Origin', typeof target === 'string' ? target : testOrigin);
  const res = await agent.post('/api/auth/sign-up/email').send({ name, email, password: testPassword });
  if (res.status !== 200) throw new Error(`sign-up failed: ${res.status} ${JSON.stringify(res.body)}`);
  const link = new URL(await verificationLink(email));
  const verified = await agent.get(link.pathname + link.search);
  const setCookie = verified.headers['set-cookie'] as unknown as string[] | undefined;
  if (verified.status !== 302 || !setCookie) {
    throw new Error(`confirming ${email} failed: ${verified.status} ${JSON.stringify(verified.body)}`);
  }
  const cookie = setCookie.map((c) => c.split(';')[0]).join('; ');
  return { agent, id: res.body.user.id, email, name, cookie };
}

/** A new team of `owner`'s through better-auth (the creator becomes its Owner). */
export async function startTeam(owner: TestUser, name = 'Test team'): Promise<string> {
  const res = await owner.agent
    .post('/api/auth/organization/create')
    .send({ name, slug: `test-${Date.now().toString(36)}${Math.random().toString(36).slice(2, 6)}` });
  if (res.status !== 200) throw new Error(`team create failed: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body.id as string;
}

/** A team created by `owner` through better-auth, with `others` added in the given roles. */
export async function createTeam(
  ctx: { auth: Auth; db: Database },
  owner: TestUser,
  others: Array<{ user: TestUser; role: string }> = [],
) {
  const teamId = await startTeam(owner);
  for (const { user, role } of others) {
    await ctx.auth.api.addMember({ body: { userId: user.id, role: role as never, organizationId: teamId } });
  }
  return teamId;
}
