import { EngineInputError } from '../errors';
import { MAX_SWEEP_POINTS, MIN_SWEEP_POINTS } from '../input-limits';
import { maximizeBrent } from '../solvers/optimum';
import { evaluateStagedCycle } from './staged-cycle';
import { SWEEP_PARAMETERS, type SweepParameter } from './sweep-parameters';
import type { CycleInput, CycleResult } from './types';

export { SWEEP_PARAMETERS, type SweepParameter };
export { MAX_SWEEP_POINTS };

export interface SweepInput {
  /** The cycle every sample starts from. Defaults left out of it (reheat temperature,
   * intercooling temperature) follow the swept value, e.g. reheat follows the turbine inlet. */
  readonly base: CycleInput;
  readonly parameter: SweepParameter;
  /** Range of the parameter, in its own units; `from` < `to`. */
  readonly from: number;
  readonly to: number;
  /** Samples including both ends, 2–1000 (stage counts: at most one per whole number). */
  readonly points: number;
}

/** The figures of one evaluated sample (per kg of compressor inlet air where specific). */
export interface SweepFigures {
  readonly netWorkKJPerKg: number;
  readonly thermalEfficiency: number;
  readonly heatInputKJPerKg: number;
  readonly backWorkRatio: number;
  readonly regeneratorDutyKJPerKg: number;
  readonly exhaustTemperatureK: number;
  readonly fuelAirRatio: number | null;
  readonly airMassFlowKgPerS: number | null;
  readonly heatRateKJPerKWh: number | null;
  readonly co2KgPerMWh: number | null;
  readonly warningCodes: string[];
}

export interface SweepPoint {
  readonly value: number;
  /** null when this value is infeasible; `error` then says why. */
  readonly figures: SweepFigures | null;
  readonly error: { readonly field: string; readonly message: string } | null;
}

export interface SweepOptimum {
  /** The parameter value at the optimum. */
  readonly value: number;
  readonly figures: SweepFigures;
  /** True when the best value lies at an end of the range (the true optimum may be outside it). */
  readonly atRangeEnd: boolean;
}

export interface SweepResult {
  readonly parameter: SweepParameter;
  readonly from: number;
  readonly to: number;
  readonly points: SweepPoint[];
  /** Maximum net work and maximum thermal efficiency over the range; null if no sample was feasible. */
  readonly optimumNetWork: SweepOptimum | null;
  readonly optimumEfficiency: SweepOptimum | null;
}

const INTEGER_PARAMETERS = new Set<SweepParameter>(['compressor.stages', 'turbine.stages']);

/** A copy of `base` with one input replaced; only the touched section is copied. */
export function withParameter(base: CycleInput, parameter: SweepParameter, value: number): CycleInput {
  const dot = parameter.indexOf('.');
  if (dot < 0) return { ...base, [parameter]: value };
  const sectionName = parameter.slice(0, dot) as 'ambient' | 'fuel' | 'compressor' | 'regenerator' | 'turbine';
  const key = parameter.slice(dot + 1);
  const section = base[sectionName];
  if (section === null || section === undefined) {
    throw new EngineInputError('parameter', `The cycle has no ${sectionName}, so ${parameter} cannot be swept.`);
  }
  const copy: Record<string, unknown> = { ...section, [key]: value };
  // Sweeping the elevation replaces a given pressure and the other way round.
  if (parameter === 'ambient.elevationM') delete copy.pressureKPa;
  if (parameter === 'ambient.pressureKPa') delete copy.elevationM;
  return { ...base, [sectionName]: copy } as CycleInput;
}

function figuresOf(result: CycleResult): SweepFigures {
  return {
    netWorkKJPerKg: result.netWorkKJPerKg,
    thermalEfficiency: result.thermalEfficiency,
    heatInputKJPerKg: result.heatInputKJPerKg,
    backWorkRatio: result.backWorkRatio,
    regeneratorDutyKJPerKg: result.regeneratorDutyKJPerKg,
    exhaustTemperatureK: result.exhaustTemperatureK,
    fuelAirRatio: result.fuelAirRatio,
    airMassFlowKgPerS: result.airMassFlowKgPerS,
    heatRateKJPerKWh: result.heatRateKJPerKWh,
    co2KgPerMWh: result.co2KgPerMWh,
    warningCodes: result.warnings.map((w) => w.code),
  };
}

