import { eq } from 'drizzle-orm';
import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { review, user } from '@/db/schema';

import { createTeam, createTestApp, signUp, testOrigin, testPassword, type TestUser } from '../helpers/api';
import { uniqueEmail } from '../helpers/test-server';

/**
 * Finding 10: a NUL or a lone surrogate in a Review's name reached Postgres and came back
 * as a 500, and the sign-up name had no length limit (200 000 characters were stored).
 * One schema helper for all product text refuses them with a 422 naming the field.
 */

const ctx = createTestApp();
let lead: TestUser;
let teamId: string;

beforeAll(async () => {
  lead = await signUp(ctx.app, 'Text Lead');
  teamId = await createTeam(ctx, lead);
});
afterAll(() => ctx.close());

const reviewCount = async () => (await ctx.db.select().from(review).where(eq(review.teamId, teamId))).length;

describe('text the database cannot hold', () => {
  const bad: Array<[string, Record<string, string>, string]> = [
    ['a NUL in a Review name', { name: 'Peaker\u0000choice' }, 'name'],
    ['a lone high surrogate in a Review name', { name: 'Peaker \uD83D choice' }, 'name'],
    ['a lone low surrogate in a Review summary', { name: 'Peaker choice', summary: 'ok \uDE00' }, 'summary'],
    ['a NUL in a Review summary', { name: 'Peaker choice', summary: 'line\u0000' }, 'summary'],
    ['a control character in a Review name', { name: 'Peaker\u0007choice' }, 'name'],
    ['a line break in a Review name', { name: 'Peaker\nchoice' }, 'name'],
  ];
  for (const [what, body, field] of bad) {
    it(`refuses ${what} with 422 naming ${field}`, async () => {
      const before = await reviewCount();
      const res = await lead.agent.post(`/api/teams/${teamId}/reviews`).send(body);
      expect(res.status).toBe(422);
      expect(res.body.error.field).toBe(field);
      expect(await reviewCount()).toBe(before);
    });
  }

  it('keeps emoji (a surrogate pair) and line breaks in a summary', async () => {
    const res = await lead.agent
      .post(`/api/teams/${teamId}/reviews`)
      .send({ name: 'Peaker 🔥 choice', summary: 'First line\nsecond line' });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ name: 'Peaker 🔥 choice', summary: 'First line\nsecond line' });
  });

  it('refuses the same in a rename', async () => {
    const created = await lead.agent.post(`/api/teams/${teamId}/reviews`).send({ name: 'Rename me' });
    const id = created.body.id as string;
    const res = await lead.agent.patch(`/api/reviews/${id}`).send({ name: 'Bad\u0000name' });
    expect(res.status).toBe(422);
    expect(res.body.error.field).toBe('name');
  });
});

describe('the name given at sign-up', () => {
  const signUpWith = (name: string) =>
    supertest(ctx.app)
      .post('/api/auth/sign-up/email')
      .set('Origin', testOrigin)
      .send({ name, email: uniqueEmail('named'), password: testPassword });

  it('refuses 200 000 characters before reading them (413), and 81 by field (422)', async () => {
    expect((await signUpWith('n'.repeat(200_000))).status).toBe(413);
    const res = await signUpWith('n'.repeat(81));
    expect(res.status).toBe(422);
    expect(res.body.error).toMatchObject({ field: 'name', message: expect.stringContaining('at most 80') });
  });

  it('refuses a NUL, a lone surrogate and an empty name, storing no account', async () => {
    for (const name of ['Ann\u0000a', 'Ann\uDC00a', '   ']) {
      const email = uniqueEmail('bad-name');
      const res = await supertest(ctx.app)
        .post('/api/auth/sign-up/email')
        .set('Origin', testOrigin)
        .send({ name, email, password: testPassword });
      expect(res.status, JSON.stringify(name)).toBe(422);
      expect(res.body.error.field).toBe('name');
      expect(await ctx.db.select().from(user).where(eq(user.email, email))).toEqual([]);
    }
  });
});
