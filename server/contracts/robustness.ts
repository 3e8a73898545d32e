import { z } from 'zod';

/**
 * How sure the ranking is: a seeded Monte Carlo run over the uncertainty of a review's inputs.
 * Every draw evaluates every candidate with the engine and ranks them by weighted total, as
 * the comparison matrix does. Each uncertain input is drawn uniformly within ± its range.
 */

export const maxSamples = 20_000;
export const defaultSamples = 2000;

/** Common-practice ranges for concept-stage inputs (the Lead may change them per run). */
export const defaultUncertainty = {
  /** ± on the compressor's isentropic efficiency (absolute). */
  compressorEfficiency: 0.01,
  /** ± on the turbine's isentropic efficiency (absolute). */
  turbineEfficiency: 0.01,
  /** ± on the regenerator's effectiveness (absolute). */
  regeneratorEffectiveness: 0.02,
  /** ± as a fraction of each pressure loss (0.2: ±20 % of its value). */
  pressureLossFraction: 0.2,
  /** ± on the turbine inlet (and reheat) temperature, K. */
  turbineInletK: 15,
  /** Ambient: an hour of the site's profile (when one is stored), else ± this around the basis ambient, K. */
  ambientFromProfile: true,
  ambientK: 10,
  /** Each criterion weight ×(1 ± this), renormalised (0.2: ×0.8–1.2). */
  weightFactor: 0.2,
  /** Draw each cell's score from the team's own marks (else every draw uses the mean). */
  scoreSpread: true,
};
export type Uncertainty = typeof defaultUncertainty;

const range = (label: string, max: number) =>
  z
    .number({ error: `${label} must be a number.` })
    .min(0, { error: `${label} cannot be negative.` })
    .max(max, { error: `${label} must be at most ${max}.` });

export const uncertaintySchema = z.strictObject({
  compressorEfficiency: range('Compressor efficiency ±', 0.05),
  turbineEfficiency: range('Turbine efficiency ±', 0.05),
  regeneratorEffectiveness: range('Regenerator effectiveness ±', 0.1),
  pressureLossFraction: range('Pressure losses ± (fraction of each)', 0.5),
  turbineInletK: range('Turbine inlet temperature ± (K)', 100),
  ambientFromProfile: z.boolean({ error: 'Ambient from the profile must be true or false.' }),
  ambientK: range('Ambient ± (K)', 30),
  weightFactor: range('Weights ± (fraction)', 0.5),
  scoreSpread: z.boolean({ error: 'Scores from their spread must be true or false.' }),
});

export const startRunInput = z.strictObject({
  samples: z
    .number({ error: 'Samples must be a number.' })
    .int({ error: 'Samples must be a whole number.' })
    .min(1, { error: 'At least 1 sample.' })
    .max(maxSamples, { error: `At most ${maxSamples.toLocaleString('en')} samples.` }),
  seed: z
    .number({ error: 'Seed must be a number.' })
    .int({ error: 'Seed must be a whole number.' })
    .min(0, { error: 'Seed must be 0 or more.' })
    .max(2 ** 31 - 1, { error: 'Seed must be below 2 147 483 648.' }),
  uncertainty: uncertaintySchema.optional(),
});
export type StartRunInput = z.infer<typeof startRunInput>;

/** 5 %, 50 % and 95 % points of a figure over the draws. */
export const bandSchema = z.object({ p5: z.number(), p50: z.number(), p95: z.number() });
export type Band = z.infer<typeof bandSchema>;

export const candidateBandsSchema = z.object({
  thermalEfficiency: bandSchema.nullable(),
  netWorkKJPerKg: bandSchema.nullable(),
  /** Annual fuel, t: the site year's (or fired hours at the basis ambient) scaled by the drawn heat rate. */
  annualFuelTonnes: bandSchema.nullable(),
});

export const runStatuses = ['none', 'running', 'cancelling', 'done', 'cancelled', 'failed'] as const;

export const robustnessSchema = z.object({
  runId: z.string().nullable(),
  samples: z.number().nullable(),
  seed: z.number().nullable(),
  status: z.enum(runStatuses),
  done: z.number(),
  uncertainty: uncertaintySchema,
  /** { <candidateId>: probability of ranking first }; ties share the first place evenly; adds to 1. */
  firstPlace: z.record(z.string(), z.number()).nullable(),
  /** { <candidateId>: [p(rank 1), p(rank 2), …] } */
  ranks: z.record(z.string(), z.array(z.number())).nullable(),
  bands: z.record(z.string(), candidateBandsSchema).nullable(),
  /** Draws in which a candidate could not be computed (the engine refused the drawn values). */
  refused: z.record(z.string(), z.number()).nullable(),
  /** A candidate, the basis, a score or the profile changed since the run. */
  stale: z.boolean(),
  startedBy: z.object({ id: z.string(), name: z.string() }).nullable(),
  startedAt: z.string().nullable(),
  finishedAt: z.string().nullable(),
  message: z.string().nullable(),
  /** How the draws are made, in words, for the screen and exports. */
  method: z.string(),
});
export type Robustness = z.infer<typeof robustnessSchema>;

export const robustnessMethod =
  'Each draw takes every uncertain input uniformly within ± its range (independently per candidate, the ambient common to all), evaluates every candidate with the engine, scores the measured criteria linearly between the worst and best of that draw, draws the other scores from the team’s own marks, and ranks by weighted total. Concept-stage estimate.';
