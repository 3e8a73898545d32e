import psychrolib from 'psychrolib';
import { describe, expect, it } from 'vitest';

import { evaluateCycle, type CycleInput } from '@/server/engine';
import { SPECIES, speciesMolarEnthalpy, type SpeciesName } from '@/server/engine/properties/nasa-species';
import { expectClose } from '@/tests/helpers/expect-close';

import { byLabel, irrAir, irrCombustion, simpleAir, simpleCombustion, variant } from './cases';

const configurations: Array<[string, CycleInput]> = [
  ['simple, air', simpleAir],
  ['simple, combustion', simpleCombustion],
  ['2+2 intercooled-reheat-regenerative, air', irrAir],
  ['2+2 intercooled-reheat-regenerative, combustion', irrCombustion],
  [
    '4+3 combustion, hydrogen',
    variant(irrCombustion, (c) => {
      c.compressor.stages = 4;
      c.turbine.stages = 3;
      c.compressor.pressureRatio = 20;
      c.fuel.hydrogenVolumeFraction = 1;
    }),
  ],
  ['simple combustion, methane heated to 500 K', variant(simpleCombustion, (c) => (c.fuel.temperatureK = 500))],
  [
    '2+2 air with a fuel for its flow, 60 % hydrogen',
    variant(irrAir, (c) => (c.fuel = { hydrogenVolumeFraction: 0.6, temperatureK: 450 })),
  ],
  [
    'regenerative, constant cp',
    variant(irrAir, (c) => {
      c.fluid = 'constant-cp-air';
      c.compressor.stages = 1;
      c.turbine.stages = 1;
      c.compressor.pressureRatio = 5;
    }),
  ],
];

// The balances below are summed here from the states' temperatures, compositions and the
// species data (NASA Glenn polynomials, per species), not from the engine's totals or its
// mixture code: each state's enthalpy is recomputed, then the works, the heat input and the
// plant boundary are added up from those enthalpies and compared with what the engine reports.
psychrolib.SetUnitSystem(psychrolib.SI);

type Amounts = Partial<Record<SpeciesName, number>>;

/** Dry air, mole fractions (U.S. Standard Atmosphere 1976, traces counted as argon). */
const DRY_AIR: Amounts = { N2: 0.78084, O2: 0.209476, Ar: 1 - 0.78084 - 0.209476 - 0.000314, CO2: 0.000314 };

function massOf(amounts: Amounts): number {
  let kg = 0;
  for (const [name, n] of Object.entries(amounts)) kg += n! * SPECIES[name as SpeciesName].molarMass;
  return kg;
}

/** Absolute enthalpy of a gas, kJ per kg of it, from the species polynomials one by one. */
function enthalpyPerKg(amounts: Amounts, temperatureK: number): number {
  let h = 0;
  for (const [name, n] of Object.entries(amounts)) h += n! * speciesMolarEnthalpy(name as SpeciesName, temperatureK);
  return h / massOf(amounts);
}

/** Humid inlet air, kmol per kg of it: humidity ratio from the ASHRAE functions (psychrolib). */
function humidAirAmounts(temperatureK: number, pressureKPa: number, relativeHumidity: number): Amounts {
  const w = psychrolib.GetHumRatioFromRelHum(temperatureK - 273.15, relativeHumidity, pressureKPa * 1000);
  const dryMass = massOf(DRY_AIR);
  const amounts: Amounts = {};
  for (const [name, x] of Object.entries(DRY_AIR)) amounts[name as SpeciesName] = x! / dryMass / (1 + w);
  amounts.H2O = w / SPECIES.H2O.molarMass / (1 + w);
  return amounts;
}

/** A methane–hydrogen blend, kmol per kg of fuel. */
function fuelAmounts(hydrogenVolumeFraction: number): Amounts {
  const x = hydrogenVolumeFraction;
  const molarMass = (1 - x) * SPECIES.CH4.molarMass + x * SPECIES.H2.molarMass;
  return { CH4: (1 - x) / molarMass, H2: x / molarMass };
}

/** Products of burning `fuelKg` of the blend completely in the air: CH4 + 2 O2 → CO2 + 2 H2O, H2 + ½ O2 → H2O. */
function burnt(air: Amounts, fuel: Amounts, fuelKg: number): Amounts {
  const ch4 = fuelKg * (fuel.CH4 ?? 0);
  const h2 = fuelKg * (fuel.H2 ?? 0);
  return {
    ...air,
    O2: air.O2! - 2 * ch4 - 0.5 * h2,
    CO2: air.CO2! + ch4,
    H2O: air.H2O! + 2 * ch4 + h2,
  };
}

