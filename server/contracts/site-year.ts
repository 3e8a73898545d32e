import { z } from 'zod';

/**
 * The site's year: a review's hourly ambient profile and each candidate's fixed machine over
 * it (rating curve, hot and cold days, the year's figures). A first-order estimate without
 * component maps, for comparing candidates.
 */

/** Largest profile file, bytes (10 MB). */
export const maxSiteYearBytes = 10 * 1024 * 1024;
/** At most this many row errors are listed in a refusal. */
export const maxListedRowErrors = 20;
/** Hours a profile may stand for: a year, or a leap year. */
export const yearHours = [8760, 8784] as const;
/** Range of the dry-bulb temperature accepted, K (−60 °C to +60 °C). */
export const profileMinK = 213.15;
export const profileMaxK = 333.15;

/** What PUT answers and the room hears: the stored profile's summary. */
export const siteYearSummarySchema = z.object({
  /** Hours the profile stands for. */
  hours: z.number(),
  /** Rows of the file. */
  rows: z.number(),
  minK: z.number(),
  maxK: z.number(),
  meanK: z.number(),
  /** True when the file gave a pressure column (else the basis pressure holds every hour). */
  hasPressure: z.boolean(),
  fileName: z.string(),
  uploadedBy: z.object({ id: z.string(), name: z.string() }).nullable(),
  updatedAt: z.string(),
});
export type SiteYearSummary = z.infer<typeof siteYearSummarySchema>;

export const ratingPointSchema = z.object({
  ambientK: z.number(),
  netPowerKW: z.number(),
  heatRateKJPerKWh: z.number(),
  exhaustTemperatureK: z.number(),
});
export type RatingPoint = z.infer<typeof ratingPointSchema>;

export const annualSchema = z.object({
  energyMWh: z.number(),
  fuelTonnes: z.number(),
  co2Tonnes: z.number(),
  meanHeatRateKJPerKWh: z.number(),
  /** Fired hours in which the machine cannot give the required power. */
  shortfallHours: z.number(),
  /** Hours of the profile (the calendar) in which it cannot. */
  shortfallProfileHours: z.number(),
  firedHours: z.number(),
});
export type Annual = z.infer<typeof annualSchema>;

export const candidateYearSchema = z.object({
  candidateId: z.string(),
  /** The candidate revision the figures were computed from. */
  revision: z.number(),
  ratingCurve: z.array(ratingPointSchema),
  /** Full-load capacity on the hot day: the profile's hottest hour, else +45 °C; null where the cycle cannot run. */
  hotDayKW: z.number().nullable(),
  hotDayK: z.number(),
  coldDayKW: z.number().nullable(),
  coldDayK: z.number(),
  requiredKW: z.number(),
  annual: annualSchema.nullable(),
  /** Why nothing could be computed (the candidate has an engine error), else null. */
  error: z.string().nullable(),
});
export type CandidateYear = z.infer<typeof candidateYearSchema>;

/** GET /api/reviews/:reviewId/site-year. */
export const siteYearSchema = z.object({
  profile: siteYearSummarySchema.nullable(),
  firedHoursPerYear: z.number(),
  candidates: z.array(candidateYearSchema),
});
export type SiteYear = z.infer<typeof siteYearSchema>;

/** One refused row of an upload; `row` is the line of the file (the header is line 1). */
export const profileRowErrorSchema = z.object({ row: z.number(), column: z.string(), message: z.string() });
export type ProfileRowError = z.infer<typeof profileRowErrorSchema>;
