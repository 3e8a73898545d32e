import { describe, expect, it } from 'vitest';

import { evaluateCycle, type CycleInput } from '@/server/engine';
import { makeFuel } from '@/server/engine/processes/combustion';
import { speciesMolarEnthalpy } from '@/server/engine/properties/nasa-species';
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

/** Enthalpy of the unburnt fuel per kg at a temperature, straight from the species data. */
function fuelEnthalpy(hydrogenVolumeFraction: number, temperatureK: number): number {
  const x = hydrogenVolumeFraction;
  return (
    ((1 - x) * speciesMolarEnthalpy('CH4', temperatureK) + x * speciesMolarEnthalpy('H2', temperatureK)) /
    makeFuel(x).molarMassKgPerKmol
  );
}

describe.each(configurations)('%s', (_name, input) => {
  const result = evaluateCycle(input);
  const states = result.states;

  it('works add up from the state enthalpies', () => {
    let compressor = 0;
    let turbine = 0;
    for (let i = 1; i < states.length; i++) {
      const a = states[i - 1];
      const b = states[i];
      if (b.label.startsWith('compressor')) compressor += b.enthalpyKJPerKg - a.enthalpyKJPerKg;
      if (b.label.startsWith('turbine')) turbine += b.massFlowRatio * (a.enthalpyKJPerKg - b.enthalpyKJPerKg);
    }
    expectClose(result.compressorWorkKJPerKg, compressor, { rel: 1e-12 }, 'compressor work');
    expectClose(result.turbineWorkKJPerKg, turbine, { rel: 1e-12 }, 'turbine work');
    expectClose(result.netWorkKJPerKg, turbine - compressor, { rel: 1e-12 }, 'net work');
  });

  it('closes the energy balance of the whole plant: net work = heat in − heat out, to 1e-9', () => {
    const inlet = states[0];
    const exhaust = states[states.length - 1];
    let intercoolerHeat = 0;
    for (let i = 1; i < states.length; i++) {
      if (states[i].label.startsWith('intercooler'))
        intercoolerHeat += states[i - 1].enthalpyKJPerKg - states[i].enthalpyKJPerKg;
    }
    let netFromBoundary: number;
    if (input.fluid === 'combustion') {
      // Absolute enthalpies: air and fuel in, exhaust and intercooler heat out.
      const f = result.fuelAirRatio!;
      const fuelIn = f * fuelEnthalpy(input.fuel!.hydrogenVolumeFraction, input.fuel!.temperatureK);
      expectClose(exhaust.massFlowRatio, 1 + f, { rel: 1e-12 }, 'exhaust mass per kg of air');
      netFromBoundary =
        inlet.enthalpyKJPerKg + fuelIn - exhaust.massFlowRatio * exhaust.enthalpyKJPerKg - intercoolerHeat;
    } else {
      const heatOut = exhaust.enthalpyKJPerKg - inlet.enthalpyKJPerKg + intercoolerHeat;
      netFromBoundary = result.heatInputKJPerKg - heatOut;
    }
    expectClose(result.netWorkKJPerKg, netFromBoundary, { rel: 1e-9 }, 'net work from the plant boundary');
    expectClose(
      result.thermalEfficiency,
      result.netWorkKJPerKg / result.heatInputKJPerKg,
      { rel: 1e-12 },
      'efficiency',
    );
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
