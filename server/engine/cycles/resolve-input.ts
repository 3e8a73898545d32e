import { EngineInputError } from '../errors';
import * as limits from '../input-limits';
import { isaPressureKPa } from '../properties/isa-atmosphere';
import type { CycleInput, WorkingFluid } from './types';

// Local copies: an imported binding is a getter once transpiled, read on every check.
const POLYNOMIAL_MIN_K = limits.MIN_TEMPERATURE_K;
const POLYNOMIAL_MAX_K = limits.MAX_TEMPERATURE_K;
const MIN_FUEL_K = limits.MIN_FUEL_TEMPERATURE_K;
const MAX_FUEL_K = limits.MAX_FUEL_TEMPERATURE_K;
const MIN_AMBIENT_KPA = limits.MIN_AMBIENT_PRESSURE_KPA;
const MAX_AMBIENT_KPA = limits.MAX_AMBIENT_PRESSURE_KPA;
const MIN_ELEVATION_M = limits.MIN_ELEVATION_M;
const MAX_ELEVATION_M = limits.MAX_ELEVATION_M;
const MAX_PRESSURE_RATIO = limits.MAX_PRESSURE_RATIO;
const MAX_STAGES = limits.MAX_STAGES;
const MAX_NET_POWER_KW = limits.MAX_NET_POWER_KW;
const DEFAULT_INTERCOOLER_LOSS = limits.DEFAULT_INTERCOOLER_PRESSURE_LOSS;
const DEFAULT_REHEATER_LOSS = limits.DEFAULT_REHEATER_PRESSURE_LOSS;

/** The input with every default filled in and every value checked. */
export interface ResolvedInput {
  readonly ambientTemperatureK: number;
  readonly ambientPressureKPa: number;
  readonly relativeHumidity: number;
  readonly fluid: WorkingFluid;
  readonly fuel: { readonly hydrogenVolumeFraction: number; readonly temperatureK: number } | null;
  readonly compressorStages: number;
  readonly pressureRatio: number;
  readonly compressorEfficiency: number;
  readonly intercoolTemperatureK: number;
  readonly intercoolerPressureLoss: number;
  readonly regenerator: {
    readonly effectiveness: number;
    readonly airSidePressureLoss: number;
    readonly gasSidePressureLoss: number;
  } | null;
  readonly combustorPressureLoss: number;
  readonly turbineStages: number;
  readonly turbineInletTemperatureK: number;
  readonly turbineEfficiency: number;
  readonly reheatTemperatureK: number;
  readonly reheaterPressureLoss: number;
  readonly generatorEfficiency: number;
  readonly netPowerKW: number;
  readonly maxTurbineInletTemperatureK: number | null;
  readonly exhaustTemperatureMinK: number | null;
  readonly exhaustTemperatureMaxK: number | null;
}

