import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import type { Criterion, Round } from '@/server/contracts/board';
import type { Matrix } from '@/server/contracts/matrix';
import { buildMatrix, preScores, type MatrixInputs } from '@/server/services/matrix';

import { createTestApp } from '../helpers/api';
import { expectClose } from '../helpers/expect-close';
import { scoringTeam, type ScoringTeam } from './fixtures/scoring';

const crit = (id: string, weight: number, measure: Criterion['measure'] = null): Criterion => ({
  id,
  name: id[0]!.toUpperCase() + id.slice(1),
  weight,
  measure,
});
const cand = (id: string, results: Record<string, number> | null) => ({
  id,
  name: `Candidate ${id}`,
  colour: '#000000',
  status: 'proposed' as const,
  results,
});
const inputs = (over: Partial<MatrixInputs>): MatrixInputs => ({
  reviewId: 'r',
  reviewName: 'R',
  basisRevision: 1,
  criteria: [],
  candidates: [],
  scores: [],
  rounds: [],
  ...over,
});
const mark = (userId: string, candidateId: string, criterionId: string, score: number) => ({
  userId,
  candidateId,
  criterionId,
  score,
});

describe('pre-scores of measured criteria', () => {
  const three = [
    cand('a', { thermalEfficiency: 0.3, co2KgPerMWh: 600, netWorkKJPerKg: 300 }),
    cand('b', { thermalEfficiency: 0.35, co2KgPerMWh: 500, netWorkKJPerKg: 450 }),
    cand('c', { thermalEfficiency: 0.4, co2KgPerMWh: 400, netWorkKJPerKg: 350 }),
  ];

  it('are linear between the worst (1) and the best (5) candidate', () => {
    const eff = preScores(crit('efficiency', 1, 'thermalEfficiency'), three);
    expect([eff.a, eff.c]).toEqual([1, 5]);
    expectClose(eff.b!, 3, { abs: 1e-12 }, 'value'); // 0.35 lies halfway
    // Specific work: highest best, 300 → 1, 450 → 5, 350 → 1 + 4 × 50/150.
    const work = preScores(crit('work', 1, 'netWorkKJPerKg'), three);
    expect(work.a).toBe(1);
    expect(work.b).toBe(5);
    expectClose(work.c!, 1 + 4 / 3, { abs: 1e-12 }, 'value');
  });

  it('take the lowest CO2 as best', () => {
    const co2 = preScores(crit('co2', 1, 'co2KgPerMWh'), three);
    expect([co2.a, co2.c]).toEqual([1, 5]);
    expectClose(co2.b!, 3, { abs: 1e-12 }, 'CO2 pre-score halfway');
  });

  it('leave out a candidate without results and need two different values', () => {
    const withRefused = [...three, cand('d', null)];
    expect(preScores(crit('efficiency', 1, 'thermalEfficiency'), withRefused).d).toBeNull();
    expect(preScores(crit('efficiency', 1, 'thermalEfficiency'), [three[0]!, cand('d', null)])).toEqual({
      a: null,
      d: null,
    });
    const equal = [cand('a', { thermalEfficiency: 0.3 }), cand('b', { thermalEfficiency: 0.3 })];
    expect(preScores(crit('efficiency', 1, 'thermalEfficiency'), equal)).toEqual({ a: null, b: null });
    expect(preScores(crit('complexity', 1), three)).toEqual({ a: null, b: null, c: null });
  });
});

