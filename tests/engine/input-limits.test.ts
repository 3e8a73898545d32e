import { describe, expect, it } from 'vitest';

import { cycleInputSchema, sweepRequestSchema } from '@/server/contracts/cycle';
import { EngineInputError, evaluateCycle, sweepCycle, type CycleInput } from '@/server/engine';
import * as limits from '@/server/engine/input-limits';

import { irrCombustion, simpleCombustion, variant } from './cases';

/**
 * The limits are written once (server/engine/input-limits.ts): the request contract refuses
 * exactly what the engine refuses, at the same bounds, and both say which bound, naming the field.
 */
type Case = [field: string, set: (c: any, v: unknown) => void, inside: number, outside: unknown, words: string];

const cases: Case[] = [
  ['fuel.temperatureK', (c, v) => (c.fuel.temperatureK = v), limits.MAX_FUEL_TEMPERATURE_K, 6000, 'at most 600'],
  ['fuel.temperatureK', (c, v) => (c.fuel.temperatureK = v), limits.MIN_FUEL_TEMPERATURE_K, 229, 'at least 230'],
  ['ambient.pressureKPa', (c, v) => (c.ambient.pressureKPa = v), limits.MAX_AMBIENT_PRESSURE_KPA, 1e300, 'at most 120'],
  ['ambient.pressureKPa', (c, v) => (c.ambient.pressureKPa = v), limits.MIN_AMBIENT_PRESSURE_KPA + 10, 4, 'at least 5'],
  ['compressor.pressureRatio', (c, v) => (c.compressor.pressureRatio = v), 60, 201, 'at most 200'],
  ['compressor.stages', (c, v) => (c.compressor.stages = v), 3, 1e20, 'at most 100'],
  ['compressor.stages', (c, v) => (c.compressor.stages = v), 3, 2.5, 'whole number'],
  ['turbine.inletTemperatureK', (c, v) => (c.turbine.inletTemperatureK = v), 1500, Infinity, 'finite'],
  ['turbine.inletTemperatureK', (c, v) => (c.turbine.inletTemperatureK = v), 1500, 'hot', 'must be a number'],
  ['netPowerKW', (c, v) => (c.netPowerKW = v), limits.MAX_NET_POWER_KW, 1e8, 'at most'],
  ['limits.exhaustTemperatureMinK', (c, v) => (c.limits = { exhaustTemperatureMinK: v }), 500, -5, 'above 0 K'],
];

/** The words, not followed by another digit ("at most 100" is not "at most 1000"). */
const saying = (words: string) => new RegExp(`${words.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}(?!\\d)`);

function engineError(input: CycleInput): EngineInputError | null {
  try {
    evaluateCycle(input, { paths: false });
    return null;
  } catch (error) {
    if (error instanceof EngineInputError) return error;
    throw error;
  }
}

describe.each(cases)('%s: %s inside, %s outside', (field, set, inside, outside, words) => {
  const base = field.startsWith('compressor') ? irrCombustion : simpleCombustion;
  const good = variant(base, (c) => set(c, inside));
  const bad = variant(base, (c) => set(c, outside));

  it('the contract and the engine both accept the value inside', () => {
    expect(cycleInputSchema.safeParse(good).success).toBe(true);
    expect(engineError(good)).toBeNull();
  });

  it('the contract refuses the value outside, at the field, saying the bound', () => {
    const parsed = cycleInputSchema.safeParse(bad);
    expect(parsed.success).toBe(false);
    const issue = parsed.error!.issues[0];
    expect(issue.path.join('.')).toBe(field);
    expect(issue.message).toMatch(saying(words));
  });

  it('the engine refuses it too, naming the field and the bound', () => {
    const error = engineError(bad);
    expect(error?.field).toBe(field);
    expect(error?.message).toMatch(saying(words));
  });
});

describe('sweeps', () => {
  it('share the bound on points', () => {
    const body = { base: simpleCombustion, parameter: 'compressor.pressureRatio', from: 5, to: 20 };
    const many = { ...body, points: limits.MAX_SWEEP_POINTS + 1 };
    expect(sweepRequestSchema.safeParse(many).error?.issues[0].message).toContain(`at most ${limits.MAX_SWEEP_POINTS}`);
    expect(() => sweepCycle(many as never)).toThrow(`at most ${limits.MAX_SWEEP_POINTS}`);
    expect(sweepRequestSchema.safeParse({ ...body, points: 1e20 }).error?.issues[0].message).toContain('at most');
  });
});
