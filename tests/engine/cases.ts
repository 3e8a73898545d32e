import type { CycleInput, CycleResult, StatePoint } from '@/server/engine';

/** ISO reference ambient: 15 °C, 101.325 kPa, 60 % RH (common practice). */
export const ISO_AMBIENT = { temperatureK: 288.15, pressureKPa: 101.325, relativeHumidity: 0.6 } as const;

export const simpleAir: CycleInput = {
  ambient: ISO_AMBIENT,
  fluid: 'variable-cp-air',
  compressor: { stages: 1, pressureRatio: 15, isentropicEfficiency: 0.88 },
  regenerator: null,
  combustorPressureLoss: 0.04,
  turbine: { stages: 1, inletTemperatureK: 1500, isentropicEfficiency: 0.9 },
  generatorEfficiency: 0.985,
  netPowerKW: 50_000,
};

export const irrAir: CycleInput = {
  ambient: ISO_AMBIENT,
  fluid: 'variable-cp-air',
  compressor: { stages: 2, pressureRatio: 12, isentropicEfficiency: 0.88, intercoolerPressureLoss: 0.02 },
  regenerator: { effectiveness: 0.85, airSidePressureLoss: 0.03, gasSidePressureLoss: 0.03 },
  combustorPressureLoss: 0.04,
  turbine: { stages: 2, inletTemperatureK: 1500, isentropicEfficiency: 0.9, reheaterPressureLoss: 0.02 },
  generatorEfficiency: 0.985,
  netPowerKW: 50_000,
};

export const irrCombustion: CycleInput = {
  ...irrAir,
  fluid: 'combustion',
  fuel: { hydrogenVolumeFraction: 0.3, temperatureK: 298.15 },
};

export const simpleCombustion: CycleInput = {
  ...simpleAir,
  fluid: 'combustion',
  fuel: { hydrogenVolumeFraction: 0, temperatureK: 298.15 },
};

/** A deep copy with changes applied by a function (tests mutate freely). */
export function variant(base: CycleInput, change: (input: any) => void): CycleInput {
  const copy = structuredClone(base) as any;
  change(copy);
  return copy;
}

/** The state of a result with this label; throws if there is none. */
export function byLabel(result: CycleResult, label: string): StatePoint {
  const state = result.states.find((s) => s.label === label);
  if (!state) throw new Error(`no state "${label}"`);
  return state;
}