describe('buildMatrix', () => {
  it('takes a scorer’s own mark on a measured criterion, else the pre-score', () => {
    const m = buildMatrix(
      inputs({
        criteria: [crit('efficiency', 50, 'thermalEfficiency'), crit('complexity', 50)],
        candidates: [cand('a', { thermalEfficiency: 0.3 }), cand('b', { thermalEfficiency: 0.4 })],
        scores: [
          mark('u1', 'a', 'complexity', 4),
          mark('u2', 'a', 'complexity', 2),
          // u2 overrides a's pre-score of 1 with a 3.
          mark('u2', 'a', 'efficiency', 3),
        ],
      }),
    );
    const eff = m.rows[0]!.cells;
    expect(eff.a).toEqual({ value: 2, mean: 2, min: 1, max: 3, count: 2, preScore: 1, overrides: 1 });
    expect(eff.b).toEqual({ value: 5, mean: 5, min: 5, max: 5, count: 2, preScore: 5, overrides: 0 });
    expect(m.rows[1]!.cells.a).toMatchObject({ mean: 3, min: 2, max: 4, count: 2 });
    expect(m.scorers).toBe(2);
  });

  it('with nobody scoring, a measured criterion stands on its pre-score alone', () => {
    const m = buildMatrix(
      inputs({
        criteria: [crit('efficiency', 1, 'thermalEfficiency')],
        candidates: [cand('a', { thermalEfficiency: 0.3 }), cand('b', { thermalEfficiency: 0.4 })],
      }),
    );
    expect(m.rows[0]!.cells.b).toEqual({ value: 5, mean: 5, min: 5, max: 5, count: 0, preScore: 5, overrides: 0 });
    expect(m.totals.a).toEqual({ total: 1, incomplete: false, missing: [] });
    expect(m.ranks).toEqual({ a: 2, b: 1 });
  });

  it('shows a missing score as missing: the total is over the scored criteria, flagged incomplete', () => {
    const m = buildMatrix(
      inputs({
        criteria: [crit('complexity', 30), crit('maintainability', 10), crit('cost', 60)],
        candidates: [cand('a', null), cand('b', null)],
        scores: [
          mark('u1', 'a', 'complexity', 5),
          mark('u1', 'a', 'maintainability', 1),
          mark('u1', 'b', 'complexity', 2),
          mark('u1', 'b', 'maintainability', 2),
          mark('u1', 'b', 'cost', 2),
        ],
      }),
    );
    expect(m.rows[2]!.cells.a).toMatchObject({ value: null, mean: null, count: 0 });
    // Over complexity and maintainability only (weights 30 and 10 renormalised), not (… + 60 × 0) / 100.
    expectClose(m.totals.a!.total!, (30 * 5 + 10 * 1) / 40, { abs: 1e-12 }, 'value');
    expect(m.totals.a).toMatchObject({ incomplete: true, missing: ['cost'] });
    expect(m.totals.b).toEqual({ total: 2, incomplete: false, missing: [] });
    expect(m.ranks).toEqual({ a: 1, b: 2 });
  });

  it('gives no total and no rank to a candidate nobody scored', () => {
    const m = buildMatrix(
      inputs({
        criteria: [crit('complexity', 1)],
        candidates: [cand('a', null), cand('b', null)],
        scores: [mark('u1', 'a', 'complexity', 3)],
      }),
    );
    expect(m.totals.b).toEqual({ total: null, incomplete: true, missing: ['complexity'] });
    expect(m.ranks).toEqual({ a: 1, b: null });
  });

  it('shows ties as ties: equal totals share a rank and the next rank skips', () => {
    const m = buildMatrix(
      inputs({
        criteria: [crit('complexity', 1), crit('cost', 1)],
        candidates: [cand('a', null), cand('b', null), cand('c', null), cand('d', null)],
        scores: [
          mark('u1', 'a', 'complexity', 4),
          mark('u1', 'a', 'cost', 2),
          mark('u1', 'b', 'complexity', 2),
          mark('u1', 'b', 'cost', 4),
          mark('u1', 'c', 'complexity', 1),
          mark('u1', 'c', 'cost', 1),
          mark('u1', 'd', 'complexity', 5),
          mark('u1', 'd', 'cost', 5),
        ],
      }),
    );
    expect(m.ranks).toEqual({ d: 1, a: 2, b: 2, c: 4 });
  });

  it('re-ranks when the weights change', () => {
    const base = {
      candidates: [cand('a', null), cand('b', null)],
      scores: [
        mark('u1', 'a', 'complexity', 5),
        mark('u1', 'a', 'cost', 1),
        mark('u1', 'b', 'complexity', 1),
        mark('u1', 'b', 'cost', 4),
      ],
    };
    const before = buildMatrix(inputs({ ...base, criteria: [crit('complexity', 70), crit('cost', 30)] }));
    const after = buildMatrix(inputs({ ...base, criteria: [crit('complexity', 20), crit('cost', 80)] }));
    expect(before.ranks).toEqual({ a: 1, b: 2 });
    expect(after.ranks).toEqual({ a: 2, b: 1 });
    expectClose(after.criteria[1]!.share, 0.8, { abs: 1e-12 }, 'value');
    // A criterion of weight 0 is shown but counts for nothing, and is never "missing".
    const zero = buildMatrix(inputs({ ...base, criteria: [crit('complexity', 1), crit('cost', 0), crit('extra', 0)] }));
    expect(zero.totals.a).toEqual({ total: 5, incomplete: false, missing: [] });
  });

  it('counts only the basis’s criteria and the review’s candidates', () => {
    const m = buildMatrix(
      inputs({
        criteria: [crit('complexity', 1)],
        candidates: [cand('a', null)],
        scores: [mark('u1', 'a', 'removed', 1), mark('u2', 'gone', 'complexity', 1), mark('u3', 'a', 'complexity', 4)],
      }),
    );
    expect(m.scorers).toBe(1);
    expect(m.rows[0]!.cells.a).toMatchObject({ mean: 4, count: 1 });
  });

  it('carries closed rounds and an open one that is not blind; never an open blind tally', () => {
    const round = (number: number, status: 'open' | 'closed', blind: boolean, tally: Record<string, number> | null) =>
      ({
        id: `r${number}`,
        number,
        status,
        blind,
        votesPerPerson: 3,
        tally,
        voters: 2,
        votedBy: null,
        myBallot: null,
        openedAt: '2026-01-01T00:00:00.000Z',
        closedAt: status === 'closed' ? '2026-01-01T01:00:00.000Z' : null,
      }) satisfies Round;
    const m = buildMatrix(
      inputs({
        candidates: [cand('a', null), cand('b', null)],
        rounds: [round(1, 'closed', true, { a: 2 }), round(2, 'open', true, null)],
      }),
    );
    expect(m.rounds).toEqual([
      {
        number: 1,
        status: 'closed',
        blind: true,
        votesPerPerson: 3,
        voters: 2,
        tally: { a: 2, b: 0 },
        closedAt: '2026-01-01T01:00:00.000Z',
      },
    ]);
    const open = buildMatrix(inputs({ candidates: [cand('a', null)], rounds: [round(1, 'open', false, { a: 1 })] }));
    expect(open.rounds.map((r) => r.status)).toEqual(['open']);
  });
});

