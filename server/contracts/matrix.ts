import { z } from 'zod';

import { candidateStatuses, measuredFigures } from './board';
import { scoreSchema } from './scores';
import { siteYearSummarySchema } from './site-year';

/**
 * The comparison matrix of a review: candidates as columns; the engine's key figures, then
 * each criterion of the design basis with its weight and the scores' mean and spread, the
 * weighted total and the rank; the preference rounds' tallies beside it.
 *
 * How the numbers are made (the screen and the exports state the same):
 * - A measured criterion (efficiency, specific work, CO2) is pre-scored per candidate from
 *   the results, linear between the worst (1) and the best (5) candidate with results; it
 *   needs two candidates with different values.
 * - Each scorer's mark on a measured criterion is their own score if they gave one (an
 *   override, with a reason), else the pre-score. The mean, lowest, highest and count are
 *   over the people who scored anything in the review; with nobody scoring, the pre-score
 *   stands alone.
 * - The weighted total is the mean of the criteria's values weighted by the criteria's
 *   weights, over the criteria that have a value for that candidate (the weights
 *   renormalised over those). A candidate lacking any weighted criterion is `incomplete`:
 *   its total is shown with that flag, never with a missing score counted as zero.
 * - Ranks go by total, highest first; equal totals share a rank (1, 1, 3); a candidate with
 *   no total has no rank.
 */

/** The engine's key figures the matrix shows, SI units as the exports write them. */
export const matrixFigureKeys = [
  'thermalEfficiency',
  'netWorkKJPerKg',
  'heatRateKJPerKWh',
  'co2KgPerMWh',
  'airMassFlowKgPerS',
  'fuelMassFlowKgPerS',
  'exhaustTemperatureK',
  'backWorkRatio',
] as const;
export type MatrixFigureKey = (typeof matrixFigureKeys)[number];

/**
 * Label and unit of each figure; `scale` turns the engine's value into the one shown and
 * exported (efficiency as a percentage).
 */
export const matrixFigureDefs: Record<MatrixFigureKey, { label: string; unit: string; scale: number }> = {
  thermalEfficiency: { label: 'Thermal efficiency', unit: '%', scale: 100 },
  netWorkKJPerKg: { label: 'Net specific work', unit: 'kJ/kg', scale: 1 },
  heatRateKJPerKWh: { label: 'Heat rate', unit: 'kJ/kWh', scale: 1 },
  co2KgPerMWh: { label: 'CO2 per MWh', unit: 'kg/MWh', scale: 1 },
  airMassFlowKgPerS: { label: 'Air flow for the required power', unit: 'kg/s', scale: 1 },
  fuelMassFlowKgPerS: { label: 'Fuel flow', unit: 'kg/s', scale: 1 },
  exhaustTemperatureK: { label: 'Exhaust temperature', unit: 'K', scale: 1 },
  backWorkRatio: { label: 'Back-work ratio', unit: '-', scale: 1 },
};

/**
 * The site year's figures the matrix shows per candidate (from GET site-year), SI units as
 * the exports write them. The year's figures need an hourly profile; the hot and cold days
 * do not (without one they are +45 °C and −30 °C).
 */
export const matrixYearFigureKeys = [
  'hotDayKW',
  'coldDayKW',
  'energyMWh',
  'fuelTonnes',
  'co2Tonnes',
  'meanHeatRateKJPerKWh',
  'shortfallHours',
] as const;
export type MatrixYearFigureKey = (typeof matrixYearFigureKeys)[number];

export const matrixYearFigureDefs: Record<MatrixYearFigureKey, { label: string; unit: string }> = {
  hotDayKW: { label: 'Hot-day capacity', unit: 'kW' },
  coldDayKW: { label: 'Cold-day capacity', unit: 'kW' },
  energyMWh: { label: 'Energy a year', unit: 'MWh' },
  fuelTonnes: { label: 'Fuel a year', unit: 't' },
  co2Tonnes: { label: 'CO2 a year', unit: 't' },
  meanHeatRateKJPerKWh: { label: 'Mean heat rate over the year', unit: 'kJ/kWh' },
  shortfallHours: { label: 'Fired hours short of the required power', unit: 'h' },
};

/** What the site year's figures are, said on the screen and in the exports. */
export const yearRule =
  'Site year: each candidate as a fixed machine sized at the design basis ambient for the required power (same inlet volume flow, pressure ratio, turbine inlet temperature, efficiencies and losses at every ambient); the year\u2019s figures over the hourly profile at the basis\u2019s fired hours a year (none without a profile): a first-order estimate without component maps, for comparing candidates.';

/** Which end of a measured figure is best: the pre-score's 5. */
export const measuredBest: Record<(typeof measuredFigures)[number], 'highest' | 'lowest'> = {
  thermalEfficiency: 'highest',
  netWorkKJPerKg: 'highest',
  co2KgPerMWh: 'lowest',
};

/** The caution line the exports carry (the words of components/ui/caution-line.tsx). */
export const exportCaution =
  'Concept-stage estimates; detailed design and acceptance follow the applicable codes, the machine maker\u2019s data and licensed engineering practice.';

export const totalRule =
  'Weighted total: the mean of the criteria scores (1–5) weighted by the criteria weights, over the criteria scored for that candidate (weights renormalised); a candidate missing a criterion is marked incomplete.';

