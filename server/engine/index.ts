/**
 * Cyclemoot cycle engine: gas-turbine cycles with variable specific heats.
 * Pure and synchronous; SI units (K, kPa, kJ/kg, kJ/(kg·K), kg/s, kW). See README.md.
 */
import { evaluateStagedCycle } from './cycles/staged-cycle';
import { sweepStagedCycle, type SweepInput, type SweepResult } from './cycles/sweep';
import type { CycleInput, CycleResult, EvaluateOptions } from './cycles/types';

export { EngineInputError } from './errors';
export type {
  CycleInput,
  CycleResult,
  CycleWarning,
  EvaluateOptions,
  PathKind,
  ProcessPath,
  StatePoint,
  WorkingFluid,
} from './cycles/types';
export {
  ambientPressureKPa,
  fixMachine,
  humidAirDensity,
  offDesignPoint,
  type Ambient,
  type FixedMachine,
  type OffDesignPoint,
} from './off-design/fixed-machine';
export {
  annualFigures,
  GRID_STEP_K,
  GRID_STEP_RH,
  profileDensities,
  profileSummary,
  RATING_FROM_K,
  RATING_STEP_K,
  RATING_TO_K,
  ratingCurve,
  ratingTemperaturesK,
  siteYear,
  type AmbientProfile,
  type AnnualFigures,
  type RatingPoint,
  type SiteYearOptions,
  type SiteYearResult,
} from './off-design/site-year';
export { MAX_SWEEP_POINTS, SWEEP_PARAMETERS } from './cycles/sweep';
export type { SweepFigures, SweepInput, SweepOptimum, SweepParameter, SweepPoint, SweepResult } from './cycles/sweep';
export {
  DEFAULT_INTERCOOLER_PRESSURE_LOSS,
  DEFAULT_REHEATER_PRESSURE_LOSS,
  MAX_AMBIENT_PRESSURE_KPA,
  MAX_ELEVATION_M,
  MAX_FUEL_TEMPERATURE_K,
  MAX_NET_POWER_KW,
  MAX_PRESSURE_RATIO,
  MAX_STAGES,
  MAX_TEMPERATURE_K,
  MIN_AMBIENT_PRESSURE_KPA,
  MIN_ELEVATION_M,
  MIN_FUEL_TEMPERATURE_K,
  MIN_SWEEP_POINTS,
  MIN_TEMPERATURE_K,
} from './input-limits';

/**
 * Evaluates one cycle. Results per kg of compressor inlet air, states in flow order, T-s
 * paths unless `options.paths` is false. Throws EngineInputError (with the input `field`)
 * on input that is missing, not finite, or physically impossible.
 */
export function evaluateCycle(input: CycleInput, options?: EvaluateOptions): CycleResult {
  return evaluateStagedCycle(input, options);
}

/**
 * Varies one numeric input over a range (samples without T-s paths) and returns the
 * maxima of net work and of thermal efficiency, refined between samples by Brent's method.
 */
export function sweepCycle(input: SweepInput): SweepResult {
  return sweepStagedCycle(input);
}
