import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { simpleCombustion, variant } from '../engine/cases';
import { createTestApp, signUp, type TestUser } from '../helpers/api';

const ctx = createTestApp();
let engineer: TestUser;

beforeAll(async () => {
  engineer = await signUp(ctx.app, 'Cy Engineer');
});
afterAll(() => ctx.close());

describe('POST /api/cycles/evaluate', () => {
  it('needs a session', async () => {
    const res = await supertest(ctx.app).post('/api/cycles/evaluate').send(simpleCombustion);
    expect(res.status).toBe(401);
  });

  it('returns the state points and figures of a simple combustion cycle', async () => {
    const res = await engineer.agent.post('/api/cycles/evaluate').send(simpleCombustion);
    expect(res.status).toBe(200);
    const body = res.body;
    expect(body.states.map((s: { n: number }) => s.n)).toEqual(body.states.map((_: unknown, i: number) => i + 1));
    // A simple cycle at pressure ratio 15 and 1500 K lands between 30 % and 42 % (common practice, heavy-duty machines).
    expect(body.thermalEfficiency).toBeGreaterThan(0.3);
    expect(body.thermalEfficiency).toBeLessThan(0.42);
    // Heat rate and efficiency are one fact said two ways: 3600 kJ/kWh ÷ η (definition); the generator sits between them.
    expect(body.heatRateKJPerKWh).toBeGreaterThan(3600 / body.thermalEfficiency);
    expect(body.netWorkKJPerKg).toBeCloseTo(body.turbineWorkKJPerKg - body.compressorWorkKJPerKg, 6);
    expect(body.paths.length).toBeGreaterThan(0);
  });

  it('answers 422 naming the field for a string where a number belongs, and for an impossible value', async () => {
    const text = await engineer.agent
      .post('/api/cycles/evaluate')
      .send(variant(simpleCombustion, (i) => (i.turbine.inletTemperatureK = 'hot')));
    expect(text.status).toBe(422);
    expect(text.body.error.field).toBe('turbine.inletTemperatureK');
    expect(text.body.error.message).toMatch(/number/);

    const ratio = await engineer.agent
      .post('/api/cycles/evaluate')
      .send(variant(simpleCombustion, (i) => (i.compressor.pressureRatio = 0.9)));
    expect(ratio.status).toBe(422);
    expect(ratio.body.error.field).toBe('compressor.pressureRatio');

    const noExpansion = await engineer.agent
      .post('/api/cycles/evaluate')
      .send(variant(simpleCombustion, (i) => ((i.compressor.pressureRatio = 1.02), (i.combustorPressureLoss = 0.5))));
    expect(noExpansion.status).toBe(422);
    expect(noExpansion.body.error.field).toBeTruthy();
  });
});

describe('POST /api/cycles/sweep', () => {
  it('sweeps the pressure ratio and finds the work optimum below the efficiency optimum', async () => {
    const res = await engineer.agent.post('/api/cycles/sweep').send({
      base: simpleCombustion,
      parameter: 'compressor.pressureRatio',
      from: 4,
      to: 60,
      points: 40,
    });
    expect(res.status).toBe(200);
    expect(res.body.points).toHaveLength(40);
    const work = res.body.optimumNetWork.value;
    const eta = res.body.optimumEfficiency.value;
    // Textbook result for the simple cycle: the pressure ratio for most specific work is below that for best efficiency.
    expect(work).toBeLessThan(eta);
    const sampledBest = Math.max(
      ...res.body.points
        .filter((p: { figures: unknown }) => p.figures)
        .map((p: { figures: { netWorkKJPerKg: number } }) => p.figures.netWorkKJPerKg),
    );
    expect(res.body.optimumNetWork.figures.netWorkKJPerKg).toBeGreaterThanOrEqual(sampledBest - 1e-9);
  });

  it('answers 422 for an unknown parameter', async () => {
    const res = await engineer.agent
      .post('/api/cycles/sweep')
      .send({ base: simpleCombustion, parameter: 'turbine.colour', from: 1, to: 2, points: 5 });
    expect(res.status).toBe(422);
    expect(res.body.error.field).toBe('parameter');
  });
});
