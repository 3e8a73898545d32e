import { z } from 'zod';

import { ambientSchema, compressorSchema, fuelSchema, limitsSchema, regeneratorSchema, turbineSchema } from './cycle';
import { reviewSchema } from './review';
import { teamRoles } from './roles';
import { plainText } from './text';

/**
 * The live review board: design basis, candidates, preference rounds, comments, presence.
 * Field names follow the engine contract (server/contracts/cycle.ts) where they overlap, so a
 * candidate's `input` is exactly what POST /api/cycles/evaluate accepts.
 */

// ── Design basis ────────────────────────────────────────────────────────────────────────

/** Figures the engine measures; a criterion tied to one is pre-scored from the results (scoring). */
export const measuredFigures = ['thermalEfficiency', 'netWorkKJPerKg', 'co2KgPerMWh'] as const;
export type MeasuredFigure = (typeof measuredFigures)[number];

export const criterionName = plainText({ label: 'Criterion name', min: 2, max: 60 });

export const criterionInput = z.strictObject({
  /** Absent for a criterion added in this change; the server gives it an id. */
  id: z.string().min(1).max(64).optional(),
  name: criterionName,
  weight: z
    .number({ error: 'Weight must be a number.' })
    .min(0, { error: 'Weight must be at least 0.' })
    .max(100, { error: 'Weight must be at most 100.' }),
  measure: z.enum(measuredFigures, { error: 'Measure must be one the engine computes.' }).nullable().default(null),
});

export const criterionSchema = z.object({
  id: z.string(),
  name: z.string(),
  weight: z.number(),
  measure: z.enum(measuredFigures).nullable(),
});
export type Criterion = z.infer<typeof criterionSchema>;

/**
 * Fired hours per year a basis without its own reads as: 6000, a mid-merit plant (common
 * practice: a peaking unit runs a few hundred hours, a base-load plant most of the 8760).
 */
export const DEFAULT_FIRED_HOURS_PER_YEAR = 6000;

export const firedHoursPerYearSchema = z
  .number({ error: 'Fired hours per year must be a number.' })
  .int({ error: 'Fired hours per year must be a whole number.' })
  .min(1, { error: 'Fired hours per year must be at least 1.' })
  .max(8784, { error: 'Fired hours per year must be at most 8784 (a leap year).' });

export const fluidSchema = z.enum(['combustion', 'variable-cp-air', 'constant-cp-air'], {
  error: 'Property model must be combustion, variable-cp-air or constant-cp-air.',
});

/** Body of PUT /api/reviews/:reviewId/design-basis: the whole basis. */
export const designBasisInput = z
  .strictObject({
    ambient: ambientSchema,
    fuel: fuelSchema,
    fluid: fluidSchema,
    netPowerKW: z
      .number({ error: 'Required net power must be a number.' })
      .gt(0, { error: 'Required net power must be above 0 kW.' })
      .max(10_000_000, { error: 'Required net power must be at most 10 000 000 kW.' }),
    generatorEfficiency: z
      .number({ error: 'Generator efficiency must be a number.' })
      .gt(0, { error: 'Generator efficiency must be above 0.' })
      .max(1, { error: 'Generator efficiency must be at most 1.' }),
    limits: limitsSchema,
    /** Left out: the basis reads as DEFAULT_FIRED_HOURS_PER_YEAR. */
    firedHoursPerYear: firedHoursPerYearSchema.optional(),
    criteria: z
      .array(criterionInput, { error: 'Criteria must be a list.' })
      .min(1, { error: 'Keep at least one criterion.' })
      .max(20, { error: 'At most 20 criteria.' }),
  })
  .superRefine((value, ctx) => {
    const names = new Set<string>();
    value.criteria.forEach((c, i) => {
      const key = c.name.toLowerCase();
      if (names.has(key))
        ctx.addIssue({
          code: 'custom',
          path: ['criteria', i, 'name'],
          message: `Two criteria are called “${c.name}”.`,
        });
      names.add(key);
    });
    if (!value.criteria.some((c) => c.weight > 0))
      ctx.addIssue({ code: 'custom', path: ['criteria'], message: 'At least one criterion needs a weight above 0.' });
    const { exhaustTemperatureMinK: lo, exhaustTemperatureMaxK: hi } = value.limits;
    if (lo !== undefined && hi !== undefined && !(hi > lo))
      ctx.addIssue({
        code: 'custom',
        path: ['limits', 'exhaustTemperatureMaxK'],
        message: 'Highest exhaust temperature must be above the lowest.',
      });
  });
