// Kept apart from sweep.ts so the request contract (shared with the app) can name the
// parameters without pulling the engine into the web bundle.

/** Every numeric input a sweep can vary, by its dotted path. */
export const SWEEP_PARAMETERS = [
  'ambient.temperatureK',
  'ambient.pressureKPa',
  'ambient.elevationM',
  'ambient.relativeHumidity',
  'fuel.hydrogenVolumeFraction',
  'fuel.temperatureK',
  'compressor.stages',
  'compressor.pressureRatio',
  'compressor.isentropicEfficiency',
  'compressor.intercoolTemperatureK',
  'compressor.intercoolerPressureLoss',
  'regenerator.effectiveness',
  'regenerator.airSidePressureLoss',
  'regenerator.gasSidePressureLoss',
  'combustorPressureLoss',
  'turbine.stages',
  'turbine.inletTemperatureK',
  'turbine.isentropicEfficiency',
  'turbine.reheatTemperatureK',
  'turbine.reheaterPressureLoss',
  'generatorEfficiency',
  'netPowerKW',
] as const;

export type SweepParameter = (typeof SWEEP_PARAMETERS)[number];
