import { and, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';

import { candidate, review, user } from '@/db/schema';
import { migrateDatabase } from '@/server/ops/migrate';
import { ensureCluster, ensureDatabase } from '@/server/ops/postgres';
import { demoReviews, demoUsers, seedDemo } from '@/server/ops/seed';
import { matrixOf } from '@/server/services/matrix';

import { createTestApp } from '../helpers/api';

/** The demo's first review opens onto a populated comparison matrix (what seedDemoScores wrote). */

let ctx: ReturnType<typeof createTestApp>;

beforeAll(async () => {
  const url = await ensureDatabase(await ensureCluster(), `cyclemoot_${inject('runId')}_seed_scores`, { fresh: true });
  await migrateDatabase(url);
  ctx = createTestApp(url);
});
afterAll(() => ctx.close());

describe('the demo matrix', () => {
  it('has three people’s scores, one override with its reason, ranks, and one incomplete candidate', async () => {
    const { teamId } = await seedDemo(ctx.db);
    const [first] = await ctx.db
      .select()
      .from(review)
      .where(and(eq(review.teamId, teamId), eq(review.name, demoReviews[0].name)));
    const [lead] = await ctx.db
      .select()
      .from(user)
      .where(eq(user.email, demoUsers.find((u) => u.role === 'lead')!.email));
    const m = await matrixOf(ctx.db, first!.id, lead!.id);
    expect(m.candidates).toHaveLength(5);
    expect(m.scorers).toBe(3);
    const [regenerative] = await ctx.db
      .select()
      .from(candidate)
      .where(and(eq(candidate.reviewId, first!.id), eq(candidate.preset, 'regenerative')));
    const [combined] = await ctx.db
      .select()
      .from(candidate)
      .where(and(eq(candidate.reviewId, first!.id), eq(candidate.preset, 'intercooled-reheat-regenerative')));
    const efficiency = m.rows.find((r) => r.criterionId === 'efficiency')!;
    expect(efficiency.cells[regenerative!.id]).toMatchObject({ overrides: 1, count: 3 });
    expect(m.totals[combined!.id]).toMatchObject({ incomplete: true, missing: ['first-cost'] });
    for (const c of m.candidates) expect(m.ranks[c.id], c.name).not.toBeNull();
    expect(m.rounds).toHaveLength(1);
  });
});