export type DesignBasisInput = z.input<typeof designBasisInput>;

export const designBasisSchema = z.object({
  ambient: z.object({
    temperatureK: z.number(),
    pressureKPa: z.number().optional(),
    elevationM: z.number().optional(),
    relativeHumidity: z.number(),
  }),
  fuel: z.object({ hydrogenVolumeFraction: z.number(), temperatureK: z.number() }),
  fluid: fluidSchema,
  netPowerKW: z.number(),
  generatorEfficiency: z.number(),
  limits: z.object({
    maxTurbineInletTemperatureK: z.number().optional(),
    exhaustTemperatureMinK: z.number().optional(),
    exhaustTemperatureMaxK: z.number().optional(),
  }),
  /** Always sent (the default for a basis stored without it); optional for older payloads. */
  firedHoursPerYear: z.number().optional(),
  criteria: z.array(criterionSchema),
  revision: z.number(),
  updatedAt: z.string(),
});
export type DesignBasis = z.infer<typeof designBasisSchema>;

// ── Candidates ──────────────────────────────────────────────────────────────────────────

/** Okabe–Ito colour-blind-safe series, in order; a candidate keeps its colour for life. */
export const candidateColours = [
  '#E69F00',
  '#56B4E9',
  '#009E73',
  '#F0E442',
  '#0072B2',
  '#D55E00',
  '#CC79A7',
  '#000000',
] as const;

export const candidatePresets = [
  'simple',
  'regenerative',
  'intercooled',
  'reheat',
  'intercooled-reheat-regenerative',
] as const;
export type CandidatePreset = (typeof candidatePresets)[number];
export const presetLabels: Record<CandidatePreset, string> = {
  simple: 'Simple',
  regenerative: 'Regenerative',
  intercooled: 'Intercooled',
  reheat: 'Reheat',
  'intercooled-reheat-regenerative': 'Intercooled + reheat + regenerative',
};

export const candidateStatuses = ['proposed', 'shortlisted', 'set-aside', 'chosen'] as const;
export type CandidateStatus = (typeof candidateStatuses)[number];
export const statusLabels: Record<CandidateStatus, string> = {
  proposed: 'Proposed',
  shortlisted: 'Shortlisted',
  'set-aside': 'Set aside',
  chosen: 'Chosen',
};

/** What a candidate owns: the cycle; the design basis supplies site, fuel, power and property model. */
export const candidateParametersSchema = z.strictObject({
  compressor: compressorSchema,
  regenerator: regeneratorSchema.nullable(),
  combustorPressureLoss: z
    .number({ error: 'Combustor pressure loss must be a number.' })
    .min(0, { error: 'Combustor pressure loss must be at least 0.' })
    .lt(1, { error: 'Combustor pressure loss must be below 1 (a fraction of the inlet pressure).' }),
  turbine: turbineSchema,
});
export type CandidateParameters = z.output<typeof candidateParametersSchema>;

/** A group of a partial parameters change: an object of fields (each checked after merging). */
const partialGroup = (what: string) =>
  z.record(z.string(), z.unknown(), { error: `${what} must be an object of fields.` });

/**
 * `parameters` of a PATCH: any part of the parameters, in their groups. The server merges it
 * into the stored parameters and checks the result with candidateParametersSchema, so an error
 * names the field as the full schema does (`parameters.compressor.pressureRatio`).
 */
