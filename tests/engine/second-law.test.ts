import fc from 'fast-check';
import { describe, expect, it } from 'vitest';

import { EngineInputError, evaluateCycle, type CycleInput, type CycleResult } from '@/server/engine';

/**
 * Random cycles, valid and not, including the edges an outside audit found (fuel up to
 * 6000 K, huge or infinite ambient pressures, a turbine inlet below the compressor delivery
 * with a regenerator, heat beyond what the air's oxygen can burn, stage counts of 1e20).
 * Every input either gives a result that obeys the second law, or is refused by an
 * EngineInputError that names an input. Limits of thermodynamics, no reference numbers.
 */

/** Every field an error may name: the dotted input paths and their groups. */
const INPUT_FIELDS = new Set([
  '(body)',
  'ambient',
  'ambient.temperatureK',
  'ambient.pressureKPa',
  'ambient.elevationM',
  'ambient.relativeHumidity',
  'fluid',
  'fuel',
  'fuel.hydrogenVolumeFraction',
  'fuel.temperatureK',
  'compressor',
  'compressor.stages',
  'compressor.pressureRatio',
  'compressor.isentropicEfficiency',
  'compressor.intercoolTemperatureK',
  'compressor.intercoolerPressureLoss',
  'regenerator',
  'regenerator.effectiveness',
  'regenerator.airSidePressureLoss',
  'regenerator.gasSidePressureLoss',
  'combustorPressureLoss',
  'turbine',
  'turbine.stages',
  'turbine.inletTemperatureK',
  'turbine.isentropicEfficiency',
  'turbine.reheatTemperatureK',
  'turbine.reheaterPressureLoss',
  'generatorEfficiency',
  'netPowerKW',
  'limits',
]);

/** Mostly in range, sometimes one of the given edge values. */
const withEdges = (min: number, max: number, edges: number[]) =>
  fc.oneof(
    { weight: 12, arbitrary: fc.double({ min, max, noNaN: true }) },
    { weight: 1, arbitrary: fc.constantFrom(...edges) },
  );

const anyCycle = fc
  .record({
    ambientK: withEdges(230, 330, [199, 200, 6000, Infinity, NaN]),
    pressureKPa: withEdges(20, 110, [1e300, 1e6, 121, 4, 0, -1, Infinity]),
    rh: withEdges(0, 1, [1.5, -0.1]),
    fluid: fc.constantFrom('variable-cp-air', 'combustion', 'constant-cp-air'),
    fuel: fc.boolean(),
    h2: fc.double({ min: 0, max: 1, noNaN: true }),
    // Hot fuel is the audit's worst case (η above Carnot when its sensible heat was left out): often drawn.
    fuelK: fc.oneof(
      { weight: 3, arbitrary: fc.double({ min: 230, max: 600, noNaN: true }) },
      { weight: 1, arbitrary: fc.double({ min: 600, max: 6000, noNaN: true }) },
    ),
    nc: fc.oneof(
      { weight: 8, arbitrary: fc.integer({ min: 1, max: 4 }) },
      { weight: 1, arbitrary: fc.constantFrom(1e20, 2.5, 0) },
    ),
    nt: fc.oneof(
      { weight: 8, arbitrary: fc.integer({ min: 1, max: 4 }) },
      { weight: 1, arbitrary: fc.constantFrom(1e20, 101) },
    ),
    r: withEdges(1.5, 60, [200, 201, 1e10, 1, Infinity]),
    etaC: fc.double({ min: 0.5, max: 0.999, noNaN: true }),
    etaT: fc.double({ min: 0.5, max: 0.999, noNaN: true }),
    regen: fc.option(fc.double({ min: 0, max: 1, noNaN: true }), { nil: null }),
    loss: withEdges(0, 0.1, [0.9, 0.999999]),
    tit: withEdges(400, 2500, [6000, 6001, 250]),
    reheatK: fc.option(withEdges(700, 2500, [250, 6000]), { nil: undefined }),
    intercoolK: fc.option(fc.double({ min: 200, max: 450, noNaN: true }), { nil: undefined }),
  })
  .map((v): CycleInput => ({
    ambient: { temperatureK: v.ambientK, pressureKPa: v.pressureKPa, relativeHumidity: v.rh },
    fluid: v.fluid as CycleInput['fluid'],
    fuel: v.fuel || v.fluid === 'combustion' ? { hydrogenVolumeFraction: v.h2, temperatureK: v.fuelK } : null,
    compressor: {
      stages: v.nc,
      pressureRatio: v.r,
      isentropicEfficiency: v.etaC,
      intercoolTemperatureK: v.intercoolK,
      intercoolerPressureLoss: v.loss / 2,
    },
    regenerator:
      v.regen === null ? null : { effectiveness: v.regen, airSidePressureLoss: v.loss, gasSidePressureLoss: v.loss },
    combustorPressureLoss: v.loss,
    turbine: {
      stages: v.nt,
      inletTemperatureK: v.tit,
      isentropicEfficiency: v.etaT,
      reheatTemperatureK: v.reheatK,
      reheaterPressureLoss: v.loss / 2,
    },
    generatorEfficiency: 0.985,
    netPowerKW: 10_000,
  }));

