import { describe, expect, it } from 'vitest';

import { evaluateCycle, type CycleInput } from '@/server/engine';
import { expectClose } from '@/tests/helpers/expect-close';

const K = 1.4;

function coldAir(pressureRatio: number, regenerator: CycleInput['regenerator']): CycleInput {
  return {
    ambient: { temperatureK: 300, pressureKPa: 100, relativeHumidity: 0 },
    fluid: 'constant-cp-air',
    compressor: { stages: 1, pressureRatio, isentropicEfficiency: 1 },
    regenerator,
    combustorPressureLoss: 0,
    turbine: { stages: 1, inletTemperatureK: 1300, isentropicEfficiency: 1 },
    generatorEfficiency: 1,
    netPowerKW: 1000,
  };
}

describe('constant-cp mode against the cold-air-standard closed forms', () => {
  // Closed forms of the ideal Brayton cycle with constant cp (any thermodynamics text).
  it.each([2, 4, 8, 15, 30])('simple cycle, r = %s: η = 1 − r^((1−k)/k) to 1e-9', (r) => {
    const result = evaluateCycle(coldAir(r, null), { paths: false });
    expectClose(result.thermalEfficiency, 1 - Math.pow(r, (1 - K) / K), { rel: 1e-9 }, 'efficiency');
  });

  it.each([2, 3, 5, 8])('ideal regenerative cycle, r = %s: η = 1 − (T1/T3) r^((k−1)/k) to 1e-9', (r) => {
    const result = evaluateCycle(coldAir(r, { effectiveness: 1, airSidePressureLoss: 0, gasSidePressureLoss: 0 }), {
      paths: false,
    });
    expectClose(result.thermalEfficiency, 1 - (300 / 1300) * Math.pow(r, (K - 1) / K), { rel: 1e-9 }, 'efficiency');
  });

  it('ideal compressor exit temperature is T1 r^((k−1)/k)', () => {
    const result = evaluateCycle(coldAir(10, null), { paths: false });
    expectClose(result.states[1].temperatureK, 300 * Math.pow(10, (K - 1) / K), { rel: 1e-12 }, 'T2');
  });
});

describe('Ericsson limit', () => {
  // Many intercooled and reheated ideal stages with a perfect regenerator approach the
  // Carnot efficiency 1 − T_low / T_high (Ericsson cycle; any thermodynamics text).
  const lowK = 300;
  const highK = 1200;
  const carnot = 1 - lowK / highK;
  const gap = (stages: number) => {
    const input: CycleInput = {
      ambient: { temperatureK: lowK, pressureKPa: 100, relativeHumidity: 0 },
      fluid: 'variable-cp-air',
      compressor: { stages, pressureRatio: 6, isentropicEfficiency: 1, intercoolerPressureLoss: 0 },
      regenerator: { effectiveness: 1, airSidePressureLoss: 0, gasSidePressureLoss: 0 },
      combustorPressureLoss: 0,
      turbine: { stages, inletTemperatureK: highK, isentropicEfficiency: 1, reheaterPressureLoss: 0 },
      generatorEfficiency: 1,
      netPowerKW: 1000,
    };
    return carnot - evaluateCycle(input, { paths: false }).thermalEfficiency;
  };

  it('is under 0.2 percentage points at 100 + 100 stages', () => {
    const g = gap(100);
    expect(g).toBeGreaterThan(0);
    expect(g).toBeLessThan(0.002);
  });

  it('shrinks as 1/N', () => {
    const ratios = [10, 20, 40].map((n) => gap(n) / gap(2 * n));
    for (const ratio of ratios) expectClose(ratio, 2, { rel: 0.05 }, 'gap(N) / gap(2N)');
  });
});