export const candidateParametersPatch = z.strictObject(
  {
    compressor: partialGroup('Compressor').optional(),
    regenerator: partialGroup('Regenerator').nullable().optional(),
    combustorPressureLoss: z.unknown().optional(),
    turbine: partialGroup('Turbine').optional(),
  },
  { error: 'Parameters must be an object with compressor, regenerator, combustorPressureLoss or turbine.' },
);

export const candidateName = plainText({ label: 'Candidate name', min: 2, max: 80 });

/**
 * Body of POST /api/reviews/:reviewId/candidates: a name with a preset, or a name with copyOf
 * (another candidate of the same review). One object, so a wrong or unknown field is named.
 */
export const createCandidateInput = z
  .strictObject({
    name: candidateName,
    preset: z.enum(candidatePresets, { error: `Preset must be one of: ${candidatePresets.join(', ')}.` }).optional(),
    copyOf: z
      .string({ error: 'copyOf must be a candidate id.' })
      .min(1, { error: 'copyOf must be a candidate id.' })
      .max(64, { error: 'copyOf must be a candidate id.' })
      .optional(),
  })
  .superRefine((value, ctx) => {
    if (value.preset === undefined && value.copyOf === undefined)
      ctx.addIssue({
        code: 'custom',
        path: ['preset'],
        message: 'Send a preset, or copyOf (the candidate to copy).',
      });
    if (value.preset !== undefined && value.copyOf !== undefined)
      ctx.addIssue({ code: 'custom', path: ['copyOf'], message: 'Send a preset or copyOf, not both.' });
  });
export type CreateCandidateInput = z.input<typeof createCandidateInput>;

export const updateCandidateInput = z
  .strictObject({
    name: candidateName.optional(),
    status: z
      .enum(candidateStatuses, { error: 'Status must be proposed, shortlisted, set-aside or chosen.' })
      .optional(),
    parameters: candidateParametersPatch.optional(),
    /** The revision the change was made on; a stale one gets 409 with the current candidate. */
    ifRevision: z.number({ error: 'ifRevision must be a revision number.' }).int().min(1).optional(),
  })
  .refine((v) => v.name !== undefined || v.status !== undefined || v.parameters !== undefined, {
    message: 'Send at least one of name, status or parameters.',
  });
export type UpdateCandidateInput = z.input<typeof updateCandidateInput>;

export const fieldErrorSchema = z.object({ field: z.string(), message: z.string() });

/**
 * A candidate as the API and the room carry it. `input` is the whole engine input it was
 * computed from; `results` what POST /api/cycles/evaluate answers for it, or null when the
 * engine refused the combination (then `error` names the field).
 */
export const candidateSchema = z.object({
  id: z.string(),
  reviewId: z.string(),
  name: z.string(),
  colour: z.string(),
  status: z.enum(candidateStatuses),
  preset: z.enum(candidatePresets).nullable(),
  parameters: z.record(z.string(), z.unknown()),
  input: z.record(z.string(), z.unknown()),
  revision: z.number(),
  results: z.record(z.string(), z.unknown()).nullable(),
  error: fieldErrorSchema.nullable(),
  updatedAt: z.string(),
  updatedBy: z.object({ id: z.string(), name: z.string() }).nullable(),
});
export type CandidateWire = z.infer<typeof candidateSchema>;

// ── Preference rounds ───────────────────────────────────────────────────────────────────

export const openRoundInput = z.strictObject({
  votesPerPerson: z
    .number({ error: 'Votes per person must be a number.' })
    .int({ error: 'Votes per person must be a whole number.' })
    .min(1, { error: 'Votes per person must be at least 1.' })
    .max(20, { error: 'Votes per person must be at most 20.' }),
  blind: z.boolean({ error: 'Blind must be true or false.' }),
});

