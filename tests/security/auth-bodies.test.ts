import { request as httpRequest } from 'node:http';

import { eq } from 'drizzle-orm';
import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { user } from '@/db/schema';
import { authBodyLimitBytes } from '@/server/auth/gate';

import { createTestApp, signUp, testOrigin, testPassword } from '../helpers/api';
import { startTestServer, uniqueEmail } from '../helpers/test-server';

/**
 * Finding 3: better-auth read whatever body it was sent. An 80 MB password took 0.7 s and
 * 330 MB of server memory before it was refused, and a 20 MB profile image was stored.
 */

const ctx = createTestApp();
let server: Awaited<ReturnType<typeof startTestServer>>;

beforeAll(async () => {
  server = await startTestServer();
});
afterAll(async () => {
  await server.stop();
  await ctx.close();
});

/** Streams `bytes` of a JSON body to a real server, as fast as it takes them; resolves with the answer. */
function streamBody(path: string, bytes: number, { chunked = false } = {}) {
  return new Promise<{ status: number; body: string; sent: number }>((resolve, reject) => {
    const { port } = new URL(server.baseURL);
    const req = httpRequest({
      host: '127.0.0.1',
      port: Number(port),
      method: 'POST',
      path,
      headers: {
        'content-type': 'application/json',
        origin: server.baseURL,
        ...(chunked ? { 'transfer-encoding': 'chunked' } : { 'content-length': String(bytes) }),
      },
    });
    let sent = 0;
    let answered = false;
    req.on('response', (res) => {
      answered = true;
      let body = '';
      res.on('data', (d) => (body += d));
      res.on('end', () => resolve({ status: res.statusCode ?? 0, body, sent }));
    });
    req.on('error', (error) => (answered ? undefined : reject(error)));
    const head = `{"name":"Big Body","email":"${uniqueEmail('big')}","password":"`;
    const chunk = 'x'.repeat(64 * 1024);
    const pump = () => {
      if (answered) return req.destroy();
      if (sent === 0) {
        sent += head.length;
        req.write(head);
      }
      while (sent < bytes - 2) {
        const piece = chunk.slice(0, Math.min(chunk.length, bytes - 2 - sent));
        sent += piece.length;
        if (!req.write(piece)) return void req.once('drain', pump);
        if (answered) return req.destroy();
      }
      req.end('"}');
    };
    pump();
  });
}

describe('oversized bodies on the sign-in routes', () => {
  it('an 80 MB password is refused with 413 before it is read, without the server’s memory growing', async () => {
    const before = process.memoryUsage().rss;
    const started = performance.now();
    const res = await streamBody('/api/auth/sign-up/email', 80 * 1024 * 1024);
    const ms = performance.now() - started;
    expect(res.status).toBe(413);
    expect(JSON.parse(res.body).error.code).toBe('body_too_large');
    expect(ms).toBeLessThan(5_000);
    // The server answered from the length alone: far less than the 80 MB went out.
    expect(res.sent).toBeLessThan(80 * 1024 * 1024);
    expect(process.memoryUsage().rss - before).toBeLessThan(64 * 1024 * 1024);
  });

  it('a chunked body without a length is cut off at the limit too', async () => {
    const res = await streamBody('/api/auth/sign-in/email', 8 * 1024 * 1024, { chunked: true });
    expect(res.status).toBe(413);
  });

  it('a body just under the limit is read and checked; a 129-character password is refused by field', async () => {
    const res = await supertest(ctx.app)
      .post('/api/auth/sign-up/email')
      .set('Origin', testOrigin)
      .send({ name: 'Long Password', email: uniqueEmail('long'), password: 'p'.repeat(129) });
    expect(res.status).toBe(422);
    expect(res.body.error.field).toBe('password');
    expect(authBodyLimitBytes).toBeLessThanOrEqual(64 * 1024);
  });
});

describe('storing a profile image through the sign-in routes', () => {
  it('a 20 MB image at sign-up is refused, and so is a small one: the product keeps no profile images', async () => {
    const email = uniqueEmail('picture');
    const huge = await supertest(ctx.app)
      .post('/api/auth/sign-up/email')
      .set('Origin', testOrigin)
      .send({ name: 'Pic Ture', email, password: testPassword, image: 'data:image/png;base64,' + 'A'.repeat(20e6) });
    expect(huge.status).toBe(413);
    const small = await supertest(ctx.app)
      .post('/api/auth/sign-up/email')
      .set('Origin', testOrigin)
      .send({ name: 'Pic Ture', email, password: testPassword, image: 'https://example.com/me.png' });
    expect(small.status).toBe(422);
    expect(small.body.error.field).toBe('image');
    expect(await ctx.db.select().from(user).where(eq(user.email, email))).toEqual([]);
  });

  it('the profile update route is not served', async () => {
    const person = await signUp(ctx.app, 'Up Date');
    const res = await person.agent
      .post('/api/auth/update-user')
      .send({ image: 'https://example.com/x.png', name: 'Y' });
    expect(res.status).toBe(404);
    const [row] = await ctx.db.select().from(user).where(eq(user.id, person.id));
    expect(row).toMatchObject({ name: 'Up Date', image: null });
  });
});