/** Lower heating value at 298.15 K from the formation enthalpies, kJ per kg of fuel (water as vapour). */
function lowerHeatingValue(hydrogenVolumeFraction: number): number {
  const fuel = fuelAmounts(hydrogenVolumeFraction);
  const reactants = enthalpyPerKg(fuel, 298.15);
  const products = burnt({ O2: 10, CO2: 0, H2O: 0 }, fuel, 1);
  delete products.O2; // oxygen is an element: zero enthalpy at 298.15 K either way
  let h = 0;
  for (const [name, n] of Object.entries(products)) h += n! * speciesMolarEnthalpy(name as SpeciesName, 298.15);
  return reactants - h;
}

/** Constant-cp air: h = cp (T − 298.15 K), cp = 1.005 kJ/(kg·K) (cold-air standard). */
const constantCpEnthalpy = (temperatureK: number) => 1.005 * (temperatureK - 298.15);

describe.each(configurations)('%s', (_name, input) => {
  const result = evaluateCycle(input);
  const states = result.states;
  const ambient = input.ambient;
  const air = humidAirAmounts(ambient.temperatureK, ambient.pressureKPa!, ambient.relativeHumidity);
  const fuel = input.fuel ? fuelAmounts(input.fuel.hydrogenVolumeFraction) : null;
  const combustion = input.fluid === 'combustion';

  /** The enthalpy of each state recomputed from its temperature and composition, kJ per kg of its gas. */
  const enthalpies = states.map((s) => {
    if (input.fluid === 'constant-cp-air') return constantCpEnthalpy(s.temperatureK);
    const gas = combustion && s.massFlowRatio > 1 ? burnt(air, fuel!, s.massFlowRatio - 1) : air;
    return enthalpyPerKg(gas, s.temperatureK);
  });
  const is = (i: number, part: string) => states[i].label.startsWith(part);
  const sumOver = (part: string, term: (i: number) => number) => {
    let sum = 0;
    for (let i = 1; i < states.length; i++) if (is(i, part)) sum += term(i);
    return sum;
  };
  const compressorWork = sumOver('compressor', (i) => enthalpies[i] - enthalpies[i - 1]);
  const turbineWork = sumOver('turbine', (i) => states[i].massFlowRatio * (enthalpies[i - 1] - enthalpies[i]));
  const intercoolerHeat = sumOver('intercooler', (i) => enthalpies[i - 1] - enthalpies[i]);
  const burnerRise =
    sumOver('combustor', (i) => enthalpies[i] - enthalpies[i - 1]) +
    sumOver('reheater', (i) => enthalpies[i] - enthalpies[i - 1]);

  it('gives every state the enthalpy of its temperature and composition', () => {
    states.forEach((s, i) =>
      expectClose(s.enthalpyKJPerKg, enthalpies[i], { rel: 1e-9, abs: 1e-9 }, `h of ${s.label}`),
    );
  });

  it('reports works equal to the sums of the enthalpy changes across the stages', () => {
    expectClose(result.compressorWorkKJPerKg, compressorWork, { rel: 1e-9 }, 'compressor work');
    expectClose(result.turbineWorkKJPerKg, turbineWork, { rel: 1e-9 }, 'turbine work');
    expectClose(result.netWorkKJPerKg, turbineWork - compressorWork, { rel: 1e-9 }, 'net work');
  });

  it('reports the heat input of the burners: fuel × (LHV + sensible heat), or the enthalpy rise of the air', () => {
    let heatInput: number;
    if (combustion) {
      const fuelK = input.fuel!.temperatureK;
      const sensible = enthalpyPerKg(fuel!, fuelK) - enthalpyPerKg(fuel!, 298.15);
      heatInput = result.fuelAirRatio! * (lowerHeatingValue(input.fuel!.hydrogenVolumeFraction) + sensible);
    } else {
      heatInput = burnerRise;
    }
    expectClose(result.heatInputKJPerKg, heatInput, { rel: 1e-9 }, 'heat input');
    expectClose(result.thermalEfficiency, (turbineWork - compressorWork) / heatInput, { rel: 1e-9 }, 'efficiency');
  });

  it('closes the energy balance of the whole plant: net work = what enters − what leaves, to 1e-9', () => {
    const exhaust = states.length - 1;
    let netFromBoundary: number;
    if (combustion) {
      // Absolute enthalpies: air and fuel in; exhaust and intercooler heat out.
      const f = result.fuelAirRatio!;
      expectClose(states[exhaust].massFlowRatio, 1 + f, { rel: 1e-12 }, 'exhaust mass per kg of air');
      const fuelIn = f * enthalpyPerKg(fuel!, input.fuel!.temperatureK);
      netFromBoundary = enthalpies[0] + fuelIn - (1 + f) * enthalpies[exhaust] - intercoolerHeat;
    } else {
      netFromBoundary = burnerRise - (enthalpies[exhaust] - enthalpies[0]) - intercoolerHeat;
    }
    expectClose(turbineWork - compressorWork, netFromBoundary, { rel: 1e-9 }, 'net work from the plant boundary');
    expectClose(result.netWorkKJPerKg, netFromBoundary, { rel: 1e-9 }, 'net work reported');
  });

  it('raises entropy across every real compression and expansion', () => {
    for (let i = 1; i < states.length; i++) {
      const label = states[i].label;
      if (label.startsWith('compressor') || label.startsWith('turbine')) {
        expect(states[i].entropyKJPerKgK, label).toBeGreaterThan(states[i - 1].entropyKJPerKgK);
      }
    }
  });

  it('generates entropy in the regenerator', () => {
    if (!input.regenerator) return;
    const coldOut = byLabel(result, 'regenerator cold out');
    const hotOut = byLabel(result, 'regenerator hot out');
    const coldIn = states[states.indexOf(coldOut) - 1];
    const hotIn = states[states.indexOf(hotOut) - 1];
    const generated =
      coldOut.massFlowRatio * (coldOut.entropyKJPerKgK - coldIn.entropyKJPerKgK) +
      hotOut.massFlowRatio * (hotOut.entropyKJPerKgK - hotIn.entropyKJPerKgK);
    expect(generated).toBeGreaterThan(0);
    expectClose(
      coldOut.enthalpyKJPerKg - coldIn.enthalpyKJPerKg,
      hotOut.massFlowRatio * (hotIn.enthalpyKJPerKg - hotOut.enthalpyKJPerKg),
      { rel: 1e-12 },
      'regenerator energy balance',
    );
    expectClose(
      result.regeneratorDutyKJPerKg,
      coldOut.enthalpyKJPerKg - coldIn.enthalpyKJPerKg,
      { rel: 1e-12 },
      'duty',
    );
  });

  it('leaves at ambient pressure and numbers the states in flow order', () => {
    const ambientKPa = input.ambient.pressureKPa!;
    expectClose(states[states.length - 1].pressureKPa, ambientKPa, { rel: 1e-12 }, 'exhaust pressure');
    expectClose(result.exhaustTemperatureK, states[states.length - 1].temperatureK, { rel: 0 }, 'exhaust temperature');
    states.forEach((s, i) => expect(s.n).toBe(i + 1));
  });

  it('delivers the overall pressure ratio with intercooler losses included', () => {
    const lastCompressor = [...states].reverse().find((s) => s.label.startsWith('compressor'))!;
    expectClose(
      lastCompressor.pressureKPa / states[0].pressureKPa,
      input.compressor.pressureRatio,
      { rel: 1e-12 },
      'pressure ratio',
    );
  });

  it('draws a closed T-s loop whose ends are the state points', () => {
    expect(result.paths.length).toBe(states.length);
    for (const path of result.paths) {
      const from = states[path.from - 1];
      const to = states[path.to - 1];
      expect(path.temperatureK.length).toBeGreaterThan(2);
      expectClose(path.temperatureK[0], from.temperatureK, { rel: 1e-12 }, 'path start T');
      expectClose(path.entropyKJPerKgK.at(-1)!, to.entropyKJPerKgK, { rel: 1e-12 }, 'path end s');
      for (const v of [...path.temperatureK, ...path.entropyKJPerKgK]) expect(Number.isFinite(v)).toBe(true);
    }
  });

  it('keeps inner path points to drawing resolution (0.01 K, 0.01 J/(kg·K)) in the order of the process', () => {
    for (const path of result.paths) {
      const inner = (v: number[]) => v.slice(1, -1);
      for (const t of inner(path.temperatureK)) expect(Math.abs(t * 100 - Math.round(t * 100))).toBeLessThan(1e-6);
      for (const s of inner(path.entropyKJPerKgK)) expect(Math.abs(s * 1e5 - Math.round(s * 1e5))).toBeLessThan(1e-6);
      // Temperatures run one way from the first state to the second, as before rounding.
      const t = path.temperatureK;
      const rising = t.at(-1)! > t[0];
      for (let j = 1; j < t.length; j++) expect(rising ? t[j] >= t[j - 1] : t[j] <= t[j - 1]).toBe(true);
      // Each inner point within half the resolution of the straight-line spacing in T.
      t.forEach((tj, j) => {
        const even = t[0] + ((t.at(-1)! - t[0]) * j) / (t.length - 1);
        expect(Math.abs(tj - even)).toBeLessThanOrEqual(0.005 + 1e-9);
      });
    }
  });
});