const byCandidate = <T extends z.ZodType>(value: T) => z.record(z.string(), value);

export const matrixCriterionSchema = z.object({
  id: z.string(),
  name: z.string(),
  /** As set in the design basis (0–100). */
  weight: z.number(),
  /** Share of the weights, 0–1 (the weights over their sum). */
  share: z.number(),
  measure: z.enum(measuredFigures).nullable(),
});

export const matrixCandidateSchema = z.object({
  id: z.string(),
  name: z.string(),
  colour: z.string(),
  status: z.enum(candidateStatuses),
  /** False when the engine refused the candidate (no figures, no pre-scores). */
  computed: z.boolean(),
});

export const matrixFigureSchema = z.object({
  key: z.enum(matrixFigureKeys),
  label: z.string(),
  unit: z.string(),
  values: byCandidate(z.number().nullable()),
});

export const matrixYearFigureSchema = z.object({
  key: z.enum(matrixYearFigureKeys),
  label: z.string(),
  unit: z.string(),
  /** Null where the figure is missing: no profile (the year's figures), or an engine refusal. */
  values: byCandidate(z.number().nullable()),
});

/** The site year's part of the matrix. */
export const matrixYearSchema = z.object({
  /** The stored hourly profile's summary; null without one (then only the hot and cold days). */
  profile: siteYearSummarySchema.nullable(),
  firedHoursPerYear: z.number(),
  /** The ambient of the hot and cold days, K (the profile's hottest and coldest hours, else +45 °C and −30 °C); null when no candidate has a year. */
  hotDayK: z.number().nullable(),
  coldDayK: z.number().nullable(),
  rule: z.string(),
  figures: z.array(matrixYearFigureSchema),
});
export type MatrixYear = z.infer<typeof matrixYearSchema>;

export const matrixCellSchema = z.object({
  /** The value the total uses: the mean of the marks, or the pre-score alone; null when missing. */
  value: z.number().nullable(),
  mean: z.number().nullable(),
  min: z.number().nullable(),
  max: z.number().nullable(),
  /** How many people's marks the mean is over. */
  count: z.number(),
  /** Measured criteria: the pre-score (1–5), or null without one. */
  preScore: z.number().nullable(),
  /** How many people gave their own score instead of the pre-score. */
  overrides: z.number(),
});
export type MatrixCell = z.infer<typeof matrixCellSchema>;

export const matrixRowSchema = z.object({
  criterionId: z.string(),
  weight: z.number(),
  share: z.number(),
  cells: byCandidate(matrixCellSchema),
});
export type MatrixRow = z.infer<typeof matrixRowSchema>;

export const matrixTotalSchema = z.object({
  /** 1–5 on the scores' scale; null when no weighted criterion has a value. */
  total: z.number().nullable(),
  incomplete: z.boolean(),
  /** Ids of the weighted criteria without a value for this candidate. */
  missing: z.array(z.string()),
});
export type MatrixTotal = z.infer<typeof matrixTotalSchema>;

export const matrixRoundSchema = z.object({
  number: z.number(),
  status: z.enum(['open', 'closed']),
  blind: z.boolean(),
  votesPerPerson: z.number(),
  voters: z.number(),
  tally: byCandidate(z.number()),
  closedAt: z.string().nullable(),
});

/** GET /api/reviews/:reviewId/matrix. */
export const matrixSchema = z.object({
  reviewId: z.string(),
  reviewName: z.string(),
  basisRevision: z.number(),
  criteria: z.array(matrixCriterionSchema),
  candidates: z.array(matrixCandidateSchema),
  figures: z.array(matrixFigureSchema),
  rows: z.array(matrixRowSchema),
  totals: byCandidate(matrixTotalSchema),
  /** 1 is best; equal totals share a rank; null without a total. */
  ranks: byCandidate(z.number().nullable()),
  /** Closed rounds, and the open one unless it is blind; oldest first. */
  rounds: z.array(matrixRoundSchema),
  /** How many people have scored anything in the review. */
  scorers: z.number(),
  rules: z.object({ preScore: z.string(), total: z.string() }),
  /** The site year's figures per candidate. Absent from matrices kept before it existed (signed snapshots). */
  year: matrixYearSchema.optional(),
  madeAt: z.string(),
});
export type Matrix = z.infer<typeof matrixSchema>;

/**
 * `score:changed`: one person changed some scores. Carries the changed scores, the matrix
 * cells of the candidate × criterion pairs they touched, and every total and rank (a few
 * numbers per candidate) — not the whole matrix. When the set of scorers changed (a person's
 * first score or last withdrawal), every measured cell changes: `refetch` says so.
 */
export const scoreChangedSchema = z.object({
  reviewId: z.string(),
  by: z.object({ id: z.string(), name: z.string() }),
  /** The person's scores after the change for the pairs sent; score null: withdrawn. */
  scores: z.array(scoreSchema.extend({ score: z.number().nullable() })),
  cells: z.array(matrixCellSchema.extend({ candidateId: z.string(), criterionId: z.string() })),
  totals: byCandidate(matrixTotalSchema),
  ranks: byCandidate(z.number().nullable()),
  scorers: z.number(),
  refetch: z.boolean(),
  /** When the matrix these numbers come from was read; a client keeps the newer of two. */
  madeAt: z.string(),
});
export type ScoreChanged = z.infer<typeof scoreChangedSchema>;
