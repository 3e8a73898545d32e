import { Router } from 'express';
import { z } from 'zod';

import type { Database } from '@/db/client';
import { parse } from '@/server/http/errors';
import { reviewParams } from '@/server/http/params';
import { requireReview } from '@/server/services/access';
import { listReviewActivity } from '@/server/services/review-activity';

export const reviewActivityQuery = z.strictObject({
  limit: z.coerce
    .number({ error: 'limit must be a number.' })
    .int({ error: 'limit must be a whole number.' })
    .min(1, { error: 'limit must be at least 1.' })
    .max(200, { error: 'limit must be at most 200.' })
    .default(100),
  before: z.uuid({ error: 'before must be the id of an Activity entry.' }).optional(),
});

/** A Review's Activity as a timeline, for every member of its Team. */
export function reviewActivityRouter({ db }: { db: Database }): Router {
  const router = Router();

  router.get('/reviews/:reviewId/activity', async (req, res) => {
    const { reviewId } = parse(reviewParams, req.params);
    const { limit, before } = parse(reviewActivityQuery, req.query);
    await requireReview(db, res.locals.user.id, reviewId);
    res.json(await listReviewActivity(db, reviewId, { limit, beforeId: before }));
  });

  return router;
}
