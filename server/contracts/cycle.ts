import { z } from 'zod';

import { SWEEP_PARAMETERS } from '@/server/engine/cycles/sweep-parameters';
import {
  DEFAULT_INTERCOOLER_PRESSURE_LOSS,
  DEFAULT_REHEATER_PRESSURE_LOSS,
  MAX_AMBIENT_PRESSURE_KPA,
  MAX_ELEVATION_M,
  MAX_FUEL_TEMPERATURE_K,
  MAX_NET_POWER_KW,
  MAX_PRESSURE_RATIO,
  MAX_STAGES,
  MAX_SWEEP_POINTS,
  MAX_TEMPERATURE_K,
  MIN_AMBIENT_PRESSURE_KPA,
  MIN_ELEVATION_M,
  MIN_FUEL_TEMPERATURE_K,
  MIN_SWEEP_POINTS,
  MIN_TEMPERATURE_K,
} from '@/server/engine/input-limits';

/**
 * Request bodies of the cycle engine (POST /api/cycles/evaluate and /sweep), shared with
 * the app's forms. SI units; pressure losses, efficiencies and effectiveness as fractions.
 * Physically impossible combinations that depend on the computation itself (a burner exit
 * below its inlet, more fuel than can burn, no expansion left) are caught by the engine.
 */

// The limits below are the engine's own (server/engine/input-limits.ts), so form, route and
// engine refuse the same values with the same bounds.

/** Numbers written with a thin grouping space, as on the screens (20 000). */
const figure = (value: number) => value.toLocaleString('en-US').replace(/,/g, ' ');

/** A finite number. An infinity or NaN is a number that is not finite, anything else is not a number. */
const num = (quantity: string) =>
  z.number({
    error: (issue) =>
      issue.input === undefined
        ? `${quantity} is required.`
        : typeof issue.input === 'number'
          ? `${quantity} must be finite.`
          : `${quantity} must be a number.`,
  });

const temperatureK = (
  quantity: string,
  min = MIN_TEMPERATURE_K,
  max = MAX_TEMPERATURE_K,
  why = 'range of the property data',
) =>
  num(quantity)
    .min(min, { error: `${quantity} must be at least ${min} K (${why}).` })
    .max(max, { error: `${quantity} must be at most ${max} K (${why}).` });

/** A temperature limit of the design basis: above 0 K. */
const limitK = (quantity: string) => num(quantity).gt(0, { error: `${quantity} must be above 0 K.` });

const fraction = (quantity: string) =>
  num(quantity)
    .min(0, { error: `${quantity} must be at least 0.` })
    .max(1, { error: `${quantity} must be at most 1.` });

const efficiency = (quantity: string) =>
  num(quantity)
    .gt(0, { error: `${quantity} must be above 0.` })
    .max(1, { error: `${quantity} must be at most 1.` });

const pressureLoss = (quantity: string) =>
  num(quantity)
    .min(0, { error: `${quantity} must be at least 0.` })
    .lt(1, { error: `${quantity} must be below 1 (a fraction of the inlet pressure).` });

// The bounds come before the whole-number check: 1e20 is out of range before it is anything else.
const stages = (quantity: string) =>
  num(quantity)
    .min(1, { error: `${quantity} must be at least 1.` })
    .max(MAX_STAGES, { error: `${quantity} must be at most ${MAX_STAGES}.` })
    .int({ error: `${quantity} must be a whole number.` });

/** Messages for a group of inputs: missing, not an object, or holding unknown fields. */
const group = (what: string) => ({
  error: (issue: { code?: string; input?: unknown; keys?: string[] }) =>
    issue.code === 'unrecognized_keys'
      ? `${what} has unknown fields: ${(issue.keys ?? []).join(', ')}.`
      : issue.input === undefined
        ? `${what} is required.`
        : `${what} must be an object.`,
});

export const ambientSchema = z
  .strictObject(
    {
      temperatureK: temperatureK('Ambient temperature'),
      pressureKPa: num('Ambient pressure')
        .min(MIN_AMBIENT_PRESSURE_KPA, { error: `Ambient pressure must be at least ${MIN_AMBIENT_PRESSURE_KPA} kPa.` })
        .max(MAX_AMBIENT_PRESSURE_KPA, { error: `Ambient pressure must be at most ${MAX_AMBIENT_PRESSURE_KPA} kPa.` })
        .optional(),
      elevationM: num('Elevation')
        .min(MIN_ELEVATION_M, { error: `Elevation must be at least ${figure(MIN_ELEVATION_M).replace('-', '−')} m.` })
        .max(MAX_ELEVATION_M, { error: `Elevation must be at most ${figure(MAX_ELEVATION_M)} m.` })
        .optional(),
      relativeHumidity: fraction('Relative humidity'),
    },
    group('Ambient'),
  )
  .superRefine((value, ctx) => {
    if (value.pressureKPa === undefined && value.elevationM === undefined) {
      ctx.addIssue({ code: 'custom', path: ['pressureKPa'], message: 'Give the ambient pressure or the elevation.' });
    }
    if (value.pressureKPa !== undefined && value.elevationM !== undefined) {
      ctx.addIssue({
        code: 'custom',
        path: ['pressureKPa'],
        message: 'Give either the ambient pressure or the elevation, not both.',
      });
    }
  });