function validateSweep(input: SweepInput): { values: number[]; integer: boolean } {
  if (typeof input !== 'object' || input === null)
    throw new EngineInputError('(body)', 'The sweep input must be an object.');
  if (!(SWEEP_PARAMETERS as readonly string[]).includes(input.parameter)) {
    throw new EngineInputError('parameter', `Unknown sweep parameter; use one of ${SWEEP_PARAMETERS.join(', ')}.`);
  }
  const { from, to, points } = input;
  for (const [field, value] of [
    ['from', from],
    ['to', to],
    ['points', points],
  ] as const) {
    if (typeof value !== 'number' || !Number.isFinite(value))
      throw new EngineInputError(field, 'must be a finite number.');
  }
  if (!(to > from)) throw new EngineInputError('to', `The end of the range must be above its start (${from}).`);
  if (!(points >= MIN_SWEEP_POINTS && points <= MAX_SWEEP_POINTS)) {
    throw new EngineInputError(
      'points',
      `The number of points must be at least ${MIN_SWEEP_POINTS} and at most ${MAX_SWEEP_POINTS}; got ${points}.`,
    );
  }
  if (!Number.isInteger(points)) {
    throw new EngineInputError('points', `The number of points must be a whole number; got ${points}.`);
  }
  const integer = INTEGER_PARAMETERS.has(input.parameter);
  const values: number[] = [];
  if (integer) {
    if (!Number.isInteger(from) || !Number.isInteger(to)) {
      throw new EngineInputError('from', 'A stage count is swept over whole numbers.');
    }
    const count = Math.min(points, to - from + 1);
    for (let i = 0; i < count; i++) {
      const v = Math.round(from + ((to - from) * i) / (count - 1));
      if (values[values.length - 1] !== v) values.push(v);
    }
  } else {
    for (let i = 0; i < points; i++) values.push(i === points - 1 ? to : from + ((to - from) * i) / (points - 1));
  }
  return { values, integer };
}

/**
 * Varies one input over a range and finds the maxima of net work and of thermal
 * efficiency. The samples locate the best one; between its two neighbours the maximum is
 * then refined by Brent's method on the engine itself (stage counts: the best whole
 * number). Infeasible samples are reported with their error, not dropped.
 */
export function sweepStagedCycle(input: SweepInput): SweepResult {
  const { values, integer } = validateSweep(input);
  const evaluate = (value: number): CycleResult =>
    evaluateStagedCycle(withParameter(input.base, input.parameter, value), { paths: false });
  // A swept input in a section the base lacks (the effectiveness of no regenerator) is
  // refused here, once and in its own words, rather than as the error of every sample.
  withParameter(input.base, input.parameter, values[0]);

  const points: SweepPoint[] = values.map((value) => {
    try {
      return { value, figures: figuresOf(evaluate(value)), error: null };
    } catch (error) {
      if (error instanceof EngineInputError)
        return { value, figures: null, error: { field: error.field, message: error.message } };
      throw error;
    }
  });
  if (points.every((p) => p.figures === null)) {
    const first = points[0].error!;
    throw new EngineInputError(first.field, `No value in the range gives a feasible cycle: ${first.message}`);
  }

  const optimum = (score: (f: SweepFigures) => number): SweepOptimum | null => {
    let best = -1;
    for (let i = 0; i < points.length; i++) {
      const f = points[i].figures;
      if (f && Number.isFinite(score(f)) && (best < 0 || score(f) > score(points[best].figures!))) best = i;
    }
    if (best < 0) return null;
    const atRangeEnd = best === 0 || best === points.length - 1;
    const lower = points[best - 1];
    const upper = points[best + 1];
    if (integer || atRangeEnd || !lower?.figures || !upper?.figures) {
      return { value: points[best].value, figures: points[best].figures!, atRangeEnd };
    }
    const found = maximizeBrent(
      (value) => {
        try {
          return score(figuresOf(evaluate(value)));
        } catch (error) {
          if (error instanceof EngineInputError) return -Infinity;
          throw error;
        }
      },
      lower.value,
      upper.value,
      1e-10,
    );
    const value = found.value >= score(points[best].figures!) ? found.x : points[best].value;
    return { value, figures: figuresOf(evaluate(value)), atRangeEnd: false };
  };

  return {
    parameter: input.parameter,
    from: input.from,
    to: input.to,
    points,
    optimumNetWork: optimum((f) => f.netWorkKJPerKg),
    optimumEfficiency: optimum((f) => f.thermalEfficiency),
  };
}
