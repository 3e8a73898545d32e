import { request as httpRequest } from 'node:http';

import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';

import { productionAuthLimits } from '@/server/auth/gate';
import { noBroadcast } from '@/server/services/broadcast';

import { createTestApp, signUp, testOrigin, testPassword, type TestUser } from '../helpers/api';
import { startTestServer, uniqueEmail } from '../helpers/test-server';

/**
 * Finding 2: the sign-in limit was one bucket per path for everyone (23 wrong passwords
 * from one client locked every user out) and X-Forwarded-For, believed from any client on
 * loopback, went around it. Attacks here run against an app with the production limits;
 * the people they target are signed up through a roomy app on the same database.
 */

const setup = createTestApp();
const guarded = createTestApp(inject('databaseUrl'), productionAuthLimits);
const perAccount = productionAuthLimits.signInPerAccount.points;
let victim: TestUser;
let bystander: TestUser;

beforeAll(async () => {
  victim = await signUp(setup.app, 'Vera Victim');
  bystander = await signUp(setup.app, 'Bo Bystander');
});
afterAll(async () => {
  await setup.close();
  await guarded.close();
});

const client = (app = guarded.app) => supertest(app);
const guess = (email: string, forwardedFor?: string) => {
  const req = client().post('/api/auth/sign-in/email').set('Origin', testOrigin);
  if (forwardedFor) req.set('X-Forwarded-For', forwardedFor);
  return req.send({ email, password: 'not-the-password' });
};

describe('guessing one account’s password', () => {
  it('stops after the per-account limit, and another person signs in meanwhile from the same address', async () => {
    for (let i = 0; i < perAccount; i++) expect((await guess(victim.email)).status).toBe(401);
    const limited = await guess(victim.email);
    expect(limited.status).toBe(429);
    expect(limited.body.error.code).toBe('rate_limited');
    expect(limited.body.error.message).toMatch(/for this account/);
    expect(Number(limited.headers['retry-after'])).toBeGreaterThan(0);
    // Even the right password waits now: the guesses cannot race a lucky hit through.
    const right = await client()
      .post('/api/auth/sign-in/email')
      .set('Origin', testOrigin)
      .send({ email: victim.email, password: testPassword });
    expect(right.status).toBe(429);

    const other = await client()
      .post('/api/auth/sign-in/email')
      .set('Origin', testOrigin)
      .send({ email: bystander.email, password: testPassword });
    expect(other.status).toBe(200);
  });

  it('an invented X-Forwarded-For on every guess does not reset the count', async () => {
    const target = await signUp(setup.app, 'Xavier Forwarded');
    const statuses: number[] = [];
    for (let i = 0; i < perAccount + 5; i++) statuses.push((await guess(target.email, `203.0.113.${i + 1}`)).status);
    expect(statuses.slice(0, perAccount).every((s) => s === 401)).toBe(true);
    expect(statuses.slice(perAccount).every((s) => s === 429)).toBe(true);
  });

  it('guesses from really different client addresses (127.0.0.2 …) share the account’s limit', async () => {
    const server = await startTestServer({ authLimits: productionAuthLimits });
    try {
      const target = await signUp(setup.app, 'Spread Guesses');
      const { port } = new URL(server.baseURL);
      const fromAddress = (localAddress: string) =>
        new Promise<number>((resolve, reject) => {
          const body = JSON.stringify({ email: target.email, password: 'not-the-password' });
          const req = httpRequest(
            {
              host: '127.0.0.1',
              port: Number(port),
              localAddress,
              method: 'POST',
              path: '/api/auth/sign-in/email',
              headers: { 'content-type': 'application/json', origin: server.baseURL },
            },
            (res) => {
              res.resume();
              res.on('end', () => resolve(res.statusCode ?? 0));
            },
          );
          req.on('error', reject);
          req.end(body);
        });
      const statuses: number[] = [];
      for (let i = 0; i < perAccount + 2; i++) statuses.push(await fromAddress(`127.0.0.${i + 2}`));
      expect(statuses.slice(0, perAccount)).toEqual(Array(perAccount).fill(401));
      expect(statuses.slice(perAccount)).toEqual([429, 429]);
    } finally {
      await server.stop();
    }
  });

  it('a successful sign-in clears the account’s count', async () => {
    const target = await signUp(setup.app, 'Clears Count');
    for (let i = 0; i < perAccount - 1; i++) expect((await guess(target.email)).status).toBe(401);
    await client()
      .post('/api/auth/sign-in/email')
      .set('Origin', testOrigin)
      .send({ email: target.email, password: testPassword })
      .expect(200);
    for (let i = 0; i < perAccount - 1; i++) expect((await guess(target.email)).status).toBe(401);
  });
});

describe('many sign-ups from one client', () => {
  it('an invented X-Forwarded-For per sign-up does not lift the per-address limit', async () => {
    const app = createTestApp(inject('databaseUrl'), productionAuthLimits);
    try {
      const statuses: number[] = [];
      for (let i = 0; i < productionAuthLimits.signUpPerAddress.points + 4; i++) {
        const res = await supertest(app.app)
          .post('/api/auth/sign-up/email')
          .set('Origin', testOrigin)
          .set('X-Forwarded-For', `198.51.100.${i + 1}`)
          .send({ name: 'Many Signups', email: uniqueEmail('many'), password: testPassword });
        statuses.push(res.status);
      }
      const allowed = productionAuthLimits.signUpPerAddress.points;
      expect(statuses.slice(0, allowed).every((s) => s === 200)).toBe(true);
      expect(statuses.slice(allowed).every((s) => s === 429)).toBe(true);
    } finally {
      await app.close();
    }
  });

  it('behind a configured proxy, the client it names is the one counted', async () => {
    const { createApp } = await import('@/server/app');
    const proxied = createApp({
      db: guarded.db,
      auth: guarded.auth,
      broadcast: noBroadcast,
      origin: testOrigin,
      trustProxy: 'loopback',
      authLimits: productionAuthLimits,
    });
    const allowed = productionAuthLimits.signUpPerAddress.points;
    const send = (forwardedFor: string) =>
      supertest(proxied)
        .post('/api/auth/sign-up/email')
        .set('Origin', testOrigin)
        .set('X-Forwarded-For', forwardedFor)
        .send({ name: 'Behind Proxy', email: uniqueEmail('proxied'), password: testPassword });
    for (let i = 0; i < allowed; i++) expect((await send('192.0.2.10')).status).toBe(200);
    expect((await send('192.0.2.10')).status).toBe(429);
    // Another client behind the same proxy has its own allowance.
    expect((await send('192.0.2.11')).status).toBe(200);
  });
});
