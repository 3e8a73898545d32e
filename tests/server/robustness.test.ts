import { getDocument } from 'pdfjs-dist/legacy/build/pdf.mjs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { evaluateRequestSchema } from '@/server/contracts/cycle';
import { measuredBest } from '@/server/contracts/matrix';
import { defaultUncertainty, type Robustness, type Uncertainty } from '@/server/contracts/robustness';
import { evaluateCycle } from '@/server/engine';
import { engineInputOf } from '@/server/services/design-basis';
import { defaultDesignBasis, presetParameters } from '@/server/services/presets';
import { closeRobustness, merge } from '@/server/services/robustness';
import { runDraws, type DrawJob } from '@/server/services/robustness/draws';

import { createTestApp } from '../helpers/api';
import { scoringTeam, type ScoringTeam } from './fixtures/scoring';

/**
 * The robustness check: the draws' arithmetic against the checks the issue names (the
 * probabilities add to 1; no uncertainty gives the deterministic ranking; a candidate better
 * everywhere always ranks first; the same seed, the same result, however the draws are split),
 * then the routes: start, progress, result, out of date, one run at a time, cancel.
 */

const zero: Uncertainty = {
  compressorEfficiency: 0,
  turbineEfficiency: 0,
  regeneratorEffectiveness: 0,
  pressureLossFraction: 0,
  turbineInletK: 0,
  ambientFromProfile: false,
  ambientK: 0,
  weightFactor: 0,
  scoreSpread: false,
};

const inputOf = (preset: keyof typeof presetParameters, tweak: (p: Record<string, any>) => void = () => {}) => {
  const params = structuredClone(presetParameters[preset]) as Record<string, any>;
  tweak(params);
  return evaluateRequestSchema.parse(engineInputOf(defaultDesignBasis as never, params as never));
};

const job = (over: Partial<DrawJob>): DrawJob => ({
  seed: 7,
  from: 0,
  to: 400,
  candidates: [
    { id: 'simple', input: inputOf('simple'), ownIntercoolTemperature: false, yearFuelTonnes: null },
    { id: 'regen', input: inputOf('regenerative'), ownIntercoolTemperature: false, yearFuelTonnes: null },
    {
      id: 'icrr',
      input: inputOf('intercooled-reheat-regenerative'),
      ownIntercoolTemperature: false,
      yearFuelTonnes: null,
    },
  ],
  criteria: [
    { id: 'eff', weight: 3, measure: 'thermalEfficiency' },
    { id: 'work', weight: 2, measure: 'netWorkKJPerKg' },
    { id: 'complexity', weight: 1, measure: null },
  ],
  // Two people scored complexity: the simple cycle is the simplest.
  marks: [
    [[], [], []],
    [[], [], []],
    [
      [5, 4],
      [3, 3],
      [1, 2],
    ],
  ],
  scorers: 2,
  uncertainty: defaultUncertainty,
  firedHoursPerYear: 6000,
  profile: null,
  ...over,
});

const sum = (o: Record<string, number>) => Object.values(o).reduce((s, v) => s + v, 0);

