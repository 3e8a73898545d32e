import fc from 'fast-check';
import { describe, expect, it } from 'vitest';

import { EngineInputError, evaluateCycle, sweepCycle, type CycleInput } from '@/server/engine';

import { irrAir, simpleAir, simpleCombustion, variant } from './cases';

describe('sweeps', () => {
  const sweep = sweepCycle({
    base: simpleCombustion,
    parameter: 'compressor.pressureRatio',
    from: 2,
    to: 60,
    points: 30,
  });

  it('returns one point per sample, in order', () => {
    expect(sweep.points.length).toBe(30);
    expect(sweep.points[0].value).toBe(2);
    expect(sweep.points.at(-1)!.value).toBe(60);
  });

  it('finds optima at least as good as every sample and flat around them', () => {
    for (const [optimum, score] of [
      [sweep.optimumNetWork!, (r: { netWorkKJPerKg: number }) => r.netWorkKJPerKg],
      [sweep.optimumEfficiency!, (r: { thermalEfficiency: number }) => r.thermalEfficiency],
    ] as const) {
      expect(optimum.atRangeEnd).toBe(false);
      const best = score(optimum.figures as never);
      for (const p of sweep.points)
        if (p.figures) expect(best).toBeGreaterThanOrEqual(score(p.figures as never) - 1e-12);
      // A maximum found, not sampled: both neighbours a little away are lower.
      const h = optimum.value * 1e-3;
      for (const v of [optimum.value - h, optimum.value + h]) {
        const r = evaluateCycle(
          variant(simpleCombustion, (c) => (c.compressor.pressureRatio = v)),
          { paths: false },
        );
        expect(score(r)).toBeLessThan(best);
      }
    }
  });

  it('puts the simple cycle optimum for net work below the one for efficiency', () => {
    expect(sweep.optimumNetWork!.value).toBeLessThan(sweep.optimumEfficiency!.value);
  });

  it('sweeps the turbine inlet temperature with reheat following it', () => {
    const s = sweepCycle({ base: irrAir, parameter: 'turbine.inletTemperatureK', from: 1100, to: 1700, points: 7 });
    expect(s.points.every((p) => p.figures !== null)).toBe(true);
    expect(s.optimumNetWork!.atRangeEnd).toBe(true);
    expect(s.optimumNetWork!.value).toBe(1700);
  });

  it('sweeps stage counts over whole numbers', () => {
    const s = sweepCycle({ base: irrAir, parameter: 'compressor.stages', from: 1, to: 4, points: 50 });
    expect(s.points.map((p) => p.value)).toEqual([1, 2, 3, 4]);
    expect(Number.isInteger(s.optimumEfficiency!.value)).toBe(true);
  });

  it('reports infeasible samples with their reason', () => {
    const s = sweepCycle({ base: simpleAir, parameter: 'turbine.inletTemperatureK', from: 400, to: 1500, points: 12 });
    const bad = s.points.filter((p) => p.figures === null);
    expect(bad.length).toBeGreaterThan(0);
    expect(bad[0].error!.field).toBe('turbine.inletTemperatureK');
  });

  it('refuses a bad range or parameter', () => {
    expect(() =>
      sweepCycle({ base: simpleAir, parameter: 'compressor.pressureRatio', from: 10, to: 5, points: 10 }),
    ).toThrow(EngineInputError);
    expect(() =>
      sweepCycle({ base: simpleAir, parameter: 'regenerator.effectiveness', from: 0.5, to: 0.9, points: 5 }),
    ).toThrow(EngineInputError);
    expect(() => sweepCycle({ base: simpleAir, parameter: 'nope' as never, from: 1, to: 2, points: 5 })).toThrow(
      EngineInputError,
    );
  });
});