describe('combustion details', () => {
  it('reheat burns more fuel in the products', () => {
    const result = evaluateCycle(irrCombustion, { paths: false });
    const combustor = byLabel(result, 'combustor exit');
    const reheater = byLabel(result, 'reheater 1 exit');
    expect(reheater.massFlowRatio).toBeGreaterThan(combustor.massFlowRatio);
    expectClose(reheater.massFlowRatio, 1 + result.fuelAirRatio!, { rel: 1e-12 }, 'total fuel');
  });

  it('heat input is fuel × LHV at 298.15 K', () => {
    const result = evaluateCycle(simpleCombustion, { paths: false });
    expectClose(
      result.heatInputKJPerKg,
      result.fuelAirRatio! * result.fuelLowerHeatingValueKJPerKg!,
      { rel: 1e-12 },
      'heat input',
    );
  });

  it('methane needs roughly 2 % fuel by mass to reach 1500 K from 700 K', () => {
    // Common practice: gas-turbine combustors run at fuel–air ratios of about 0.015–0.025.
    const result = evaluateCycle(simpleCombustion, { paths: false });
    expect(result.fuelAirRatio!).toBeGreaterThan(0.015);
    expect(result.fuelAirRatio!).toBeLessThan(0.03);
  });

  it('hydrogen makes no CO2 and methane about 0.2 kg/kWh of heat', () => {
    const h2 = evaluateCycle(
      variant(simpleCombustion, (c) => (c.fuel.hydrogenVolumeFraction = 1)),
      { paths: false },
    );
    expect(h2.co2KgPerMWh).toBe(0);
    const ch4 = evaluateCycle(simpleCombustion, { paths: false });
    // CH4: 44.01/16.04 kg CO2 per kg over 50.0 MJ/kg ≈ 0.198 kg/kWh of fuel heat (stoichiometry, common practice).
    expectClose(
      ((ch4.co2KgPerMWh! / ch4.heatRateKJPerKWh!) * 3600) / 1000,
      0.1975,
      { rel: 0.01 },
      'CO2 per kWh of heat',
    );
  });

  it('flows follow the required power', () => {
    const result = evaluateCycle(irrCombustion, { paths: false });
    expectClose(
      result.airMassFlowKgPerS! * result.netWorkKJPerKg * irrCombustion.generatorEfficiency,
      irrCombustion.netPowerKW,
      { rel: 1e-12 },
      'electric power',
    );
    expectClose(
      result.heatRateKJPerKWh!,
      3600 / (result.thermalEfficiency * irrCombustion.generatorEfficiency),
      { rel: 1e-12 },
      'heat rate',
    );
  });
});