describe('the draws', () => {
  it('first-place probabilities add to 1, and each candidate’s ranks and each rank’s candidates too', () => {
    const j = job({});
    const r = merge(['simple', 'regen', 'icrr'], [runDraws(j, measuredBest)], 400);
    expect(sum(r.firstPlace)).toBeCloseTo(1, 12);
    for (const dist of Object.values(r.ranks)) expect(dist.reduce((s, p) => s + p, 0)).toBeCloseTo(1, 12);
    for (let k = 0; k < 3; k++) expect(Object.values(r.ranks).reduce((s, d) => s + d[k]!, 0)).toBeCloseTo(1, 12);
    // The draws move the figures: the 5–95 % band of efficiency has a width.
    const band = r.bands.simple.thermalEfficiency!;
    expect(band.p95 - band.p5).toBeGreaterThan(0.002);
    expect(band.p5).toBeLessThan(band.p50);
    // 3 candidates × 400 draws, each one engine evaluation.
    expect(r.evaluations).toBe(1200);
  });

  it('with every uncertainty at zero, gives the deterministic ranking with certainty', () => {
    const j = job({ uncertainty: zero, to: 50 });
    const r = merge(['simple', 'regen', 'icrr'], [runDraws(j, measuredBest)], 50);
    // Deterministic totals (weights 3/2/1 over the matrix's pre-scores and the mean complexity):
    // the winner takes every draw and the bands collapse to the nominal figures.
    const winner = Object.entries(r.firstPlace).find(([, p]) => p > 0)![0];
    expect(r.firstPlace[winner]).toBe(1);
    for (const b of Object.values(r.bands)) expect(b.thermalEfficiency!.p95 - b.thermalEfficiency!.p5).toBe(0);
    for (const dist of Object.values(r.ranks)) expect(Math.max(...dist)).toBe(1);
  });

  it('ranks first with probability 1 a candidate better on every criterion in every draw', () => {
    // The same regenerative machine, once with far better components: better efficiency and work
    // whatever the draw, and the team scored it higher on complexity too.
    const better = inputOf('regenerative', (p) => {
      p.compressor.isentropicEfficiency = 0.93;
      p.turbine.isentropicEfficiency = 0.94;
      p.turbine.inletTemperatureK = 1600;
    });
    const j = job({
      candidates: [
        { id: 'plain', input: inputOf('regenerative'), ownIntercoolTemperature: false, yearFuelTonnes: null },
        { id: 'better', input: better, ownIntercoolTemperature: false, yearFuelTonnes: null },
      ],
      marks: [
        [[], []],
        [[], []],
        [
          [2, 2],
          [4, 5],
        ],
      ],
    });
    const r = merge(['plain', 'better'], [runDraws(j, measuredBest)], 400);
    expect(r.firstPlace.better).toBe(1);
    expect(r.firstPlace.plain).toBe(0);
  });

  it('the same seed gives the same result, however the draws are split; another seed another', () => {
    const ids = ['simple', 'regen', 'icrr'];
    const whole = merge(ids, [runDraws(job({}), measuredBest)], 400);
    const split = merge(
      ids,
      [runDraws(job({ from: 150, to: 400 }), measuredBest), runDraws(job({ from: 0, to: 150 }), measuredBest)],
      400,
    );
    expect(split).toEqual(whole);
    const other = merge(ids, [runDraws(job({ seed: 8 }), measuredBest)], 400);
    expect(other.bands.simple.thermalEfficiency).not.toEqual(whole.bands.simple.thermalEfficiency);
  });

  it('without a profile, annual fuel is the fired hours at the drawn conditions', () => {
    const j = job({ uncertainty: zero, to: 1 });
    const part = runDraws(j, measuredBest);
    const nominal = inputOf('simple');
    const fuel = evaluateCycle(nominal, { paths: false }).fuelMassFlowKgPerS!;
    expect(part.annualFuel[0]).toBeCloseTo((fuel * 3600 * 6000) / 1000, 6);
  });
});