function isRecord(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

// The helpers take the value itself (read by the caller as a named property): a property
// read through a variable key is a generic lookup, several times dearer, on every evaluation.
function section(value: unknown, field: string): Record<string, unknown> {
  if (!isRecord(value)) throw new EngineInputError(field, 'is missing; an object is expected.');
  return value;
}

function finite(value: unknown, field: string, fallback?: number): number {
  if (value === undefined && fallback !== undefined) return fallback;
  if (typeof value !== 'number') {
    throw new EngineInputError(field, value === undefined ? 'is missing; a number is expected.' : 'must be a number.');
  }
  if (!Number.isFinite(value)) throw new EngineInputError(field, 'must be a finite number.');
  return value;
}

function fraction(given: unknown, field: string, what: string, fallback?: number): number {
  const value = finite(given, field, fallback);
  if (!(value >= 0 && value <= 1)) throw new EngineInputError(field, `${what} must be between 0 and 1; got ${value}.`);
  return value;
}

function efficiency(given: unknown, field: string, what: string): number {
  const value = finite(given, field);
  if (!(value > 0 && value <= 1)) {
    throw new EngineInputError(field, `${what} must be above 0 and at most 1; got ${value}.`);
  }
  return value;
}

function pressureLoss(given: unknown, field: string, what: string, fallback?: number): number {
  const value = finite(given, field, fallback);
  if (!(value >= 0 && value < 1)) {
    throw new EngineInputError(field, `${what} must be a fraction from 0 up to (not including) 1; got ${value}.`);
  }
  return value;
}

function stageCount(given: unknown, field: string, what: string): number {
  const value = finite(given, field);
  if (!(value >= 1 && value <= MAX_STAGES)) {
    throw new EngineInputError(field, `${what} must be at least 1 and at most ${MAX_STAGES}; got ${value}.`);
  }
  if (!Number.isInteger(value)) {
    throw new EngineInputError(field, `${what} must be a whole number; got ${value}.`);
  }
  return value;
}

function temperature(given: unknown, field: string, what: string, fallback?: number): number {
  const value = finite(given, field, fallback);
  if (!(value >= POLYNOMIAL_MIN_K && value <= POLYNOMIAL_MAX_K)) {
    throw new EngineInputError(
      field,
      `${what} must be within the range of the property data, ${POLYNOMIAL_MIN_K}–${POLYNOMIAL_MAX_K} K; got ${value} K.`,
    );
  }
  return value;
}

/** The fuel temperature at the burner: the range fuel-gas systems see (see input-limits.ts). */
function fuelTemperature(given: unknown): number {
  const value = finite(given, 'fuel.temperatureK');
  if (!(value >= MIN_FUEL_K && value <= MAX_FUEL_K)) {
    throw new EngineInputError(
      'fuel.temperatureK',
      `The fuel temperature must be at least ${MIN_FUEL_K} K and at most ${MAX_FUEL_K} K (the range of fuel-gas supply and heating); got ${value} K.`,
    );
  }
  return value;
}

function optionalLimit(parent: Record<string, unknown> | null, key: string, field: string): number | null {
  if (!parent || parent[key] === undefined || parent[key] === null) return null;
  const value = finite(parent[key], field);
  if (!(value > 0)) throw new EngineInputError(field, `must be a temperature above 0 K; got ${value}.`);
  return value;
}

/**
 * Checks an input and fills its defaults. Throws EngineInputError naming the first
 * field that is missing, not a finite number, or physically impossible.
 */
export function resolveInput(input: CycleInput): ResolvedInput {
  const root: unknown = input;
  if (!isRecord(root)) throw new EngineInputError('(body)', 'The cycle input must be an object.');

  const ambient = section(root.ambient, 'ambient');
  const ambientTemperatureK = temperature(ambient.temperatureK, 'ambient.temperatureK', 'The ambient temperature');
  const hasPressure = ambient.pressureKPa !== undefined && ambient.pressureKPa !== null;
  const hasElevation = ambient.elevationM !== undefined && ambient.elevationM !== null;
  if (hasPressure && hasElevation) {
    throw new EngineInputError('ambient.pressureKPa', 'Give either the ambient pressure or the elevation, not both.');
  }
  let ambientPressureKPa: number;
  if (hasPressure) {
    ambientPressureKPa = finite(ambient.pressureKPa, 'ambient.pressureKPa');
    if (!(ambientPressureKPa >= MIN_AMBIENT_KPA && ambientPressureKPa <= MAX_AMBIENT_KPA)) {
      throw new EngineInputError(
        'ambient.pressureKPa',
        `The ambient pressure must be at least ${MIN_AMBIENT_KPA} kPa and at most ${MAX_AMBIENT_KPA} kPa (sites from 20 000 m up to below sea level); got ${ambientPressureKPa}.`,
      );
    }
  } else if (hasElevation) {
    const elevationM = finite(ambient.elevationM, 'ambient.elevationM');
    if (!(elevationM >= MIN_ELEVATION_M && elevationM <= MAX_ELEVATION_M)) {
      throw new EngineInputError(
        'ambient.elevationM',
        `The elevation must be at least ${MIN_ELEVATION_M} m and at most ${MAX_ELEVATION_M} m (the standard atmosphere used); got ${elevationM}.`,
      );
    }
    ambientPressureKPa = isaPressureKPa(elevationM);
  } else {
    throw new EngineInputError('ambient.pressureKPa', 'Give the ambient pressure or the elevation.');
  }
  const relativeHumidity = fraction(ambient.relativeHumidity, 'ambient.relativeHumidity', 'The relative humidity');

  const fluid = root.fluid;
  if (fluid !== 'variable-cp-air' && fluid !== 'combustion' && fluid !== 'constant-cp-air') {
    throw new EngineInputError(
      'fluid',
      'The working fluid must be "variable-cp-air", "combustion" or "constant-cp-air".',
    );
  }

  let fuel: ResolvedInput['fuel'] = null;
  if (root.fuel !== undefined && root.fuel !== null) {
    const f = section(root.fuel, 'fuel');
    fuel = {
      hydrogenVolumeFraction: fraction(
        f.hydrogenVolumeFraction,
        'fuel.hydrogenVolumeFraction',
        'The hydrogen volume fraction',
      ),
      temperatureK: fuelTemperature(f.temperatureK),
    };
  } else if (fluid === 'combustion') {
    throw new EngineInputError('fuel', 'The combustion working fluid needs a fuel.');
  }

  const compressor = section(root.compressor, 'compressor');
  const compressorStages = stageCount(compressor.stages, 'compressor.stages', 'The number of compressor stages');
  const pressureRatio = finite(compressor.pressureRatio, 'compressor.pressureRatio');
  if (!(pressureRatio > 1 && pressureRatio <= MAX_PRESSURE_RATIO)) {
    throw new EngineInputError(
      'compressor.pressureRatio',
      `The pressure ratio must be above 1 and at most ${MAX_PRESSURE_RATIO}; got ${pressureRatio}.`,
    );
  }
  const compressorEfficiency = efficiency(
    compressor.isentropicEfficiency,
    'compressor.isentropicEfficiency',
    'The compressor isentropic efficiency',
  );
  const intercoolTemperatureK = temperature(
    compressor.intercoolTemperatureK,
    'compressor.intercoolTemperatureK',
    'The intercooling temperature',
    ambientTemperatureK,
  );
  const intercoolerPressureLoss = pressureLoss(
    compressor.intercoolerPressureLoss,
    'compressor.intercoolerPressureLoss',
    'The intercooler pressure loss',
    DEFAULT_INTERCOOLER_LOSS,
  );

  let regenerator: ResolvedInput['regenerator'] = null;
  if (root.regenerator !== undefined && root.regenerator !== null) {
    const r = section(root.regenerator, 'regenerator');
    regenerator = {
      effectiveness: fraction(r.effectiveness, 'regenerator.effectiveness', 'The regenerator effectiveness'),
      airSidePressureLoss: pressureLoss(
        r.airSidePressureLoss,
        'regenerator.airSidePressureLoss',
        'The regenerator air-side pressure loss',
      ),
      gasSidePressureLoss: pressureLoss(
        r.gasSidePressureLoss,
        'regenerator.gasSidePressureLoss',
        'The regenerator gas-side pressure loss',
      ),
    };
  }

  const combustorPressureLoss = pressureLoss(
    root.combustorPressureLoss,
    'combustorPressureLoss',
    'The combustor pressure loss',
  );

  const turbine = section(root.turbine, 'turbine');
  const turbineStages = stageCount(turbine.stages, 'turbine.stages', 'The number of turbine stages');
  const turbineInletTemperatureK = temperature(
    turbine.inletTemperatureK,
    'turbine.inletTemperatureK',
    'The turbine inlet temperature',
  );
  const turbineEfficiency = efficiency(
    turbine.isentropicEfficiency,
    'turbine.isentropicEfficiency',
    'The turbine isentropic efficiency',
  );
  const reheatTemperatureK = temperature(
    turbine.reheatTemperatureK,
    'turbine.reheatTemperatureK',
    'The reheat temperature',
    turbineInletTemperatureK,
  );
  const reheaterPressureLoss = pressureLoss(
    turbine.reheaterPressureLoss,
    'turbine.reheaterPressureLoss',
    'The reheater pressure loss',
    DEFAULT_REHEATER_LOSS,
  );

  const generatorEfficiency = efficiency(root.generatorEfficiency, 'generatorEfficiency', 'The generator efficiency');
  const netPowerKW = finite(root.netPowerKW, 'netPowerKW');
  if (!(netPowerKW > 0 && netPowerKW <= MAX_NET_POWER_KW)) {
    throw new EngineInputError(
      'netPowerKW',
      `The required net power must be above 0 kW and at most ${MAX_NET_POWER_KW} kW; got ${netPowerKW}.`,
    );
  }

  const limits = isRecord(root.limits) ? root.limits : null;
  if (root.limits !== undefined && root.limits !== null && !limits) {
    throw new EngineInputError('limits', 'must be an object.');
  }
  const exhaustTemperatureMinK = optionalLimit(limits, 'exhaustTemperatureMinK', 'limits.exhaustTemperatureMinK');
  const exhaustTemperatureMaxK = optionalLimit(limits, 'exhaustTemperatureMaxK', 'limits.exhaustTemperatureMaxK');
  if (
    exhaustTemperatureMinK !== null &&
    exhaustTemperatureMaxK !== null &&
    exhaustTemperatureMinK > exhaustTemperatureMaxK
  ) {
    throw new EngineInputError(
      'limits.exhaustTemperatureMaxK',
      'The top of the exhaust temperature window must not be below its bottom.',
    );
  }

  return {
    ambientTemperatureK,
    ambientPressureKPa,
    relativeHumidity,
    fluid,
    fuel,
    compressorStages,
    pressureRatio,
    compressorEfficiency,
    intercoolTemperatureK,
    intercoolerPressureLoss,
    regenerator,
    combustorPressureLoss,
    turbineStages,
    turbineInletTemperatureK,
    turbineEfficiency,
    reheatTemperatureK,
    reheaterPressureLoss,
    generatorEfficiency,
    netPowerKW,
    maxTurbineInletTemperatureK: optionalLimit(
      limits,
      'maxTurbineInletTemperatureK',
      'limits.maxTurbineInletTemperatureK',
    ),
    exhaustTemperatureMinK,
    exhaustTemperatureMaxK,
  };
}