describe('GET /api/reviews/:reviewId/matrix', () => {
  const ctx = createTestApp();
  let t: ScoringTeam;
  beforeAll(async () => {
    t = await scoringTeam(ctx, 'Matthijs');
  });
  afterAll(() => ctx.close());
  const get = async () => (await t.observer.agent.get(`/api/reviews/${t.reviewId}/matrix`).expect(200)).body as Matrix;

  it('shows the engine figures of each candidate with units, and pre-scores from them', async () => {
    const m = await get();
    expect(m.candidates.map((c) => c.id)).toEqual(t.candidates);
    const eff = m.figures.find((f) => f.key === 'thermalEfficiency')!;
    expect(eff.unit).toBe('%');
    for (const c of t.computed) {
      expectClose(eff.values[c.id]!, (c.results!.thermalEfficiency as number) * 100, { abs: 1e-12 }, 'value');
      const heatRate = m.figures.find((f) => f.key === 'heatRateKJPerKWh')!;
      expect(heatRate.unit).toBe('kJ/kWh');
      expect(heatRate.values[c.id]).toBe(c.results!.heatRateKJPerKWh);
    }
    const effRow = m.rows.find((r) => r.criterionId === 'efficiency')!;
    const pres = t.candidates.map((id) => effRow.cells[id]!.preScore!);
    expect(Math.min(...pres)).toBe(1);
    expect(Math.max(...pres)).toBe(5);
    expect(m.rules.preScore).toContain('5 = best of the candidates, 1 = worst, linear between');
  });

  it('re-ranks when the Lead changes the weights', async () => {
    const [a, b, c] = t.candidates;
    const scores = [
      { candidateId: a, criterionId: 'complexity', score: 5 },
      { candidateId: b, criterionId: 'complexity', score: 1 },
      { candidateId: c, criterionId: 'complexity', score: 1 },
      { candidateId: a, criterionId: 'maintainability', score: 5 },
      { candidateId: b, criterionId: 'maintainability', score: 1 },
      { candidateId: c, criterionId: 'maintainability', score: 1 },
      { candidateId: a, criterionId: 'first-cost', score: 5 },
      { candidateId: b, criterionId: 'first-cost', score: 1 },
      { candidateId: c, criterionId: 'first-cost', score: 1 },
    ];
    await t.engineer.agent.put(`/api/reviews/${t.reviewId}/scores`).send({ scores }).expect(200);
    const board = (await t.lead.agent.get(`/api/reviews/${t.reviewId}/board`).expect(200)).body;
    const { revision: _r, updatedAt: _u, criteria, ...core } = board.designBasis;
    const weigh = (judged: number, measured: number) =>
      t.lead.agent
        .put(`/api/reviews/${t.reviewId}/design-basis`)
        .send({
          ...core,
          criteria: criteria.map((x: Criterion) => ({ ...x, weight: x.measure ? measured : judged })),
        })
        .expect(200);
    await weigh(100, 0);
    let m = await get();
    expect(m.ranks[a!]).toBe(1);
    expect(m.ranks[b!]).toBe(2);
    expect(m.ranks[c!]).toBe(2); // equal totals share the rank
    await weigh(0, 100);
    m = await get();
    // Only the measured criteria count now: the ranks follow the pre-scores.
    const byTotal = [...t.candidates].sort((x, y) => m.totals[y]!.total! - m.totals[x]!.total!);
    expect(m.ranks[byTotal[0]!]).toBe(1);
    const effRow = m.rows.find((r) => r.criterionId === 'efficiency')!;
    for (const id of t.candidates) expect(effRow.cells[id]!.count).toBe(1);
  });
});
