import { randomUUID } from 'node:crypto';

import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { activity, score } from '@/db/schema';

import { createTestApp, testOrigin, type TestUser } from '../helpers/api';
import { refusalsChangeNothing } from '../helpers/unchanged';
import { scoringTeam, type ScoringTeam } from '../server/fixtures/scoring';

/**
 * Scores, the comparison matrix and its downloads as an attacker tries them: another Team's
 * ids, a role without the right, no session, another site's page, bodies too large or
 * malformed, scores out of range, criteria and candidates that are not this review's. Each
 * refusal is checked to have changed nothing (no score, no Activity line, no news).
 */

const ctx = createTestApp();
let t: ScoringTeam;
let them: ScoringTeam;

beforeAll(async () => {
  t = await scoringTeam(ctx, 'Brigid', ['simple', 'regenerative']);
  them = await scoringTeam(ctx, 'Mallory', ['simple', 'reheat']);
  await them.engineer.agent
    .put(`/api/reviews/${them.reviewId}/scores`)
    .send({ scores: [{ candidateId: them.candidates[0], criterionId: 'complexity', score: 4 }] })
    .expect(200);
});
afterAll(() => ctx.close());

async function snapshot() {
  const [scores, lines] = await Promise.all([ctx.db.select().from(score), ctx.db.select().from(activity)]);
  return JSON.stringify({
    scores: scores.map((s) => [s.candidateId, s.criterionId, s.userId, s.score, s.reason]).sort(),
    activity: lines.length,
    news: ctx.sent.filter((s) => s.event === 'score:changed').length,
  });
}

const expectUnchanged = refusalsChangeNothing(snapshot);

type Call = { what: string; run: (u: TestUser) => Promise<{ status: number; body: any }> };

function callsOn(reviewId: string, candidateId: string): Call[] {
  const r = `/api/reviews/${reviewId}`;
  return [
    { what: 'read scores', run: (u) => u.agent.get(`${r}/scores`) },
    {
      what: 'put scores',
      run: (u) => u.agent.put(`${r}/scores`).send({ scores: [{ candidateId, criterionId: 'complexity', score: 1 }] }),
    },
    { what: 'read the matrix', run: (u) => u.agent.get(`${r}/matrix`) },
    { what: 'download CSV', run: (u) => u.agent.get(`${r}/matrix.csv`) },
    { what: 'download XLSX', run: (u) => u.agent.get(`${r}/matrix.xlsx`) },
  ];
}

const put = (u: TestUser, body: unknown) => u.agent.put(`/api/reviews/${t.reviewId}/scores`).send(body as object);

describe('another Team’s ids', () => {
  it('every route answers 404 for a review of another Team, for each role, and changes nothing', async () => {
    for (const role of ['owner', 'lead', 'engineer', 'reviewer', 'observer'] as const) {
      for (const call of callsOn(them.reviewId, them.candidates[0]!)) {
        const res = await expectUnchanged(() => call.run(t[role]), 404, 'not_found');
        expect(res.body.error.message, `${role}: ${call.what}`).toBe('The Review was not found.');
      }
    }
  });

  it('unknown and malformed review ids are not found', async () => {
    for (const id of ['not-a-uuid', randomUUID(), "1' or '1'='1"]) {
      await expectUnchanged(() => t.lead.agent.get(`/api/reviews/${encodeURIComponent(id)}/matrix.csv`), 404);
      await expectUnchanged(
        () =>
          t.lead.agent
            .put(`/api/reviews/${encodeURIComponent(id)}/scores`)
            .send({ scores: [{ candidateId: t.candidates[0], criterionId: 'complexity', score: 2 }] }),
        404,
      );
    }
  });

  it('a candidate of another review is refused at its field (422), in one’s own review', async () => {
    const res = await expectUnchanged(
      () =>
        put(t.engineer, {
          scores: [
            { candidateId: t.candidates[0], criterionId: 'complexity', score: 2 },
            { candidateId: them.candidates[0], criterionId: 'complexity', score: 5 },
          ],
        }),
      422,
      'invalid_input',
    );
    expect(res.body.error.field).toBe('scores.1.candidateId');
    expect(res.body.error.message).toContain('not a candidate of this Review');
  });

  it('another Team’s scores never show in one’s own review', async () => {
    const mine = await t.lead.agent.get(`/api/reviews/${t.reviewId}/scores`).expect(200);
    expect(mine.body.everyone.some((s: { userId: string }) => s.userId === them.engineer.id)).toBe(false);
  });
});

describe('a role without the right', () => {
  const body = () => ({ scores: [{ candidateId: t.candidates[0], criterionId: 'complexity', score: 3 }] });

  it('an Observer and an Owner may not score (403) but read the scores, the matrix and the downloads', async () => {
    await expectUnchanged(() => put(t.observer, body()), 403, 'forbidden');
    await expectUnchanged(() => put(t.owner, body()), 403, 'forbidden');
    for (const call of callsOn(t.reviewId, t.candidates[0]!).filter((c) => c.what !== 'put scores')) {
      expect((await call.run(t.observer)).status, call.what).toBe(200);
    }
  });

  it('the roles that may, can (so the refusals above are about the role)', async () => {
    for (const who of [t.lead, t.engineer, t.reviewer]) expect((await put(who, body())).status).toBe(200);
  });
});