function finiteEverywhere(value: unknown): boolean {
  if (typeof value === 'number') return Number.isFinite(value);
  if (Array.isArray(value)) return value.every(finiteEverywhere);
  if (value && typeof value === 'object') return Object.values(value).every(finiteEverywhere);
  return true;
}

/** Molar masses, kg/kmol (IUPAC standard atomic weights, from memory). */
const M = { N2: 28.0134, O2: 31.9988, Ar: 39.948, CO2: 44.0095, CH4: 16.0425, H2: 2.01588 };

/**
 * Stoichiometric fuel–air ratio in dry air (U.S. Standard Atmosphere 1976 composition):
 * CH4 + 2 O2 → CO2 + 2 H2O, H2 + ½ O2 → H2O. Humid air holds less oxygen per kg, so this
 * bounds the fuel of humid air from above.
 */
function stoichiometricFuelAirRatio(hydrogenVolumeFraction: number): number {
  const x = hydrogenVolumeFraction;
  const dryAirMolarMass =
    0.78084 * M.N2 + 0.209476 * M.O2 + (1 - 0.78084 - 0.209476 - 0.000314) * M.Ar + 0.000314 * M.CO2;
  const oxygenPerKgAir = 0.209476 / dryAirMolarMass;
  const oxygenPerKmolFuel = 2 * (1 - x) + 0.5 * x;
  return (oxygenPerKgAir / oxygenPerKmolFuel) * ((1 - x) * M.CH4 + x * M.H2);
}

/** The second law and the bounds of the model on one result; returns the first breach, or null. */
function secondLawBreach(input: CycleInput, result: CycleResult): string | null {
  if (!finiteEverywhere(result)) return 'a number of the result is not finite';
  const states = result.states;
  let minK = Infinity;
  let maxK = 0;
  for (const s of states) {
    if (!(s.temperatureK >= 200 && s.temperatureK <= 6000)) return `state ${s.n} at ${s.temperatureK} K`;
    if (!(s.pressureKPa > 0)) return `state ${s.n} at ${s.pressureKPa} kPa`;
    minK = Math.min(minK, s.temperatureK);
    maxK = Math.max(maxK, s.temperatureK);
  }
  const eta = result.thermalEfficiency;
  // Carnot: no cycle between its coldest and hottest states does better (second law).
  if (!(eta < 1 - minK / maxK)) return `η = ${eta} not below the Carnot limit ${1 - minK / maxK}`;
  if (!(result.heatInputKJPerKg > 0)) return `heat input ${result.heatInputKJPerKg}`;
  if (result.netWorkKJPerKg > 0 ? !(eta > 0) : !result.warnings.some((w) => w.code === 'no-net-work'))
    return `η = ${eta} with net work ${result.netWorkKJPerKg}`;
  // Entropy rises across every adiabatic stage with η < 1 (same gas in and out).
  for (let i = 1; i < states.length; i++) {
    const label = states[i].label;
    if (
      (label.startsWith('compressor') || label.startsWith('turbine')) &&
      !(states[i].entropyKJPerKgK > states[i - 1].entropyKJPerKgK)
    )
      return `entropy falls across ${label}`;
  }
  // A burner only heats: its exit is hotter than its inlet.
  for (let i = 1; i < states.length; i++) {
    const label = states[i].label;
    if (
      (label === 'combustor exit' || label.startsWith('reheater')) &&
      !(states[i].temperatureK > states[i - 1].temperatureK)
    )
      return `${label} not above its inlet`;
  }
  // The regenerator as a whole is adiabatic: it generates entropy, or none at ε = 0 with no losses.
  const coldOut = states.findIndex((s) => s.label === 'regenerator cold out');
  const hotOut = states.findIndex((s) => s.label === 'regenerator hot out');
  if (coldOut > 0 && hotOut > 0) {
    const generated =
      states[coldOut].massFlowRatio * (states[coldOut].entropyKJPerKgK - states[coldOut - 1].entropyKJPerKgK) +
      states[hotOut].massFlowRatio * (states[hotOut].entropyKJPerKgK - states[hotOut - 1].entropyKJPerKgK);
    if (!(generated >= -1e-12)) return `the regenerator destroys entropy (${generated} kJ/K per kg)`;
  }
  // More fuel than the air's oxygen can burn is impossible in every mode.
  if (input.fuel && result.fuelAirRatio !== null) {
    const stoichiometric = stoichiometricFuelAirRatio(input.fuel.hydrogenVolumeFraction);
    if (!(result.fuelAirRatio <= stoichiometric * (1 + 1e-9)))
      return `fuel–air ratio ${result.fuelAirRatio} above stoichiometric ${stoichiometric}`;
  }
  return null;
}

