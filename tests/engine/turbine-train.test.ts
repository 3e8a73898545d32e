import { describe, expect, it } from 'vitest';

import { evaluateCycle } from '@/server/engine';
import { burnToTemperature, makeFuel, makeStream } from '@/server/engine/processes/combustion';
import { expand } from '@/server/engine/processes/expansion';
import { regenerate } from '@/server/engine/processes/heat-exchange';
import { humidAir } from '@/server/engine/properties/humid-air';
import { expectClose } from '@/tests/helpers/expect-close';

import { byLabel, irrCombustion, ISO_AMBIENT, variant } from './cases';

/**
 * The cycle runs its hot section through a lean pass on scalars (cycles/turbine-train.ts).
 * Rebuilt here step by step from the plain process functions at the converged combustor
 * inlet, the same states and the regenerator effectiveness must come out.
 */
describe.each([
  ['2+2 combustion, 30 % hydrogen', irrCombustion],
  [
    '3+3 combustion, methane, reheat below the inlet',
    variant(irrCombustion, (c) => {
      c.compressor.stages = 3;
      c.turbine.stages = 3;
      c.compressor.pressureRatio = 18;
      c.turbine.reheatTemperatureK = 1400;
      c.fuel.hydrogenVolumeFraction = 0;
      c.fuel.temperatureK = 350;
    }),
  ],
])('the turbine train agrees with the process functions: %s', (_name, input) => {
  const result = evaluateCycle(input, { paths: false });
  const states = result.states;
  const air = makeStream(
    humidAir(ISO_AMBIENT.temperatureK, ISO_AMBIENT.pressureKPa, ISO_AMBIENT.relativeHumidity).amountsPerKg,
  );
  const fuel = makeFuel(input.fuel!.hydrogenVolumeFraction);
  const fuelK = input.fuel!.temperatureK;
  const m = input.turbine.stages;

  it('burns the same fuel and expands to the same states', () => {
    const coldOut = byLabel(result, 'regenerator cold out');
    let burnt = burnToTemperature(air, coldOut.temperatureK, input.turbine.inletTemperatureK, fuel, fuelK);
    if (!burnt.ok) throw new Error('burner failed');
    let stream = burnt.products;
    let state = byLabel(result, 'combustor exit');
    expectClose(state.massFlowRatio, stream.mass, { rel: 1e-12 }, 'combustor exit mass');
    expectClose(
      state.enthalpyKJPerKg,
      stream.gas.enthalpyKJPerKg(state.temperatureK),
      { rel: 1e-12, abs: 1e-9 },
      'combustor exit h',
    );
    expectClose(
      state.entropyKJPerKgK,
      stream.gas.entropyKJPerKgK(state.temperatureK, state.pressureKPa),
      { rel: 1e-12 },
      'combustor exit s',
    );
    for (let j = 1; j <= m; j++) {
      const exit = byLabel(result, m > 1 ? `turbine ${j} exit` : 'turbine exit');
      const expected = expand(
        stream.gas,
        state,
        state.pressureKPa / exit.pressureKPa,
        input.turbine.isentropicEfficiency,
      );
      expectClose(exit.temperatureK, expected.temperatureK, { rel: 1e-11 }, `turbine ${j} exit T`);
      expectClose(exit.enthalpyKJPerKg, expected.enthalpyKJPerKg, { rel: 1e-11, abs: 1e-8 }, `turbine ${j} exit h`);
      expectClose(exit.entropyKJPerKgK, expected.entropyKJPerKgK, { rel: 1e-11 }, `turbine ${j} exit s`);
      if (j === m) break;
      const reheated = byLabel(result, `reheater ${j} exit`);
      burnt = burnToTemperature(stream, exit.temperatureK, reheated.temperatureK, fuel, fuelK);
      if (!burnt.ok) throw new Error('reheater failed');
      stream = burnt.products;
      expectClose(reheated.massFlowRatio, stream.mass, { rel: 1e-11 }, `reheater ${j} exit mass`);
      state = reheated;
    }
  });

  it('meets the regenerator effectiveness (ε = Q / Q_max) to 1e-10', () => {
    const coldOut = byLabel(result, 'regenerator cold out');
    const coldIn = states[states.indexOf(coldOut) - 1];
    const hotOut = byLabel(result, 'regenerator hot out');
    const hotIn = states[states.indexOf(hotOut) - 1];
    // The exhaust gas: the products of all the fuel burnt, in the inlet air.
    const exhaust = makeStream(Array.from(air.amounts, (n, i) => n + result.fuelAirRatio! * fuel.changePerKg[i]));
    const expected = regenerate(
      {
        coldGas: air.gas,
        coldInlet: coldIn,
        coldMass: 1,
        hotGas: exhaust.gas,
        hotInlet: hotIn,
        hotMass: hotIn.massFlowRatio,
      },
      input.regenerator!.effectiveness,
      input.regenerator!.airSidePressureLoss,
      input.regenerator!.gasSidePressureLoss,
    );
    expectClose(result.regeneratorDutyKJPerKg, expected.dutyKJ, { rel: 1e-10 }, 'duty = ε Q_max');
    expectClose(coldOut.temperatureK, expected.coldOutlet.temperatureK, { rel: 1e-11 }, 'cold outlet T');
    expectClose(hotOut.temperatureK, expected.hotOutlet.temperatureK, { rel: 1e-11 }, 'hot outlet T');
    expect(hotOut.pressureKPa).toBeCloseTo(expected.hotOutlet.pressureKPa, 9);
  });
});

describe('scratch reuse', () => {
  it('gives bit-identical results whatever was evaluated before', () => {
    // The turbine train and the product mixtures reuse scratch arrays across evaluations;
    // nothing of one evaluation may leak into the next (not even its seeds).
    const first = JSON.stringify(evaluateCycle(irrCombustion));
    evaluateCycle(
      variant(irrCombustion, (c) => {
        c.compressor.pressureRatio = 30;
        c.turbine.stages = 4;
        c.fuel.hydrogenVolumeFraction = 1;
      }),
    );
    expect(() => evaluateCycle(variant(irrCombustion, (c) => (c.turbine.reheatTemperatureK = 3400)))).toThrow();
    evaluateCycle(variant(irrCombustion, (c) => (c.fluid = 'constant-cp-air')));
    expect(JSON.stringify(evaluateCycle(irrCombustion))).toBe(first);
  });
});
