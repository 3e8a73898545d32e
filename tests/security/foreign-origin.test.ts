import { eq } from 'drizzle-orm';
import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';

import { createDatabase } from '@/db/client';
import { review } from '@/db/schema';
import { createApp } from '@/server/app';
import { createAuth } from '@/server/auth/auth';
import { createSmtpMailer } from '@/server/auth/mailer';
import { noBroadcast } from '@/server/services/broadcast';

import { createTeam, createTestApp, signUp, testPassword, type TestUser } from '../helpers/api';
import { roomyAuthLimits, testSecret } from '../helpers/test-server';

/**
 * Finding 12: a cookie-bearing PATCH sent by another site's page succeeded; only SameSite
 * and CORS stood in the way. And the session cookie must be Secure when served over https.
 */

const ctx = createTestApp();
let lead: TestUser;
let teamId: string;
let reviewId: string;

beforeAll(async () => {
  lead = await signUp(ctx.app, 'Orla Origin');
  teamId = await createTeam(ctx, lead);
  reviewId = (await lead.agent.post(`/api/teams/${teamId}/reviews`).send({ name: 'Origin review' }).expect(201)).body
    .id;
});
afterAll(() => ctx.close());

const nameNow = async () => (await ctx.db.select().from(review).where(eq(review.id, reviewId)))[0].name;

describe('state-changing requests from another site’s page', () => {
  for (const [what, origin] of [
    ['a foreign Origin', 'https://evil.example'],
    ['an Origin that only starts like ours', 'http://127.0.0.1:3999.evil.example'],
    ['the opaque Origin null', 'null'],
  ] as const) {
    it(`a cookie-bearing PATCH with ${what} is refused and changes nothing`, async () => {
      const res = await supertest(ctx.app)
        .patch(`/api/reviews/${reviewId}`)
        .set('Cookie', lead.cookie)
        .set('Origin', origin)
        .send({ name: 'Renamed from elsewhere' });
      expect(res.status).toBe(403);
      expect(res.body.error.code).toBe('foreign_origin');
      expect(await nameNow()).toBe('Origin review');
    });
  }

  it('a cookie-bearing POST without any Origin is refused', async () => {
    const res = await supertest(ctx.app)
      .post(`/api/teams/${teamId}/reviews`)
      .set('Cookie', lead.cookie)
      .send({ name: 'No origin review' });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('foreign_origin');
  });

  it('a foreign Origin on better-auth’s routes is refused too', async () => {
    const res = await supertest(ctx.app)
      .post('/api/auth/organization/create')
      .set('Cookie', lead.cookie)
      .set('Origin', 'https://evil.example')
      .send({ name: 'Evil Team', slug: 'evil-team' });
    expect(res.status).toBe(403);
  });

  it('reads still work from anywhere with the cookie (they change nothing), and our own page may write', async () => {
    const read = await supertest(ctx.app).get(`/api/reviews/${reviewId}`).set('Cookie', lead.cookie);
    expect(read.status).toBe(200);
    await lead.agent.patch(`/api/reviews/${reviewId}`).send({ name: 'Origin review, renamed' }).expect(200);
    expect(await nameNow()).toBe('Origin review, renamed');
  });
});

describe('the session cookie over https', () => {
  it('is Secure (and __Secure- prefixed) when the app is served from an https origin', async () => {
    const origin = 'https://cyclemoot.example';
    const db = createDatabase(inject('databaseUrl'), 2);
    try {
      const mailer = createSmtpMailer({ host: '127.0.0.1', port: inject('smtpPort'), from: 'test@cyclemoot.test' });
      const auth = createAuth({ db, baseURL: origin, secret: testSecret, mailer });
      const app = createApp({ db, auth, broadcast: noBroadcast, origin, authLimits: roomyAuthLimits });
      const res = await supertest(app)
        .post('/api/auth/sign-in/email')
        .set('Origin', origin)
        .send({ email: lead.email, password: testPassword });
      expect(res.status).toBe(200);
      const cookies = res.headers['set-cookie'] as unknown as string[];
      const session = cookies.find((c) => c.includes('session_token'))!;
      expect(session).toMatch(/^__Secure-/);
      expect(session).toMatch(/;\s*Secure/i);
      expect(session).toMatch(/;\s*HttpOnly/i);
    } finally {
      await db.$client.end();
    }
  });

  it('is not Secure on plain http on loopback (the local product), but HttpOnly and SameSite=Lax', async () => {
    const res = await supertest(ctx.app)
      .post('/api/auth/sign-in/email')
      .set('Origin', 'http://127.0.0.1:3999')
      .send({ email: lead.email, password: testPassword });
    expect(res.status).toBe(200);
    const session = (res.headers['set-cookie'] as unknown as string[]).find((c) => c.includes('session_token'))!;
    expect(session).not.toMatch(/^__Secure-|;\s*Secure/i);
    expect(session).toMatch(/;\s*HttpOnly/i);
    expect(session).toMatch(/;\s*SameSite=Lax/i);
  });
});
