import { z } from 'zod';

import { candidateSchema, designBasisSchema, roundSchema } from './board';
import { matrixSchema } from './matrix';
import { robustnessSchema } from './robustness';
import { siteYearSchema } from './site-year';
import { plainText } from './text';

/**
 * The decision record of a Review: revisions numbered from 1, at most one draft at a time.
 * A signed revision is read-only and carries a snapshot of what it was based on; reopening
 * makes revision n+1 as a draft copied from n.
 */

export const decisionLimits = {
  rationale: 4000,
  assumptions: 4000,
  reason: 500,
  rejected: 8,
  dissentName: 80,
  dissentText: 1000,
  dissent: 20,
  actionText: 300,
  actionOwner: 80,
  actions: 30,
} as const;

const candidateRef = (label: string) =>
  z
    .string({ error: `${label} must be a candidate id.` })
    .min(1, { error: `${label} must be a candidate id.` })
    .max(64, { error: `${label} must be a candidate id.` });

/** A calendar date written YYYY-MM-DD that exists (no 31 April). */
export const isoDate = z
  .string({ error: 'Due date must be a date (YYYY-MM-DD).' })
  .regex(/^\d{4}-\d{2}-\d{2}$/, { error: 'Due date must be written YYYY-MM-DD.' })
  .refine(
    (v) => {
      const d = new Date(`${v}T00:00:00Z`);
      return !Number.isNaN(d.getTime()) && d.toISOString().slice(0, 10) === v;
    },
    { error: 'Due date is not a day of the calendar.' },
  );

export const rejectedEntryInput = z.strictObject({
  candidateId: candidateRef('Rejected candidate'),
  reason: plainText({ label: 'Reason', min: 1, max: decisionLimits.reason, multiline: true }),
});

export const dissentEntryInput = z.strictObject({
  name: plainText({ label: 'Who', min: 1, max: decisionLimits.dissentName }),
  text: plainText({ label: 'Dissent', min: 1, max: decisionLimits.dissentText, multiline: true }),
});

export const actionEntryInput = z.strictObject({
  text: plainText({ label: 'Action', min: 1, max: decisionLimits.actionText }),
  owner: plainText({ label: 'Owner', min: 1, max: decisionLimits.actionOwner }),
  due: isoDate,
});

/** Body of PUT /api/reviews/:reviewId/decision: any of the draft's fields; the rest stay. */
export const updateDecisionInput = z
  .strictObject({
    chosenCandidateId: candidateRef('Chosen candidate').nullable().optional(),
    rationale: plainText({ label: 'Rationale', max: decisionLimits.rationale, multiline: true }).optional(),
    assumptions: plainText({ label: 'Assumptions', max: decisionLimits.assumptions, multiline: true }).optional(),
    rejected: z
      .array(rejectedEntryInput, { error: 'Rejected must be a list.' })
      .max(decisionLimits.rejected, { error: `At most ${decisionLimits.rejected} rejected candidates.` })
      .optional(),
    dissent: z
      .array(dissentEntryInput, { error: 'Dissent must be a list.' })
      .max(decisionLimits.dissent, { error: `At most ${decisionLimits.dissent} dissent entries.` })
      .optional(),
    actions: z
      .array(actionEntryInput, { error: 'Actions must be a list.' })
      .max(decisionLimits.actions, { error: `At most ${decisionLimits.actions} actions.` })
      .optional(),
  })
  .refine((v) => Object.values(v).some((x) => x !== undefined), {
    error: 'Send at least one of chosenCandidateId, rationale, assumptions, rejected, dissent or actions.',
  })
  .superRefine((v, ctx) => {
    const seen = new Set<string>();
    v.rejected?.forEach((r, i) => {
      if (seen.has(r.candidateId))
        ctx.addIssue({
          code: 'custom',
          path: ['rejected', i, 'candidateId'],
          message: 'This candidate is already listed as rejected.',
        });
      seen.add(r.candidateId);
      if (v.chosenCandidateId && r.candidateId === v.chosenCandidateId)
        ctx.addIssue({
          code: 'custom',
          path: ['rejected', i, 'candidateId'],
          message: 'The chosen candidate cannot also be rejected.',
        });
    });
  });
export type UpdateDecisionInput = z.input<typeof updateDecisionInput>;

/** Signing and reopening take no fields; an empty body or `{}`. */
export const emptyInput = z.strictObject({});

/** `?revision=n` of the PDF. */
export const decisionPdfQuery = z.strictObject({
  revision: z.coerce
    .number({ error: 'revision must be a revision number.' })
    .int({ error: 'revision must be a whole number.' })
    .min(1, { error: 'revision must be at least 1.' })
    .max(100_000, { error: 'revision must be at most 100000.' })
    .optional(),
});

const person = z.object({ id: z.string(), name: z.string() });

/** One person's score as it stood when the record was signed. */
export const snapshotScoreSchema = z.object({
  candidateId: z.string(),
  criterionId: z.string(),
  userId: z.string(),
  name: z.string(),
  score: z.number(),
  reason: z.string(),
});

/**
 * What a signed revision was based on. `matrix` is the comparison matrix as GET matrix
 * answered at signing; kept as data, never recomputed.
 */
export const decisionSnapshotSchema = z.object({
  takenAt: z.string(),
  designBasis: designBasisSchema,
  candidates: z.array(candidateSchema),
  scores: z.array(snapshotScoreSchema),
  matrix: matrixSchema,
  rounds: z.array(roundSchema),
  /** How sure: the latest finished robustness run (with whether it was out of date), and the site year. Absent in records signed before they existed. */
  robustness: robustnessSchema.nullable().optional(),
  siteYear: siteYearSchema.nullable().optional(),
});
export type DecisionSnapshot = z.infer<typeof decisionSnapshotSchema>;

const revisionFields = {
  id: z.string(),
  reviewId: z.string(),
  number: z.number(),
  status: z.enum(['draft', 'signed']),
  chosenCandidateId: z.string().nullable(),
  rationale: z.string(),
  assumptions: z.string(),
  rejected: z.array(z.object({ candidateId: z.string(), reason: z.string() })),
  dissent: z.array(z.object({ name: z.string(), text: z.string() })),
  actions: z.array(z.object({ text: z.string(), owner: z.string(), due: z.string() })),
  signedBy: person.nullable(),
  signedAt: z.string().nullable(),
  updatedBy: person.nullable(),
  updatedAt: z.string(),
};

/** A revision as the room hears it: everything but the snapshot (fetched with GET decision). */
export const decisionRevisionNewsSchema = z.object(revisionFields);
export type DecisionRevisionNews = z.infer<typeof decisionRevisionNewsSchema>;

/** A revision in full. */
export const decisionRevisionSchema = z.object({ ...revisionFields, snapshot: decisionSnapshotSchema.nullable() });
export type DecisionRevision = z.infer<typeof decisionRevisionSchema>;

/** GET /api/reviews/:reviewId/decision: the draft or the latest signed, and every revision, newest first. */
export type DecisionRecord = { current: DecisionRevision; revisions: DecisionRevision[] };

export const decisionStatusLabels = { draft: 'Draft', signed: 'Signed' } as const;