describe('warnings', () => {
  it('flags a regenerator that would cool the air', () => {
    const input = variant(irrAir, (c) => {
      c.compressor.stages = 1;
      c.compressor.pressureRatio = 40;
      c.turbine.stages = 1;
      c.turbine.inletTemperatureK = 1100;
    });
    const result = evaluateCycle(input, { paths: false });
    expect(result.warnings.map((w) => w.code)).toContain('regenerator-cools-air');
    expect(result.regeneratorDutyKJPerKg).toBeLessThan(0);
  });

  it('flags limits of the design basis', () => {
    const input = variant(simpleAir, (c) => {
      c.limits = { maxTurbineInletTemperatureK: 1400, exhaustTemperatureMinK: 900, exhaustTemperatureMaxK: 950 };
    });
    const codes = evaluateCycle(input, { paths: false }).warnings.map((w) => w.code);
    expect(codes).toContain('turbine-inlet-above-limit');
    expect(codes).toContain('exhaust-below-window');
  });

  it('reports no net work without inventing flows', () => {
    const input = variant(simpleAir, (c) => {
      c.turbine.inletTemperatureK = 700;
      c.compressor.pressureRatio = 12;
    });
    const result = evaluateCycle(input, { paths: false });
    expect(result.netWorkKJPerKg).toBeLessThan(0);
    expect(result.airMassFlowKgPerS).toBeNull();
    expect(result.warnings.map((w) => w.code)).toContain('no-net-work');
  });
});
