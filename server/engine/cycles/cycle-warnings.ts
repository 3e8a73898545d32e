import type { ResolvedInput } from './resolve-input';
import type { CycleWarning } from './types';

/** Above this burner exit temperature the products dissociate noticeably, which complete combustion ignores (common practice). */
const DISSOCIATION_WARNING_K = 2200;

/**
 * Warnings about the input alone: values outside the ranges of common practice (PRODUCT
 * defaults table), and a relative humidity the constant-cp mode leaves out (its cold-air
 * standard is dry air; the humidity is warned about, not refused, so one design basis
 * serves every working fluid).
 */
export function inputWarnings(r: ResolvedInput, warnings: CycleWarning[]): void {
  typicalRangeWarnings(r, warnings);
  if (r.fluid === 'constant-cp-air' && r.relativeHumidity > 0) {
    warnings.push({
      code: 'humidity-ignored',
      field: 'ambient.relativeHumidity',
      message: `The constant-cp working fluid is dry air: the relative humidity of ${r.relativeHumidity} is left out of the result.`,
    });
  }
}

/** Warnings from the ranges of common practice (PRODUCT defaults table). */
function typicalRangeWarnings(r: ResolvedInput, warnings: CycleWarning[]): void {
  checkTypical(
    warnings,
    r.compressorEfficiency,
    0.75,
    0.95,
    'compressor.isentropicEfficiency',
    'A compressor stage isentropic efficiency',
  );
  checkTypical(
    warnings,
    r.turbineEfficiency,
    0.75,
    0.95,
    'turbine.isentropicEfficiency',
    'A turbine stage isentropic efficiency',
  );
  checkTypical(warnings, r.combustorPressureLoss, 0.01, 0.08, 'combustorPressureLoss', 'A combustor pressure loss');
  if (r.compressorStages > 1) {
    checkTypical(
      warnings,
      r.intercoolerPressureLoss,
      0,
      0.05,
      'compressor.intercoolerPressureLoss',
      'An intercooler pressure loss',
    );
  }
  if (r.regenerator) {
    checkTypical(
      warnings,
      r.regenerator.effectiveness,
      0.5,
      0.95,
      'regenerator.effectiveness',
      'A regenerator effectiveness',
    );
    checkTypical(
      warnings,
      r.regenerator.airSidePressureLoss,
      0,
      0.08,
      'regenerator.airSidePressureLoss',
      'A regenerator air-side pressure loss',
    );
    checkTypical(
      warnings,
      r.regenerator.gasSidePressureLoss,
      0,
      0.08,
      'regenerator.gasSidePressureLoss',
      'A regenerator gas-side pressure loss',
    );
  }
  checkTypical(warnings, r.generatorEfficiency, 0.95, 1, 'generatorEfficiency', 'A generator efficiency');
}

// A module function, not a closure inside typicalRangeWarnings: the transpiler names every
// closure it creates (a property definition on each call), which cost more than the checks.
function checkTypical(
  warnings: CycleWarning[],
  value: number,
  low: number,
  high: number,
  field: string,
  what: string,
): void {
  if (value < low || value > high) {
    warnings.push({
      code: 'outside-typical-range',
      field,
      message: `${what} of ${value} is outside the usual ${low}–${high}.`,
    });
  }
}

/**
 * Warnings about the result: the limits of the design basis (turbine inlet and reheat,
 * exhaust window) and dissociation above 2200 K at a burner exit in combustion mode.
 */
export function resultWarnings(
  r: ResolvedInput,
  exhaustK: number,
  combustion: boolean,
  warnings: CycleWarning[],
): void {
  const limit = r.maxTurbineInletTemperatureK;
  if (limit !== null && r.turbineInletTemperatureK > limit) {
    warnings.push({
      code: 'turbine-inlet-above-limit',
      field: 'turbine.inletTemperatureK',
      message: `The turbine inlet temperature (${r.turbineInletTemperatureK} K) is above the limit of the design basis (${limit} K).`,
    });
  }
  if (limit !== null && r.turbineStages > 1 && r.reheatTemperatureK > limit) {
    warnings.push({
      code: 'turbine-inlet-above-limit',
      field: 'turbine.reheatTemperatureK',
      message: `The reheat temperature (${r.reheatTemperatureK} K) is above the turbine inlet limit of the design basis (${limit} K).`,
    });
  }
  if (r.exhaustTemperatureMinK !== null && exhaustK < r.exhaustTemperatureMinK) {
    warnings.push({
      code: 'exhaust-below-window',
      message: `The exhaust leaves at ${exhaustK.toFixed(1)} K, below the window of the design basis (from ${r.exhaustTemperatureMinK} K).`,
    });
  }
  if (r.exhaustTemperatureMaxK !== null && exhaustK > r.exhaustTemperatureMaxK) {
    warnings.push({
      code: 'exhaust-above-window',
      message: `The exhaust leaves at ${exhaustK.toFixed(1)} K, above the window of the design basis (up to ${r.exhaustTemperatureMaxK} K).`,
    });
  }
  const hottest = Math.max(r.turbineInletTemperatureK, r.turbineStages > 1 ? r.reheatTemperatureK : 0);
  if (combustion && hottest > DISSOCIATION_WARNING_K) {
    warnings.push({
      code: 'dissociation-neglected',
      field: 'turbine.inletTemperatureK',
      message: `Above about ${DISSOCIATION_WARNING_K} K the products dissociate; complete combustion overstates the temperature reached per kg of fuel.`,
    });
  }
}
