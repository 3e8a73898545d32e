import { describe, expect, it } from 'vitest';

import { burnToTemperature, makeFuel, makeStream } from '@/server/engine/processes/combustion';
import { stateAt } from '@/server/engine/processes/flow-state';
import { changeTemperature, regenerate } from '@/server/engine/processes/heat-exchange';
import { humidAir } from '@/server/engine/properties/humid-air';
import { expectClose } from '@/tests/helpers/expect-close';

const air = makeStream(humidAir(288.15, 101.325, 0.6).amountsPerKg);

describe('heating or cooling to a set temperature', () => {
  it('reaches the temperature and loses the given fraction of pressure', () => {
    const inlet = stateAt(air.gas, 450, 400);
    const out = changeTemperature(air.gas, inlet, 300, 0.02);
    expect(out.temperatureK).toBe(300);
    expectClose(out.pressureKPa, 392, { rel: 1e-12 }, 'outlet pressure');
    expectClose(out.enthalpyKJPerKg, air.gas.enthalpyKJPerKg(300), { rel: 1e-12 }, 'outlet enthalpy');
  });
});

describe('the regenerator (effectiveness on enthalpy)', () => {
  // Definition (README): Q = ε Q_max, Q_max the smaller of the cold stream heated to the hot
  // inlet temperature and the hot stream cooled to the cold inlet temperature.
  const fuel = makeFuel(0);
  const burnt = burnToTemperature(air, 700, 1500, fuel, 298.15);
  if (!burnt.ok) throw new Error('the test gas should burn');
  const hotMass = 1 + burnt.fuelKg;
  const streams = {
    coldGas: air.gas,
    coldInlet: stateAt(air.gas, 600, 1200),
    coldMass: 1,
    hotGas: burnt.products.gas,
    hotInlet: stateAt(burnt.products.gas, 850, 105),
    hotMass,
  };

  it.each([0, 0.5, 0.85, 1])('passes ε Q_max with the energy balance closed at ε = %s', (effectiveness) => {
    const out = regenerate(streams, effectiveness, 0.03, 0.04);
    const coldMax = air.gas.enthalpyKJPerKg(850) - streams.coldInlet.enthalpyKJPerKg;
    const hotMax = hotMass * (streams.hotInlet.enthalpyKJPerKg - burnt.products.gas.enthalpyKJPerKg(600));
    expectClose(out.dutyKJ, effectiveness * Math.min(coldMax, hotMax), { rel: 1e-12, abs: 1e-12 }, 'duty');
    // Energy balance from the outlet states themselves.
    const coldGain = out.coldOutlet.enthalpyKJPerKg - streams.coldInlet.enthalpyKJPerKg;
    const hotLoss = hotMass * (streams.hotInlet.enthalpyKJPerKg - out.hotOutlet.enthalpyKJPerKg);
    expectClose(coldGain, hotLoss, { rel: 1e-10, abs: 1e-10 }, 'energy balance');
    expectClose(out.coldOutlet.pressureKPa, 1200 * 0.97, { rel: 1e-12 }, 'air-side pressure');
    expectClose(out.hotOutlet.pressureKPa, 105 * 0.96, { rel: 1e-12 }, 'gas-side pressure');
  });

  it('never heats the air above the hot inlet, and generates entropy (second law)', () => {
    const out = regenerate(streams, 1, 0, 0);
    expect(out.coldOutlet.temperatureK).toBeLessThanOrEqual(850 + 1e-9);
    expect(out.hotOutlet.temperatureK).toBeGreaterThanOrEqual(600 - 1e-9);
    const generated =
      out.coldOutlet.entropyKJPerKgK -
      streams.coldInlet.entropyKJPerKgK +
      hotMass * (out.hotOutlet.entropyKJPerKgK - streams.hotInlet.entropyKJPerKgK);
    expect(generated).toBeGreaterThan(0);
  });

  it('passes heat from the air to the gas when the air is the hotter stream', () => {
    const reversed = { ...streams, coldInlet: stateAt(air.gas, 900, 1200) };
    const out = regenerate(reversed, 0.8, 0, 0);
    expect(out.dutyKJ).toBeLessThan(0);
    expect(out.coldOutlet.temperatureK).toBeLessThan(900);
    expect(out.hotOutlet.temperatureK).toBeGreaterThan(850);
  });
});