describe('the robustness routes', () => {
  let ctx: ReturnType<typeof createTestApp>;
  let t: ScoringTeam;
  const url = () => `/api/reviews/${t.reviewId}/robustness`;
  const until = async (done: () => Promise<boolean>, ms = 60_000) => {
    const end = Date.now() + ms;
    while (!(await done())) {
      if (Date.now() > end) throw new Error('timed out');
      await new Promise((r) => setTimeout(r, 50));
    }
  };
  const read = async () => (await t.lead.agent.get(url())).body as Robustness;

  beforeAll(async () => {
    ctx = createTestApp();
    t = await scoringTeam(ctx, 'Robust', ['simple', 'regenerative', 'intercooled-reheat-regenerative']);
  });
  afterAll(async () => {
    await closeRobustness(ctx.db);
    await ctx?.close();
  });

  it('answers "none" before any run', async () => {
    const r = await read();
    expect(r.status).toBe('none');
    expect(r.uncertainty).toEqual(defaultUncertainty);
  });

  it('runs off the request thread: 202 at once, progress to the room, a result that adds to 1', async () => {
    const res = await t.engineer.agent.post(url()).send({ samples: 2000, seed: 42 });
    expect(res.status).toBe(202);
    const { runId } = res.body;
    await until(async () => (await read()).status === 'done');
    const r = await read();
    expect(r.runId).toBe(runId);
    expect([r.samples, r.seed, r.done]).toEqual([2000, 42, 2000]);
    expect(sum(r.firstPlace!)).toBeCloseTo(1, 9);
    expect(Object.keys(r.firstPlace!).sort()).toEqual([...t.candidates].sort());
    expect(r.stale).toBe(false);
    const progress = ctx.sent.filter((s) => s.event === 'robustness:progress' && s.reviewId === t.reviewId);
    expect(progress.length).toBeGreaterThan(0);
    expect((progress.at(-1)!.payload as { done: number }).done).toBe(2000);
    expect(ctx.sent.some((s) => s.event === 'robustness:finished')).toBe(true);

    // The same seed again: the same answer.
    await t.lead.agent.post(url()).send({ samples: 2000, seed: 42 }).expect(202);
    await until(async () => (await read()).status === 'done' && (await read()).runId !== runId);
    expect((await read()).firstPlace).toEqual(r.firstPlace);
  });

  it('is out of date once a candidate changes', async () => {
    const id = t.candidates[0]!;
    await t.lead.agent
      .patch(`/api/reviews/${t.reviewId}/candidates/${id}`)
      .send({ parameters: { compressor: { pressureRatio: 14 } } })
      .expect(200);
    expect((await read()).stale).toBe(true);
  });

  it('runs one at a time per review, and the Lead cancels a run', async () => {
    const first = await t.lead.agent.post(url()).send({ samples: 20000, seed: 1 });
    expect(first.status).toBe(202);
    const second = await t.engineer.agent.post(url()).send({ samples: 10, seed: 2 });
    expect(second.status).toBe(409);
    expect(second.body.error.message).toContain('already running');
    // An Engineer starts runs but does not cancel them.
    const engineer = await t.engineer.agent.delete(`${url()}/${first.body.runId}`);
    expect(engineer.status).toBe(403);
    const cancel = await t.lead.agent.delete(`${url()}/${first.body.runId}`);
    expect(cancel.status).toBe(200);
    await until(async () => (await read()).status === 'cancelled');
    const r = await read();
    expect(r.done).toBeLessThan(20000);
    expect(r.firstPlace).toBeNull();
    // Cancelled: nothing to cancel any more.
    expect((await t.lead.agent.delete(`${url()}/${first.body.runId}`)).status).toBe(409);
  });

  it('a signed decision keeps the run it rested on, and its PDF says how sure', async () => {
    const res = await t.lead.agent.post(url()).send({ samples: 500, seed: 5 });
    expect(res.status).toBe(202);
    await until(async () => (await read()).status === 'done' && (await read()).runId === res.body.runId);
    const run = await read();
    const chosen = Object.entries(run.firstPlace!).sort((a, b) => b[1] - a[1])[0]![0];
    await t.lead.agent
      .put(`/api/reviews/${t.reviewId}/decision`)
      .send({ chosenCandidateId: chosen, rationale: 'Ranks first most often in the robustness check.' })
      .expect(200);
    await t.lead.agent.post(`/api/reviews/${t.reviewId}/decision/sign`).send({}).expect(200);
    const decision = (await t.lead.agent.get(`/api/reviews/${t.reviewId}/decision`)).body;
    expect(decision.current.snapshot.robustness.runId).toBe(run.runId);
    expect(decision.current.snapshot.robustness.firstPlace).toEqual(run.firstPlace);
    expect(decision.current.snapshot.siteYear.candidates).toHaveLength(t.candidates.length);

    const pdf = await t.lead.agent
      .get(`/api/reviews/${t.reviewId}/decision.pdf`)
      .buffer(true)
      .parse((response, done) => {
        const chunks: Buffer[] = [];
        response.on('data', (c: Buffer) => chunks.push(c));
        response.on('end', () => done(null, Buffer.concat(chunks)));
      });
    expect(pdf.status).toBe(200);
    const doc = await getDocument({
      data: new Uint8Array(pdf.body as Buffer),
      useSystemFonts: false,
      isEvalSupported: false,
    }).promise;
    let text = '';
    for (let i = 1; i <= doc.numPages; i++)
      text += (await (await doc.getPage(i)).getTextContent()).items.map((x) => ('str' in x ? x.str : '')).join(' ');
    expect(text).toContain('How sure is the ranking');
    expect(text).toContain('500 draws, seed 5');
    expect(text).toContain('Ranks first');
    expect(text).toContain('Site year');
    // A later run does not change the signed record.
    await t.lead.agent.post(url()).send({ samples: 50, seed: 6 }).expect(202);
    await until(async () => (await read()).seed === 6 && (await read()).status === 'done');
    const again = (await t.lead.agent.get(`/api/reviews/${t.reviewId}/decision`)).body;
    expect(again.current.snapshot.robustness.seed).toBe(5);
  });

  it('refuses bad samples and seeds by field, and changes nothing', async () => {
    const before = await read();
    for (const [body, field] of [
      [{ samples: 0, seed: 1 }, 'samples'],
      [{ samples: 20001, seed: 1 }, 'samples'],
      [{ samples: 2.5, seed: 1 }, 'samples'],
      [{ samples: 10, seed: -1 }, 'seed'],
      [{ samples: 10 }, 'seed'],
      [{ samples: 10, seed: 1, draws: 3 }, 'draws'],
      [
        { samples: 10, seed: 1, uncertainty: { ...defaultUncertainty, turbineInletK: -5 } },
        'uncertainty.turbineInletK',
      ],
    ] as const) {
      const res = await t.lead.agent.post(url()).send(body);
      expect(res.status, JSON.stringify(body)).toBe(422);
      expect(res.body.error.field).toBe(field);
    }
    expect((await read()).runId).toBe(before.runId);
  });
});