export const ballotInput = z.strictObject({
  votes: z
    .record(
      z.string().min(1).max(64),
      z
        .number({ error: 'Votes must be numbers.' })
        .int({ error: 'Votes must be whole numbers.' })
        .min(0, { error: 'Votes must be at least 0.' }),
      { error: 'Votes must be an object of candidate ids and numbers.' },
    )
    .refine((v) => Object.keys(v).length <= 50, { message: 'At most 50 candidates in a ballot.' }),
});

export const roundSchema = z.object({
  id: z.string(),
  number: z.number(),
  status: z.enum(['open', 'closed']),
  votesPerPerson: z.number(),
  blind: z.boolean(),
  /** Votes per candidate; null while a blind round is open. */
  tally: z.record(z.string(), z.number()).nullable(),
  /** How many have cast a ballot (everyone sees this). */
  voters: z.number(),
  /** Who has cast a ballot: for the Lead and Owner only (never how, in a blind round). */
  votedBy: z.array(z.object({ id: z.string(), name: z.string() })).nullable(),
  /** The caller's own ballot, or null. */
  myBallot: z.record(z.string(), z.number()).nullable(),
  openedAt: z.string(),
  closedAt: z.string().nullable(),
});
export type Round = z.infer<typeof roundSchema>;

// ── Comments ────────────────────────────────────────────────────────────────────────────

export const commentBody = plainText({ label: 'Comment', min: 1, max: 5000, multiline: true });

export const postCommentInput = z.strictObject({
  body: commentBody,
  candidateId: z.string().min(1).max(64).nullable().optional(),
  parentId: z.string().min(1).max(64).nullable().optional(),
  /** Chosen by the client per comment; a retried post with the same one is stored once. */
  clientId: z
    .string({ error: 'clientId is required (an id the client makes for this comment).' })
    .min(8, { error: 'clientId must be 8 to 64 characters.' })
    .max(64, { error: 'clientId must be 8 to 64 characters.' })
    .regex(/^[A-Za-z0-9_-]+$/, { error: 'clientId may hold letters, digits, - and _ only.' }),
});
export type PostCommentInput = z.input<typeof postCommentInput>;

export const commentSchema = z.object({
  id: z.string(),
  reviewId: z.string(),
  candidateId: z.string().nullable(),
  parentId: z.string().nullable(),
  body: z.string(),
  author: z.object({ id: z.string(), name: z.string() }).nullable(),
  /** User ids of the members @mentioned in the body. */
  mentions: z.array(z.string()),
  clientId: z.string(),
  createdAt: z.string(),
});
export type Comment = z.infer<typeof commentSchema>;

// ── Presence and gathering ──────────────────────────────────────────────────────────────

export const presenceSchema = z.object({
  userId: z.string(),
  name: z.string(),
  role: z.enum(teamRoles),
  /** The candidate this person is looking at, or null (the board as a whole). */
  candidateId: z.string().nullable(),
});
export type Presence = z.infer<typeof presenceSchema>;

// ── The board ───────────────────────────────────────────────────────────────────────────

/** GET /api/reviews/:reviewId/board. `round`: the open one, else the latest closed, else null. */
export const boardSchema = z.object({
  review: reviewSchema,
  designBasis: designBasisSchema,
  candidates: z.array(candidateSchema),
  round: roundSchema.nullable(),
  myRole: z.enum(teamRoles),
  /** Comments per candidate id, and `review` for those on the review itself. */
  commentCounts: z.record(z.string(), z.number()),
  /** The gatherer's current candidate while someone gathers the room, else null. */
  gathering: z.object({ candidateId: z.string(), by: z.object({ id: z.string(), name: z.string() }) }).nullable(),
});
export type Board = z.infer<typeof boardSchema>;

/** Members one may @mention in a comment: the Team's people, by name. */
export const mentionableSchema = z.array(z.object({ id: z.string(), name: z.string() }));
