import { randomUUID } from 'node:crypto';

import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { activity, robustnessRun } from '@/db/schema';
import { closeRobustness } from '@/server/services/robustness';

import { createTestApp, testOrigin, type TestUser } from '../helpers/api';
import { refusalsChangeNothing } from '../helpers/unchanged';
import { scoringTeam, type ScoringTeam } from '../server/fixtures/scoring';

/**
 * The robustness check as an attacker tries it: another Team's review and runs, a role
 * without the right (Observers and Reviewers start nothing; only the Lead and Owner cancel),
 * no session, another site's page, oversized and malformed bodies. Each refusal changes
 * nothing: no run row, no Activity line, no news.
 */

const ctx = createTestApp();
let t: ScoringTeam;
let them: ScoringTeam;
let theirRun: string;

beforeAll(async () => {
  t = await scoringTeam(ctx, 'Oona', ['simple', 'regenerative']);
  them = await scoringTeam(ctx, 'Mallory', ['simple', 'reheat']);
  // A long run of the other Team's, to try to read and cancel.
  const res = await them.lead.agent.post(`/api/reviews/${them.reviewId}/robustness`).send({ samples: 20000, seed: 3 });
  expect(res.status).toBe(202);
  theirRun = res.body.runId;
});
afterAll(async () => {
  await them.lead.agent.delete(`/api/reviews/${them.reviewId}/robustness/${theirRun}`);
  await closeRobustness(ctx.db);
  await ctx.close();
});

async function snapshot() {
  const [runs, lines] = await Promise.all([ctx.db.select().from(robustnessRun), ctx.db.select().from(activity)]);
  return JSON.stringify({
    runs: runs
      .map((r) => [r.id, r.reviewId, r.samples, r.seed, r.status.startsWith('cancel') ? 'cancel' : 'not cancelled'])
      .sort(),
    activity: lines.filter((l) => l.kind.startsWith('robustness:started')).length,
    news: ctx.sent.filter((s) => s.event === 'robustness:finished' && s.reviewId === t.reviewId).length,
  });
}

const expectUnchanged = refusalsChangeNothing(snapshot);

const start = (u: TestUser, reviewId = t.reviewId, body: unknown = { samples: 10, seed: 1 }) =>
  u.agent.post(`/api/reviews/${reviewId}/robustness`).send(body as object);

describe('another Team’s review and runs', () => {
  it('reading, starting and cancelling answer 404 for every role, and change nothing', async () => {
    for (const role of ['owner', 'lead', 'engineer', 'reviewer', 'observer'] as const) {
      const u = t[role];
      const read = await expectUnchanged(() => u.agent.get(`/api/reviews/${them.reviewId}/robustness`), 404);
      expect(read.body.error.message).toBe('The Review was not found.');
      await expectUnchanged(() => start(u, them.reviewId), 404, 'not_found');
      await expectUnchanged(
        () => u.agent.delete(`/api/reviews/${them.reviewId}/robustness/${theirRun}`),
        404,
        'not_found',
      );
    }
  });

  it('their run id under one’s own review is not found either', async () => {
    await expectUnchanged(() => t.lead.agent.delete(`/api/reviews/${t.reviewId}/robustness/${theirRun}`), 404);
    for (const id of ['not-a-uuid', randomUUID()])
      await expectUnchanged(
        () => t.lead.agent.delete(`/api/reviews/${t.reviewId}/robustness/${id}`),
        id === 'not-a-uuid' ? 422 : 404,
      );
  });
});

describe('a role without the right', () => {
  it('an Observer and a Reviewer may not start a run (403) but read it', async () => {
    await expectUnchanged(() => start(t.observer), 403, 'forbidden');
    await expectUnchanged(() => start(t.reviewer), 403, 'forbidden');
    expect((await t.observer.agent.get(`/api/reviews/${t.reviewId}/robustness`)).status).toBe(200);
  });

  it('an Engineer starts one; an Engineer, Reviewer or Observer may not cancel it; the Owner may', async () => {
    const run = await start(t.engineer, t.reviewId, { samples: 20000, seed: 9 });
    expect(run.status).toBe(202);
    const cancel = (u: TestUser) => u.agent.delete(`/api/reviews/${t.reviewId}/robustness/${run.body.runId}`);
    for (const u of [t.engineer, t.reviewer, t.observer]) await expectUnchanged(() => cancel(u), 403, 'forbidden');
    expect((await cancel(t.owner)).status).toBe(200);
  });
});

describe('no session and another site’s page', () => {
  it('no session: 401 on every route; a foreign or missing Origin on a write: 403', async () => {
    const anonymous = supertest.agent(ctx.app).set('Origin', testOrigin);
    await expectUnchanged(() => anonymous.get(`/api/reviews/${t.reviewId}/robustness`), 401, 'unauthorized');
    await expectUnchanged(
      () => anonymous.post(`/api/reviews/${t.reviewId}/robustness`).send({ samples: 10, seed: 1 }),
      401,
      'unauthorized',
    );
    for (const origin of ['https://evil.example', null]) {
      const req = supertest(ctx.app).post(`/api/reviews/${t.reviewId}/robustness`).set('Cookie', t.lead.cookie);
      if (origin) req.set('Origin', origin);
      await expectUnchanged(() => req.send({ samples: 10, seed: 1 }), 403, 'foreign_origin');
    }
  });
});

describe('oversized and malformed bodies', () => {
  it('a body over the limit is 413, broken JSON 400, a wrong shape 422 by field', async () => {
    await expectUnchanged(() => start(t.lead, t.reviewId, { samples: 10, seed: 1, pad: 'x'.repeat(300 * 1024) }), 413);
    await expectUnchanged(
      () =>
        t.lead.agent
          .post(`/api/reviews/${t.reviewId}/robustness`)
          .set('Content-Type', 'application/json')
          .send('{"samples": '),
      400,
      'malformed_json',
    );
    for (const [body, field] of [
      [[], null],
      [{ samples: '2000', seed: 1 }, 'samples'],
      [{ samples: 1e9, seed: 1 }, 'samples'],
      [{ samples: 10, seed: 2 ** 40 }, 'seed'],
      [{ samples: 10, seed: 1, uncertainty: { turbineInletK: 5 } }, 'uncertainty.compressorEfficiency'],
    ] as const) {
      const res = await expectUnchanged(() => start(t.lead, t.reviewId, body), 422);
      if (field) expect(res.body.error.field).toBe(field);
    }
  });
});
