import { describe, expect, it } from 'vitest';

import { EngineInputError, evaluateCycle } from '@/server/engine';

import { irrAir, irrCombustion, simpleAir, simpleCombustion, variant } from './cases';

function fieldOf(run: () => unknown): string {
  try {
    run();
  } catch (error) {
    expect(error).toBeInstanceOf(EngineInputError);
    expect((error as EngineInputError).message.length).toBeGreaterThan(5);
    return (error as EngineInputError).field;
  }
  throw new Error('expected an EngineInputError');
}

describe('impossible input names its field', () => {
  const cases: Array<[string, ReturnType<typeof variant>, string]> = [
    ['pressure ratio of 1', variant(simpleAir, (c) => (c.compressor.pressureRatio = 1)), 'compressor.pressureRatio'],
    [
      'pressure ratio below 1',
      variant(simpleAir, (c) => (c.compressor.pressureRatio = 0.5)),
      'compressor.pressureRatio',
    ],
    ['effectiveness above 1', variant(irrAir, (c) => (c.regenerator.effectiveness = 1.2)), 'regenerator.effectiveness'],
    [
      'effectiveness below 0',
      variant(irrAir, (c) => (c.regenerator.effectiveness = -0.1)),
      'regenerator.effectiveness',
    ],
    [
      'compressor efficiency 0',
      variant(simpleAir, (c) => (c.compressor.isentropicEfficiency = 0)),
      'compressor.isentropicEfficiency',
    ],
    [
      'turbine efficiency above 1',
      variant(simpleAir, (c) => (c.turbine.isentropicEfficiency = 1.01)),
      'turbine.isentropicEfficiency',
    ],
    ['generator efficiency 0', variant(simpleAir, (c) => (c.generatorEfficiency = 0)), 'generatorEfficiency'],
    [
      'burner exit below its inlet',
      variant(simpleAir, (c) => (c.turbine.inletTemperatureK = 500)),
      'turbine.inletTemperatureK',
    ],
    [
      'burner exit below its inlet (combustion)',
      variant(simpleCombustion, (c) => (c.turbine.inletTemperatureK = 500)),
      'turbine.inletTemperatureK',
    ],
    [
      'reheat below the stage exit',
      variant(irrAir, (c) => (c.turbine.reheatTemperatureK = 600)),
      'turbine.reheatTemperatureK',
    ],
    [
      'turbine inlet above the data range',
      variant(simpleAir, (c) => (c.turbine.inletTemperatureK = 6500)),
      'turbine.inletTemperatureK',
    ],
    ['ambient below the data range', variant(simpleAir, (c) => (c.ambient.temperatureK = 150)), 'ambient.temperatureK'],
    [
      'more fuel than can burn',
      variant(simpleCombustion, (c) => (c.turbine.inletTemperatureK = 3500)),
      'turbine.inletTemperatureK',
    ],
    [
      'more fuel than can burn in a reheater',
      variant(irrCombustion, (c) => {
        c.turbine.inletTemperatureK = 2000;
        c.turbine.reheatTemperatureK = 3400;
      }),
      'turbine.reheatTemperatureK',
    ],
    [
      'losses that leave no expansion',
      variant(irrAir, (c) => {
        c.compressor.pressureRatio = 1.1;
        c.combustorPressureLoss = 0.08;
      }),
      'compressor.pressureRatio',
    ],
    ['pressure loss of 1', variant(simpleAir, (c) => (c.combustorPressureLoss = 1)), 'combustorPressureLoss'],
    [
      'negative pressure loss',
      variant(irrAir, (c) => (c.regenerator.gasSidePressureLoss = -0.01)),
      'regenerator.gasSidePressureLoss',
    ],
    ['NaN', variant(simpleAir, (c) => (c.turbine.inletTemperatureK = Number.NaN)), 'turbine.inletTemperatureK'],
    [
      'Infinity',
      variant(simpleAir, (c) => (c.compressor.pressureRatio = Number.POSITIVE_INFINITY)),
      'compressor.pressureRatio',
    ],
    ['a string', variant(simpleAir, (c) => (c.compressor.pressureRatio = '15')), 'compressor.pressureRatio'],
    ['a missing value', variant(simpleAir, (c) => delete c.netPowerKW), 'netPowerKW'],
    ['zero stages', variant(simpleAir, (c) => (c.turbine.stages = 0)), 'turbine.stages'],
    ['101 stages', variant(simpleAir, (c) => (c.compressor.stages = 101)), 'compressor.stages'],
    ['fractional stages', variant(simpleAir, (c) => (c.compressor.stages = 1.5)), 'compressor.stages'],
    ['humidity above 1', variant(simpleAir, (c) => (c.ambient.relativeHumidity = 1.5)), 'ambient.relativeHumidity'],
    [
      'air that cannot hold the humidity',
      variant(simpleAir, (c) => {
        c.ambient.temperatureK = 373;
        c.ambient.relativeHumidity = 1;
      }),
      'ambient.relativeHumidity',
    ],
    ['both pressure and elevation', variant(simpleAir, (c) => (c.ambient.elevationM = 100)), 'ambient.pressureKPa'],
    [
      'elevation outside the atmosphere model',
      variant(simpleAir, (c) => {
        delete c.ambient.pressureKPa;
        c.ambient.elevationM = 30000;
      }),
      'ambient.elevationM',
    ],
    [
      'hydrogen fraction above 1',
      variant(simpleCombustion, (c) => (c.fuel.hydrogenVolumeFraction = 1.1)),
      'fuel.hydrogenVolumeFraction',
    ],
    ['combustion without a fuel', variant(simpleCombustion, (c) => delete c.fuel), 'fuel'],
    ['unknown working fluid', variant(simpleAir, (c) => (c.fluid = 'steam')), 'fluid'],
    ['zero power', variant(simpleAir, (c) => (c.netPowerKW = 0)), 'netPowerKW'],
    [
      'a pressure ratio above 200',
      variant(simpleAir, (c) => (c.compressor.pressureRatio = 201)),
      'compressor.pressureRatio',
    ],
    [
      'compression beyond the data range',
      variant(simpleAir, (c) => {
        c.compressor.pressureRatio = 200;
        c.compressor.isentropicEfficiency = 0.1;
      }),
      'compressor.pressureRatio',
    ],
    [
      // 10 intercooled stages deliver at about 340 K; one turbine stage of η 0.2 from 700 K
      // ends near 590 K, but its isentropic exit would be about 155 K, below the data.
      'an isentropic turbine exit below the data range',
      variant(simpleAir, (c) => {
        c.compressor.stages = 10;
        c.compressor.pressureRatio = 200;
        c.turbine.inletTemperatureK = 700;
        c.turbine.isentropicEfficiency = 0.2;
      }),
      'compressor.pressureRatio',
    ],
    ['fuel at 6000 K', variant(irrCombustion, (c) => (c.fuel.temperatureK = 6000)), 'fuel.temperatureK'],
    ['fuel above 600 K', variant(simpleCombustion, (c) => (c.fuel.temperatureK = 601)), 'fuel.temperatureK'],
    ['fuel below 230 K', variant(simpleCombustion, (c) => (c.fuel.temperatureK = 229)), 'fuel.temperatureK'],
    [
      'fuel at 6000 K in an air mode',
      variant(irrAir, (c) => (c.fuel = { hydrogenVolumeFraction: 0, temperatureK: 6000 })),
      'fuel.temperatureK',
    ],
    [
      'ambient pressure of 1e300 kPa',
      variant(irrCombustion, (c) => (c.ambient.pressureKPa = 1e300)),
      'ambient.pressureKPa',
    ],
    ['ambient pressure above 120 kPa', variant(simpleAir, (c) => (c.ambient.pressureKPa = 121)), 'ambient.pressureKPa'],
    ['ambient pressure below 5 kPa', variant(simpleAir, (c) => (c.ambient.pressureKPa = 4)), 'ambient.pressureKPa'],
    ['net power above 10 GW', variant(simpleAir, (c) => (c.netPowerKW = 1e8)), 'netPowerKW'],
    [
      'a regenerator that would heat the air above the turbine inlet',
      variant(irrAir, (c) => {
        c.turbine.stages = 3;
        c.turbine.inletTemperatureK = 2000;
        c.turbine.reheatTemperatureK = 3000;
      }),
      'turbine.inletTemperatureK',
    ],
    [
      'turbine inlet below the compressor delivery, with a regenerator (air)',
      variant(irrAir, (c) => {
        c.compressor.stages = 1;
        c.compressor.pressureRatio = 30;
        c.turbine.inletTemperatureK = 700;
      }),
      'turbine.inletTemperatureK',
    ],
    [
      'turbine inlet below the compressor delivery, with a regenerator (combustion)',
      variant(irrCombustion, (c) => {
        c.compressor.stages = 1;
        c.compressor.pressureRatio = 30;
        c.turbine.inletTemperatureK = 700;
      }),
      'turbine.inletTemperatureK',
    ],
    [
      'more fuel than the air can burn in an air mode (combustor)',
      variant(simpleAir, (c) => {
        c.fuel = { hydrogenVolumeFraction: 0, temperatureK: 298.15 };
        c.turbine.inletTemperatureK = 3500;
      }),
      'turbine.inletTemperatureK',
    ],
    [
      'more fuel than the air can burn in an air mode (reheaters)',
      variant(simpleAir, (c) => {
        c.fuel = { hydrogenVolumeFraction: 0, temperatureK: 298.15 };
        c.turbine.stages = 4;
        c.turbine.inletTemperatureK = 2000;
        c.turbine.reheatTemperatureK = 3000;
      }),
      'turbine.reheatTemperatureK',
    ],
  ];

  it.each(cases)('%s', (_name, input, field) => {
    expect(fieldOf(() => evaluateCycle(input))).toBe(field);
  });

  it.each([
    ['1e20 stages', variant(simpleAir, (c) => (c.compressor.stages = 1e20)), 'at most 100'],
    ['1.5 stages', variant(simpleAir, (c) => (c.compressor.stages = 1.5)), 'whole number'],
    ['an infinite temperature', variant(simpleAir, (c) => (c.turbine.inletTemperatureK = Infinity)), 'finite'],
    ['a string', variant(simpleAir, (c) => (c.netPowerKW = '5')), 'must be a number'],
    ['a negative limit', variant(simpleAir, (c) => (c.limits = { exhaustTemperatureMinK: -5 })), 'above 0 K'],
    ['a pressure ratio of 1e9', variant(simpleAir, (c) => (c.compressor.pressureRatio = 1e9)), 'at most 200'],
  ])('says what is wrong with %s', (_name, input, words) => {
    try {
      evaluateCycle(input);
    } catch (error) {
      expect((error as EngineInputError).message).toContain(words);
      return;
    }
    throw new Error('expected an EngineInputError');
  });

  it('a non-object input', () => {
    expect(fieldOf(() => evaluateCycle(null as never))).toBe('(body)');
  });
});

