import { z } from 'zod';

import { candidateSchema, commentSchema, designBasisSchema, presenceSchema, roundSchema } from './board';
import { decisionRevisionNewsSchema } from './decision';
import { storedFileSchema } from './files';
import { scoreChangedSchema } from './matrix';
import { reviewSchema } from './review';
import { siteYearSummarySchema } from './site-year';

/**
 * What a Team's room is told, one schema per event (`resource:past-tense`). The server sends
 * these after the change is committed; the app checks each payload before it touches the cache.
 */
export const teamNews = {
  'review:created': z.object({ review: reviewSchema }),
  'review:updated': z.object({ review: reviewSchema }),
};

export type TeamNews = { [E in keyof typeof teamNews]: z.infer<(typeof teamNews)[E]> };
export type TeamNewsEvent = keyof TeamNews;

/**
 * What a Review's room (`review:<id>`, the live board) is told. Compact: one candidate, one
 * round, one comment at a time. A round is tailored to each listener (`votedBy` for the Lead
 * and Owner only; `myBallot` is always null here: a client keeps its own from its PUT).
 */
export const reviewNews = {
  'candidate:added': z.object({ candidate: candidateSchema }),
  'candidate:recomputed': z.object({ candidate: candidateSchema }),
  'basis:updated': z.object({ designBasis: designBasisSchema }),
  'round:opened': z.object({ round: roundSchema }),
  'round:tallied': z.object({ round: roundSchema }),
  'round:closed': z.object({ round: roundSchema }),
  'comment:posted': z.object({ comment: commentSchema }),
  'presence:changed': z.object({ reviewId: z.string(), people: z.array(presenceSchema) }),
  'room:gathered': z.object({
    reviewId: z.string(),
    /** null: the gatherer stopped gathering. */
    candidateId: z.string().nullable(),
    by: z.object({ id: z.string(), name: z.string() }),
  }),
  'file:added': z.object({ file: storedFileSchema }),
  /** The review's hourly profile was stored, replaced (its summary) or removed (null): refetch the site year. */
  'site-year:updated': z.object({ reviewId: z.string(), profile: siteYearSummarySchema.nullable() }),
  'robustness:progress': z.object({ reviewId: z.string(), runId: z.string(), done: z.number(), total: z.number() }),
  'robustness:finished': z.object({ reviewId: z.string(), runId: z.string() }),
  'file:removed': z.object({ reviewId: z.string(), fileId: z.string(), candidateId: z.string().nullable() }),
  'decision:updated': z.object({ reviewId: z.string(), revision: decisionRevisionNewsSchema }),
  'decision:signed': z.object({ reviewId: z.string(), revision: decisionRevisionNewsSchema }),
  'score:changed': scoreChangedSchema,
};

export type ReviewNews = { [E in keyof typeof reviewNews]: z.infer<(typeof reviewNews)[E]> };
export type ReviewNewsEvent = keyof ReviewNews;

/** Who a tailored payload is made for. */
export type Listener = { userId: string; role: string };