/** Arbitrary valid cycles (ranges of common practice, widened). */
const validCycle = fc
  .record({
    ambientK: fc.double({ min: 240, max: 320, noNaN: true }),
    rh: fc.double({ min: 0, max: 1, noNaN: true }),
    fluid: fc.constantFrom('variable-cp-air', 'combustion', 'constant-cp-air'),
    h2: fc.double({ min: 0, max: 1, noNaN: true }),
    nc: fc.integer({ min: 1, max: 4 }),
    nt: fc.integer({ min: 1, max: 4 }),
    r: fc.double({ min: 2, max: 30, noNaN: true }),
    etaC: fc.double({ min: 0.75, max: 0.95, noNaN: true }),
    etaT: fc.double({ min: 0.75, max: 0.95, noNaN: true }),
    regen: fc.option(fc.double({ min: 0.5, max: 0.95, noNaN: true }), { nil: null }),
    loss: fc.double({ min: 0, max: 0.05, noNaN: true }),
    tit: fc.double({ min: 1100, max: 1800, noNaN: true }),
  })
  .map((v): CycleInput => ({
    ambient: { temperatureK: v.ambientK, pressureKPa: 101.325, relativeHumidity: v.rh },
    fluid: v.fluid as CycleInput['fluid'],
    fuel: { hydrogenVolumeFraction: v.h2, temperatureK: 298.15 },
    compressor: { stages: v.nc, pressureRatio: v.r, isentropicEfficiency: v.etaC, intercoolerPressureLoss: v.loss / 2 },
    regenerator:
      v.regen === null ? null : { effectiveness: v.regen, airSidePressureLoss: v.loss, gasSidePressureLoss: v.loss },
    combustorPressureLoss: v.loss,
    turbine: { stages: v.nt, inletTemperatureK: v.tit, isentropicEfficiency: v.etaT, reheaterPressureLoss: v.loss / 2 },
    generatorEfficiency: 0.985,
    netPowerKW: 10_000,
  }));

function finiteEverywhere(value: unknown): boolean {
  if (typeof value === 'number') return Number.isFinite(value);
  if (Array.isArray(value)) return value.every(finiteEverywhere);
  if (value && typeof value === 'object') return Object.values(value).every(finiteEverywhere);
  return true;
}

describe('properties over the valid domain (fast-check)', () => {
  it('no valid input gives NaN: a finite result or a named error, and most give a result', () => {
    let accepted = 0;
    fc.assert(
      fc.property(validCycle, (input) => {
        try {
          const finite = finiteEverywhere(evaluateCycle(input));
          accepted++;
          return finite;
        } catch (error) {
          return error instanceof EngineInputError && error.field.length > 0;
        }
      }),
      { numRuns: 300 },
    );
    // These inputs lie within the ranges of common practice: an engine refusing them all
    // (or nearly all) would pass the property above without computing anything.
    expect(accepted).toBeGreaterThan(200);
  });

  const positive = (input: CycleInput) => {
    try {
      return evaluateCycle(input, { paths: false });
    } catch {
      return null;
    }
  };

  it('efficiency rises with regenerator effectiveness while the regenerator heats the air', () => {
    fc.assert(
      fc.property(validCycle, fc.double({ min: 0.3, max: 0.9, noNaN: true }), (input, e) => {
        const low = positive({
          ...input,
          regenerator: { effectiveness: e, airSidePressureLoss: 0.02, gasSidePressureLoss: 0.02 },
        });
        const high = positive({
          ...input,
          regenerator: { effectiveness: e + 0.05, airSidePressureLoss: 0.02, gasSidePressureLoss: 0.02 },
        });
        fc.pre(low !== null && high !== null && low.netWorkKJPerKg > 0 && low.regeneratorDutyKJPerKg > 0);
        return high!.thermalEfficiency > low!.thermalEfficiency;
      }),
      { numRuns: 200 },
    );
  });

  it('efficiency rises with compressor and turbine efficiencies', () => {
    fc.assert(
      fc.property(validCycle, (input) => {
        const base = positive(input);
        fc.pre(base !== null && base.netWorkKJPerKg > 0);
        const betterC = positive({
          ...input,
          compressor: { ...input.compressor, isentropicEfficiency: input.compressor.isentropicEfficiency + 0.02 },
        });
        const betterT = positive({
          ...input,
          turbine: { ...input.turbine, isentropicEfficiency: input.turbine.isentropicEfficiency + 0.02 },
        });
        // A better turbine leaves cooler gas, so reheat may need more oxygen than is left: then no comparison.
        fc.pre(betterC !== null && betterT !== null);
        return (
          betterC!.thermalEfficiency > base!.thermalEfficiency && betterT!.thermalEfficiency > base!.thermalEfficiency
        );
      }),
      { numRuns: 200 },
    );
  });

  it('the simple cycle optimum pressure ratio for net work lies below the one for efficiency', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1100, max: 1700, noNaN: true }),
        fc.double({ min: 0.8, max: 0.92, noNaN: true }),
        fc.constantFrom('variable-cp-air', 'combustion'),
        (tit, eta, fluid) => {
          const base = variant(simpleCombustion, (c) => {
            c.fluid = fluid;
            c.turbine.inletTemperatureK = tit;
            c.turbine.isentropicEfficiency = eta;
            c.compressor.isentropicEfficiency = eta - 0.02;
          });
          const s = sweepCycle({ base, parameter: 'compressor.pressureRatio', from: 1.5, to: 120, points: 60 });
          return s.optimumNetWork!.value < s.optimumEfficiency!.value;
        },
      ),
      { numRuns: 25 },
    );
  });
});