describe('no session', () => {
  it('every route answers 401 and changes nothing', async () => {
    const anonymous = { agent: supertest.agent(ctx.app).set('Origin', testOrigin) } as unknown as TestUser;
    for (const call of callsOn(t.reviewId, t.candidates[0]!)) {
      await expectUnchanged(() => call.run(anonymous), 401, 'unauthorized');
    }
  });
});

describe('another site’s page', () => {
  it('a PUT with the session cookie and a foreign Origin is refused (403) and changes nothing', async () => {
    await expectUnchanged(
      () =>
        supertest(ctx.app)
          .put(`/api/reviews/${t.reviewId}/scores`)
          .set('Cookie', t.engineer.cookie)
          .set('Origin', 'https://evil.example')
          .send({ scores: [{ candidateId: t.candidates[0], criterionId: 'complexity', score: 1 }] }),
      403,
      'foreign_origin',
    );
    // Without any Origin, a cookie-bearing write is refused too.
    await expectUnchanged(
      () =>
        supertest(ctx.app)
          .put(`/api/reviews/${t.reviewId}/scores`)
          .set('Cookie', t.engineer.cookie)
          .send({ scores: [{ candidateId: t.candidates[0], criterionId: 'complexity', score: 1 }] }),
      403,
      'foreign_origin',
    );
  });
});

describe('oversized and malformed bodies', () => {
  it('a body over the limit is 413, broken JSON 400', async () => {
    const reason = 'x'.repeat(300 * 1024);
    await expectUnchanged(
      () =>
        put(t.engineer, { scores: [{ candidateId: t.candidates[0], criterionId: 'complexity', score: 2, reason }] }),
      413,
      'body_too_large',
    );
    await expectUnchanged(
      () =>
        t.engineer.agent
          .put(`/api/reviews/${t.reviewId}/scores`)
          .set('Content-Type', 'application/json')
          .send('{"scores": ['),
      400,
      'malformed_json',
    );
  });

  const bodies = (candidateId = ''): Array<[string, unknown, string]> => {
    const c = () => candidateId;
    return [
      ['score 0', { scores: [{ candidateId: c(), criterionId: 'complexity', score: 0 }] }, 'scores.0.score'],
      ['score 6', { scores: [{ candidateId: c(), criterionId: 'complexity', score: 6 }] }, 'scores.0.score'],
      ['score 2.5', { scores: [{ candidateId: c(), criterionId: 'complexity', score: 2.5 }] }, 'scores.0.score'],
      ['score "3"', { scores: [{ candidateId: c(), criterionId: 'complexity', score: '3' }] }, 'scores.0.score'],
      ['no score', { scores: [{ candidateId: c(), criterionId: 'complexity' }] }, 'scores.0.score'],
      [
        'a criterion not in the basis',
        {
          scores: [
            { candidateId: c(), criterionId: 'complexity', score: 2 },
            { candidateId: c(), criterionId: 'noise', score: 2 },
          ],
        },
        'scores.1.criterionId',
      ],
      [
        'a 201-character reason',
        { scores: [{ candidateId: c(), criterionId: 'complexity', score: 2, reason: 'r'.repeat(201) }] },
        'scores.0.reason',
      ],
      [
        'a reason of two lines',
        { scores: [{ candidateId: c(), criterionId: 'complexity', score: 2, reason: 'one\ntwo' }] },
        'scores.0.reason',
      ],
      [
        'the same pair twice',
        {
          scores: [
            { candidateId: c(), criterionId: 'complexity', score: 2 },
            { candidateId: c(), criterionId: 'complexity', score: 3 },
          ],
        },
        'scores.1.criterionId',
      ],
      [
        'someone else’s userId',
        { scores: [{ candidateId: c(), criterionId: 'complexity', score: 2, userId: 'x' }] },
        'scores.0.userId',
      ],
      ['an extra field', { scores: [], as: 'lead' }, 'scores'],
      ['no scores', { scores: [] }, 'scores'],
      ['scores not a list', { scores: { a: 1 } }, 'scores'],
      [
        '201 entries',
        {
          scores: Array.from({ length: 201 }, (_, i) => ({ candidateId: c(), criterionId: `k${i}`, score: 1 })),
        },
        'scores',
      ],
      ['a list body', [1, 2], '(body)'],
    ];
  };

  it.each(bodies().map(([what], i) => [what, i] as const))(
    '%s is 422 naming its field, nothing stored',
    async (_what, i) => {
      const [, body, field] = bodies(t.candidates[0])[i]!;
      const res = await expectUnchanged(() => put(t.engineer, body), 422, 'invalid_input');
      expect(res.body.error.field).toBe(field);
      expect(typeof res.body.error.message).toBe('string');
    },
  );

  it('an override of a pre-scored criterion without a reason is refused, with one it is taken', async () => {
    const res = await expectUnchanged(
      () =>
        put(t.engineer, { scores: [{ candidateId: t.candidates[0], criterionId: 'co2', score: 4, reason: '   ' }] }),
      422,
      'invalid_input',
    );
    expect(res.body.error.field).toBe('scores.0.reason');
    expect(
      (
        await put(t.engineer, {
          scores: [{ candidateId: t.candidates[0], criterionId: 'co2', score: 4, reason: 'carbon capture planned' }],
        })
      ).status,
    ).toBe(200);
  });
});
