import { z } from 'zod';

import { plainText } from './text';

/**
 * Scores: each Lead, Engineer and Reviewer marks each candidate on each criterion of the
 * design basis, 1 (worst) to 5 (best), with an optional one-line reason. A criterion the
 * engine measures is pre-scored from the results; a person's own score there overrides the
 * pre-score and needs a reason.
 */

export const scoreMin = 1;
export const scoreMax = 5;
export const reasonMaxLength = 200;
/** 8 candidates × 20 criteria fit in one change with room to spare. */
export const maxScoresPerChange = 200;

const id = (what: string) =>
  z
    .string({ error: `${what} must be an id.` })
    .min(1, { error: `${what} must be an id.` })
    .max(64, { error: `${what} must be an id.` });

export const scoreValue = z
  .number({ error: 'Score must be a number from 1 to 5, or null to withdraw it.' })
  .int({ error: 'Score must be a whole number from 1 to 5.' })
  .min(scoreMin, { error: 'Score must be at least 1.' })
  .max(scoreMax, { error: 'Score must be at most 5.' });

export const scoreReason = plainText({ label: 'Reason', max: reasonMaxLength });

export const scoreEntryInput = z.strictObject({
  candidateId: id('candidateId'),
  criterionId: id('criterionId'),
  /** null withdraws my score of this candidate on this criterion. */
  score: scoreValue.nullable(),
  reason: scoreReason.optional().default(''),
});
export type ScoreEntryInput = z.input<typeof scoreEntryInput>;

/** Body of PUT /api/reviews/:reviewId/scores: some of my scores, stored all or none. */
export const putScoresInput = z
  .strictObject({
    scores: z
      .array(scoreEntryInput, { error: 'Scores must be a list of { candidateId, criterionId, score, reason }.' })
      .min(1, { error: 'Send at least one score.' })
      .max(maxScoresPerChange, { error: `At most ${maxScoresPerChange} scores in one change.` }),
  })
  .superRefine((value, ctx) => {
    const seen = new Set<string>();
    value.scores.forEach((s, i) => {
      const key = `${s.candidateId}\u0000${s.criterionId}`;
      if (seen.has(key))
        ctx.addIssue({
          code: 'custom',
          path: ['scores', i, 'criterionId'],
          message: 'This candidate and criterion are scored twice in one change.',
        });
      seen.add(key);
    });
  });
export type PutScoresInput = z.input<typeof putScoresInput>;

/** One person's score as the API carries it. */
export const scoreSchema = z.object({
  candidateId: z.string(),
  criterionId: z.string(),
  userId: z.string(),
  name: z.string(),
  score: z.number(),
  reason: z.string(),
  updatedAt: z.string(),
});
export type Score = z.infer<typeof scoreSchema>;

/** GET /api/reviews/:reviewId/scores. Only scores of the review's candidates and basis criteria. */
export const scoresSchema = z.object({
  mine: z.array(scoreSchema),
  everyone: z.array(scoreSchema),
});
export type Scores = z.infer<typeof scoresSchema>;

/** The rule a pre-score follows, in the words the screen and the exports show. */
export const preScoreRule = '5 = best of the candidates, 1 = worst, linear between';
