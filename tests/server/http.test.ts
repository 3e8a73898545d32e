import supertest from 'supertest';
import { afterAll, describe, expect, it } from 'vitest';

import { user } from '@/db/schema';

import { createTestApp, signUp, testOrigin, testPassword } from '../helpers/api';

const ctx = createTestApp();
afterAll(() => ctx.close());

describe('health', () => {
  it('reports the database state', async () => {
    const res = await supertest(ctx.app).get('/api/health');
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ status: 'ok', database: { ok: true } });
    expect(res.body.database.latencyMs).toBeGreaterThanOrEqual(0);
  });
});

describe('bad input and failure', () => {
  it('answers malformed JSON with 400 and the error envelope', async () => {
    const u = await signUp(ctx.app, 'Mal Formed');
    const res = await u.agent.post('/api/teams/x/reviews').set('content-type', 'application/json').send('{"name": ');
    expect(res.status).toBe(400);
    expect(res.body.error).toMatchObject({ code: 'malformed_json' });
    expect(res.body.error.requestId).toBe(res.headers['x-request-id']);
  });

  it('answers an oversized body with 413', async () => {
    const u = await signUp(ctx.app, 'Big Body');
    const res = await u.agent.post('/api/teams/x/reviews').send({ name: 'x'.repeat(300_000) });
    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe('body_too_large');
  });

  it('answers an unknown API route with 404 and the envelope', async () => {
    const u = await signUp(ctx.app, 'Lost Person');
    const res = await u.agent.get('/api/no-such-thing');
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('route_not_found');
  });
});

describe('sign-up', () => {
  const agent = () => supertest.agent(ctx.app).set('Origin', testOrigin);

  it('writes nothing for a taken e-mail, answering as for a new one (no session either way)', async () => {
    const first = await signUp(ctx.app, 'Taken Mail');
    const before = await ctx.db.$count(user);
    const res = await agent()
      .post('/api/auth/sign-up/email')
      .send({ name: 'Other', email: first.email, password: 'another-good-password' });
    expect(res.status).toBe(200);
    expect(res.body.token).toBeNull();
    expect(res.body.user.id).not.toBe(first.id);
    expect(await ctx.db.$count(user)).toBe(before);
    // The first account keeps its name and password.
    await agent().post('/api/auth/sign-in/email').send({ email: first.email, password: testPassword }).expect(200);
  });

  it('refuses a weak password and writes nothing', async () => {
    const before = await ctx.db.$count(user);
    const res = await agent()
      .post('/api/auth/sign-up/email')
      .send({ name: 'Weak', email: 'weak@test.example', password: 'short' });
    expect(res.status).toBe(422);
    expect(res.body.error).toMatchObject({
      field: 'password',
      message: 'password: Password needs at least 10 characters.',
    });
    expect(await ctx.db.$count(user)).toBe(before);
  });

  it('refuses a cookie-bearing request without a trusted Origin', async () => {
    const { cookie } = await signUp(ctx.app, 'No Origin');
    expect(cookie.length).toBeGreaterThan(0);
    const res = await supertest(ctx.app)
      .post('/api/auth/sign-out')
      .set('Cookie', cookie)
      .set('Origin', 'http://evil.example');
    expect(res.status).toBe(403);
    const fine = await supertest(ctx.app).get('/api/me').set('Cookie', cookie);
    expect(fine.status).toBe(200);
  });
});