describe('the second law over random inputs, edges included (fast-check)', () => {
  it('every input gives a result that obeys it, or an error naming an input', () => {
    let accepted = 0;
    let refused = 0;
    fc.assert(
      fc.property(anyCycle, fc.boolean(), (input, paths) => {
        let result: CycleResult;
        try {
          result = evaluateCycle(input, { paths });
        } catch (error) {
          refused++;
          if (!(error instanceof EngineInputError)) throw error;
          expect(INPUT_FIELDS.has(error.field), `field "${error.field}"`).toBe(true);
          return;
        }
        accepted++;
        const breach = secondLawBreach(input, result);
        expect(breach, JSON.stringify(input)).toBeNull();
      }),
      { numRuns: 1500 },
    );
    // A sweep that refuses everything (or accepts everything) checks nothing.
    expect(accepted).toBeGreaterThan(300);
    expect(refused).toBeGreaterThan(100);
  });

  type Edge = { fuelK?: number; pressureKPa?: number; tit?: number; r?: number; nc?: number };
  it.each<[string, Edge]>([
    ['fuel at 6000 K, 2+2 regenerative', { fuelK: 6000 }],
    ['ambient pressure 1e300 kPa', { pressureKPa: 1e300 }],
    ['turbine inlet below the compressor delivery, with a regenerator', { tit: 700, r: 30, nc: 1 }],
  ])('refuses %s', (_name, change) => {
    const input: CycleInput = {
      ambient: { temperatureK: 288.15, pressureKPa: change.pressureKPa ?? 101.325, relativeHumidity: 0.6 },
      fluid: 'combustion',
      fuel: { hydrogenVolumeFraction: 0.3, temperatureK: change.fuelK ?? 298.15 },
      compressor: {
        stages: change.nc ?? 2,
        pressureRatio: change.r ?? 12,
        isentropicEfficiency: 0.88,
        intercoolerPressureLoss: 0.02,
      },
      regenerator: { effectiveness: 0.85, airSidePressureLoss: 0.03, gasSidePressureLoss: 0.03 },
      combustorPressureLoss: 0.04,
      turbine: {
        stages: 2,
        inletTemperatureK: change.tit ?? 1500,
        isentropicEfficiency: 0.9,
        reheaterPressureLoss: 0.02,
      },
      generatorEfficiency: 0.985,
      netPowerKW: 50_000,
    };
    for (const fluid of ['combustion', 'variable-cp-air', 'constant-cp-air'] as const) {
      expect(() => evaluateCycle({ ...input, fluid }), fluid).toThrow(EngineInputError);
    }
  });
});
