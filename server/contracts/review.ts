import { z } from 'zod';

import { plainText } from './text';

/** Shared by the reviews-list form (instant feedback) and the routes (422 with field errors). */
export const reviewName = plainText({ label: 'Name', min: 3, max: 120 });

export const reviewSummary = plainText({ label: 'Summary', max: 2000, multiline: true });

export const createReviewInput = z.strictObject({
  name: reviewName,
  summary: reviewSummary.default(''),
});
export type CreateReviewInput = z.input<typeof createReviewInput>;

export const reviewStatus = z.enum(['active', 'archived'], { error: 'Status must be "active" or "archived".' });
export type ReviewStatus = z.infer<typeof reviewStatus>;

export const updateReviewInput = z
  .strictObject({
    name: reviewName.optional(),
    summary: reviewSummary.optional(),
    status: reviewStatus.optional(),
  })
  .refine((v) => v.name !== undefined || v.summary !== undefined || v.status !== undefined, {
    message: 'Send at least one of name, summary or status.',
  });
export type UpdateReviewInput = z.input<typeof updateReviewInput>;

export const listReviewsQuery = z.strictObject({
  status: z.enum(['active', 'archived', 'all'], { error: 'Status must be active, archived or all.' }).default('active'),
});

/** A Review as the API and the live events carry it (the app checks live payloads with it). */
export const reviewSchema = z.object({
  id: z.string(),
  teamId: z.string(),
  name: z.string(),
  summary: z.string(),
  status: reviewStatus,
  createdAt: z.string(),
  updatedAt: z.string(),
  archivedAt: z.string().nullable(),
  createdBy: z.object({ id: z.string(), name: z.string() }).nullable(),
});
export type Review = z.infer<typeof reviewSchema>;
