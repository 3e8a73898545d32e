import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';

import { candidate, comment, review, user } from '@/db/schema';
import type { TeamRole } from '@/server/contracts/roles';
import { migrateDatabase } from '@/server/ops/migrate';
import { ensureCluster, ensureDatabase } from '@/server/ops/postgres';
import { demoReviews, demoUsers, seedDemo } from '@/server/ops/seed';
import { commentCounts } from '@/server/services/comments';
import { currentRound } from '@/server/services/rounds';

import { createTestApp } from '../helpers/api';

let ctx: ReturnType<typeof createTestApp>;

beforeAll(async () => {
  // A database of its own: the demo people's fixed addresses never meet other tests' rows.
  const url = await ensureDatabase(await ensureCluster(), `cyclemoot_${inject('runId')}_discussion`, { fresh: true });
  await migrateDatabase(url);
  ctx = createTestApp(url);
});
afterAll(() => ctx.close());

const presets = ['simple', 'regenerative', 'intercooled', 'reheat', 'intercooled-reheat-regenerative'] as const;

describe('the demo discussion', () => {
  it('gives the first demo review one closed round with votes and a few comments, with a reply and mentions', async () => {
    await seedDemo(ctx.db);
    const [first] = await ctx.db.select().from(review).where(eq(review.name, demoReviews[0].name));
    // The board's candidates, one per preset, as seedDemo's board step made them.
    const made = await ctx.db
      .select({ id: candidate.id, preset: candidate.preset })
      .from(candidate)
      .where(eq(candidate.reviewId, first.id));
    expect(made.map((c) => c.preset).sort()).toEqual([...presets].sort());
    const people = await ctx.db.select().from(user);
    const ids = Object.fromEntries(
      demoUsers.map((u) => [u.role, people.find((p) => p.email === u.email)!.id]),
    ) as Record<TeamRole, string>;

    const round = await currentRound(ctx.db, first.id, { userId: ids.lead, role: 'lead' });
    const by = (preset: string) => made.find((c) => c.preset === preset)!.id;
    expect(round).toMatchObject({ number: 1, status: 'closed', voters: 3, blind: false });
    expect(round!.tally).toEqual({
      [by('simple')]: 3,
      [by('regenerative')]: 5,
      [by('intercooled')]: 1,
      [by('reheat')]: 0,
      [by('intercooled-reheat-regenerative')]: 0,
    });
    const comments = await ctx.db.select().from(comment).where(eq(comment.reviewId, first.id));
    expect(comments).toHaveLength(5);
    expect(comments.filter((c) => c.parentId !== null)).toHaveLength(2);
    expect(comments.flatMap((c) => c.mentions).sort()).toEqual([ids.engineer, ids.lead].sort());
    expect(await commentCounts(ctx.db, first.id)).toEqual({
      review: 2,
      [by('simple')]: 1,
      [by('intercooled')]: 2,
    });
  });
});