export const fuelSchema = z.strictObject(
  {
    hydrogenVolumeFraction: fraction('Hydrogen volume fraction'),
    temperatureK: temperatureK(
      'Fuel temperature',
      MIN_FUEL_TEMPERATURE_K,
      MAX_FUEL_TEMPERATURE_K,
      'range of fuel-gas supply and heating',
    ),
  },
  group('Fuel'),
);

export const compressorSchema = z.strictObject(
  {
    stages: stages('Number of compressor stages'),
    pressureRatio: num('Pressure ratio')
      .gt(1, { error: 'Pressure ratio must be above 1.' })
      .max(MAX_PRESSURE_RATIO, { error: `Pressure ratio must be at most ${MAX_PRESSURE_RATIO}.` }),
    isentropicEfficiency: efficiency('Compressor isentropic efficiency'),
    /** Default: the ambient temperature (filled in by evaluateRequestSchema and by the engine). */
    intercoolTemperatureK: temperatureK('Intercooling temperature').optional(),
    intercoolerPressureLoss: pressureLoss('Intercooler pressure loss').default(DEFAULT_INTERCOOLER_PRESSURE_LOSS),
  },
  group('Compressor'),
);

export const regeneratorSchema = z.strictObject(
  {
    effectiveness: fraction('Regenerator effectiveness'),
    airSidePressureLoss: pressureLoss('Regenerator air-side pressure loss'),
    gasSidePressureLoss: pressureLoss('Regenerator gas-side pressure loss'),
  },
  group('Regenerator'),
);

export const turbineSchema = z.strictObject(
  {
    stages: stages('Number of turbine stages'),
    inletTemperatureK: temperatureK('Turbine inlet temperature'),
    isentropicEfficiency: efficiency('Turbine isentropic efficiency'),
    /** Default: the turbine inlet temperature. */
    reheatTemperatureK: temperatureK('Reheat temperature').optional(),
    reheaterPressureLoss: pressureLoss('Reheater pressure loss').default(DEFAULT_REHEATER_PRESSURE_LOSS),
  },
  group('Turbine'),
);

export const limitsSchema = z.strictObject(
  {
    maxTurbineInletTemperatureK: limitK('Turbine inlet temperature limit').optional(),
    exhaustTemperatureMinK: limitK('Lowest exhaust temperature').optional(),
    exhaustTemperatureMaxK: limitK('Highest exhaust temperature').optional(),
  },
  group('Limits'),
);

/** One cycle as the engine takes it; defaults that depend on other fields stay optional. */
export const cycleInputSchema = z
  .strictObject(
    {
      ambient: ambientSchema,
      fluid: z.enum(['variable-cp-air', 'combustion', 'constant-cp-air'], {
        error: 'Working fluid must be variable-cp-air, combustion or constant-cp-air.',
      }),
      fuel: fuelSchema.nullable().optional(),
      compressor: compressorSchema,
      regenerator: regeneratorSchema.nullable().default(null),
      combustorPressureLoss: pressureLoss('Combustor pressure loss'),
      turbine: turbineSchema,
      generatorEfficiency: efficiency('Generator efficiency'),
      netPowerKW: num('Required net power')
        .gt(0, { error: 'Required net power must be above 0 kW.' })
        .max(MAX_NET_POWER_KW, { error: `Required net power must be at most ${figure(MAX_NET_POWER_KW)} kW.` }),
      limits: limitsSchema.nullable().optional(),
    },
    group('The cycle input'),
  )
  .superRefine((value, ctx) => {
    if (value.fluid === 'combustion' && !value.fuel) {
      ctx.addIssue({ code: 'custom', path: ['fuel'], message: 'The combustion working fluid needs a fuel.' });
    }
  });

/** Body of POST /evaluate: one cycle, with the intercooling temperature defaulting to the
 * ambient and the reheat temperature to the turbine inlet, filled in explicitly. */
export const evaluateRequestSchema = cycleInputSchema.transform((value) => ({
  ...value,
  compressor: {
    ...value.compressor,
    intercoolTemperatureK: value.compressor.intercoolTemperatureK ?? value.ambient.temperatureK,
  },
  turbine: {
    ...value.turbine,
    reheatTemperatureK: value.turbine.reheatTemperatureK ?? value.turbine.inletTemperatureK,
  },
}));

export const sweepParameterSchema = z.enum(SWEEP_PARAMETERS, {
  error: 'Sweep parameter must be one of the numeric inputs, e.g. compressor.pressureRatio.',
});

/** Body of POST /sweep. Defaults left out of `base` follow the swept value (reheat follows the turbine inlet). */
export const sweepRequestSchema = z
  .strictObject(
    {
      base: cycleInputSchema,
      parameter: sweepParameterSchema,
      from: num('Start of the range'),
      to: num('End of the range'),
      points: num('Number of points')
        .min(MIN_SWEEP_POINTS, { error: `Number of points must be at least ${MIN_SWEEP_POINTS}.` })
        .max(MAX_SWEEP_POINTS, { error: `Number of points must be at most ${MAX_SWEEP_POINTS}.` })
        .int({ error: 'Number of points must be a whole number.' }),
    },
    group('The sweep request'),
  )
  .superRefine((value, ctx) => {
    if (!(value.to > value.from))
      ctx.addIssue({ code: 'custom', path: ['to'], message: 'End of the range must be above its start.' });
  });

export type CycleInputBody = z.infer<typeof cycleInputSchema>;
export type EvaluateRequest = z.infer<typeof evaluateRequestSchema>;
export type SweepRequest = z.infer<typeof sweepRequestSchema>;
export type SweepParameterName = z.infer<typeof sweepParameterSchema>;
