import { eq } from 'drizzle-orm';
import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';

import type { Database } from '@/db/client';
import { member, review } from '@/db/schema';
import { migrateDatabase } from '@/server/ops/migrate';
import { ensureCluster, ensureDatabase } from '@/server/ops/postgres';
import { demoPassword, demoReviews, demoUsers, isEmpty, seedDemo } from '@/server/ops/seed';

import { createTestApp, testOrigin } from '../helpers/api';

let ctx: ReturnType<typeof createTestApp>;
let db: Database;

beforeAll(async () => {
  // A database of its own: the demo data never mixes with other tests' rows.
  const url = await ensureDatabase(await ensureCluster(), `cyclemoot_${inject('runId')}_seed`, { fresh: true });
  await migrateDatabase(url);
  ctx = createTestApp(url);
  db = ctx.db;
});
afterAll(() => ctx.close());

describe('demo data', () => {
  it('seeds one team with one member per role and two reviews, only into an empty database', async () => {
    expect(await isEmpty(db)).toBe(true);
    const { teamId } = await seedDemo(db);
    expect(await isEmpty(db)).toBe(false);
    const roles = (await db.select().from(member).where(eq(member.organizationId, teamId))).map((m) => m.role).sort();
    expect(roles).toEqual(['engineer', 'lead', 'observer', 'owner', 'reviewer']);
    const names = (await db.select().from(review).where(eq(review.teamId, teamId))).map((r) => r.name).sort();
    expect(names).toEqual(demoReviews.map((r) => r.name).sort());
  });

  it('lets every documented demo user sign in with the documented password', async () => {
    for (const u of demoUsers) {
      const agent = supertest.agent(ctx.app).set('Origin', testOrigin);
      const res = await agent.post('/api/auth/sign-in/email').send({ email: u.email, password: demoPassword });
      expect(res.status, u.email).toBe(200);
      const me = await agent.get('/api/me');
      expect(me.body.teams[0].role).toBe(u.role);
    }
  });
});