describe('elevation instead of pressure', () => {
  it('uses the standard atmosphere', () => {
    const input = variant(simpleAir, (c) => {
      delete c.ambient.pressureKPa;
      c.ambient.elevationM = 1000;
    });
    // ISA at 1000 m: 89.876 kPa (ICAO standard atmosphere table, from memory).
    expect(evaluateCycle(input, { paths: false }).states[0].pressureKPa).toBeCloseTo(89.876, 2);
  });
});

describe('warned, not refused', () => {
  it('a relative humidity in the constant-cp mode, which is dry air', () => {
    const humid = variant(simpleAir, (c) => (c.fluid = 'constant-cp-air'));
    const warning = evaluateCycle(humid, { paths: false }).warnings.find((w) => w.code === 'humidity-ignored');
    expect(warning?.field).toBe('ambient.relativeHumidity');
    const dry = variant(humid, (c) => (c.ambient.relativeHumidity = 0));
    expect(evaluateCycle(dry, { paths: false }).warnings.map((w) => w.code)).not.toContain('humidity-ignored');
    // The humidity changes nothing in that mode.
    expect(evaluateCycle(dry, { paths: false }).netWorkKJPerKg).toBe(
      evaluateCycle(humid, { paths: false }).netWorkKJPerKg,
    );
  });
});
