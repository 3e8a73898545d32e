import { afterAll, describe, expect, it } from 'vitest';

import type { CandidatePreset, Criterion } from '@/server/contracts/board';
import { evaluateCycle, type CycleInput } from '@/server/engine';
import {
  defaultUncertainty,
  mergeChunks,
  runDraws,
  summarise,
  zeroUncertainty,
  type DrawCandidate,
} from '@/server/robustness/draws';
import { createRobustnessPool } from '@/server/robustness/pool';
import { engineInputOf, type BasisCore } from '@/server/services/design-basis';
import { buildMatrix } from '@/server/services/matrix';
import { defaultCriteria, defaultDesignBasis, presetParameters } from '@/server/services/presets';

/**
 * The robustness draws on their own and through the worker pool: the checks of the issue
 * (probabilities add to 1, no uncertainty gives the deterministic ranking of the matrix, a
 * candidate better on every criterion in every draw ranks first with probability 1, the same
 * seed gives the same result) and the pool's progress and cancel.
 */

const inputOf = (preset: CandidatePreset) =>
  engineInputOf(defaultDesignBasis as BasisCore, presetParameters[preset]) as unknown as CycleInput;

const judged = { complexity: [2, 4, 3], maintainability: [3, 3], 'first-cost': [4] };
const candidates: DrawCandidate[] = [
  {
    id: 'simple',
    input: inputOf('simple'),
    scores: { complexity: [5, 4], maintainability: [4], 'first-cost': [5, 5] },
  },
  { id: 'regenerative', input: inputOf('regenerative'), scores: judged },
  {
    id: 'irr',
    input: inputOf('intercooled-reheat-regenerative'),
    scores: { complexity: [1], maintainability: [1], 'first-cost': [1] },
  },
];
const criteria = defaultCriteria as Criterion[];

describe('the draws', () => {
  const task = { candidates, criteria, uncertainty: defaultUncertainty, seed: 42, from: 0, to: 400 };

  it('first-place probabilities add to 1, and each candidate’s rank shares add to 1', () => {
    const result = summarise(runDraws(task));
    const sum = Object.values(result.firstPlace).reduce((a, b) => a + b, 0);
    expect(sum).toBeCloseTo(1, 12);
    for (const shares of Object.values(result.ranks)) expect(shares.reduce((a, b) => a + b, 0)).toBeCloseTo(1, 12);
    // Uncertain enough that more than one candidate wins somewhere.
    expect(Object.values(result.firstPlace).filter((p) => p > 0).length).toBeGreaterThan(1);
    // Bands: 5 % below 95 %, around the design value.
    const design = evaluateCycle(candidates[0].input, { paths: false });
    const b = result.bands.simple.thermalEfficiency!;
    expect(b.p5).toBeLessThan(design.thermalEfficiency);
    expect(b.p95).toBeGreaterThan(design.thermalEfficiency);
  });

  it('the same seed gives the same result, however the draws are cut; another seed another', () => {
    const whole = summarise(runDraws(task));
    const cut = summarise(
      mergeChunks([
        runDraws({ ...task, to: 150 }),
        runDraws({ ...task, from: 150, to: 320 }),
        runDraws({ ...task, from: 320 }),
      ]),
    );
    expect(cut).toEqual(whole);
    expect(summarise(runDraws(task))).toEqual(whole);
    expect(summarise(runDraws({ ...task, seed: 43 }))).not.toEqual(whole);
  });

  it("with every uncertainty at zero gives the matrix's deterministic ranking", () => {
    const result = summarise(runDraws({ ...task, uncertainty: zeroUncertainty, to: 20 }));
    const matrix = buildMatrix({
      reviewId: 'r',
      reviewName: 'r',
      basisRevision: 1,
      criteria,
      candidates: candidates.map((c) => ({
        id: c.id,
        name: c.id,
        colour: '#000',
        status: 'proposed' as const,
        results: evaluateCycle(c.input, { paths: false }) as unknown as Record<string, unknown>,
      })),
      // Scores as one person each, so the matrix mean equals the draws' mean of own marks.
      scores: candidates.flatMap((c) =>
        Object.entries(c.scores).flatMap(([criterionId, marks]) =>
          marks.map((score, k) => ({ candidateId: c.id, criterionId, userId: `u${k}`, score })),
        ),
      ),
      rounds: [],
    });
    const ranks = matrix.ranks as Record<string, number | null>;
    for (const c of candidates) {
      const rank = ranks[c.id]!;
      expect(result.ranks[c.id][rank - 1]).toBe(1);
      expect(result.firstPlace[c.id]).toBe(rank === 1 ? 1 : 0);
    }
  });

  it('a candidate better on every criterion in every draw ranks first with probability 1', () => {
    const judgedOnly: Criterion[] = [
      { id: 'a', name: 'A', weight: 30, measure: null },
      { id: 'b', name: 'B', weight: 70, measure: null },
    ];
    const result = summarise(
      runDraws({
        ...task,
        criteria: judgedOnly,
        candidates: [
          { ...candidates[0], scores: { a: [5, 5], b: [5] } },
          { ...candidates[1], scores: { a: [4, 1], b: [3, 4] } },
          { ...candidates[2], scores: { a: [2], b: [4, 1] } },
        ],
      }),
    );
    expect(result.firstPlace.simple).toBe(1);
    expect(result.ranks.simple[0]).toBe(1);
  });
});

describe('the worker pool', () => {
  const pool = createRobustnessPool(2);
  afterAll(() => pool.close());

  it('runs the draws off the thread, reports progress, and equals the draws run here', async () => {
    const progress: number[] = [];
    const base = { candidates, criteria, uncertainty: defaultUncertainty, seed: 7 };
    const result = await pool.run(base, 600, { onProgress: (done) => progress.push(done) });
    expect(progress.at(-1)).toBe(600);
    expect(progress.length).toBe(3);
    expect(result).toEqual(summarise(runDraws({ ...base, from: 0, to: 600 })));
  }, 60_000);

  it('stops when cancelled', async () => {
    const controller = new AbortController();
    const running = pool.run({ candidates, criteria, uncertainty: defaultUncertainty, seed: 8 }, 20_000, {
      signal: controller.signal,
      onProgress: () => controller.abort(),
    });
    await expect(running).rejects.toThrow(/abort/i);
  }, 60_000);
});
