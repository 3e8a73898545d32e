import { Router } from 'express';

import type { Database } from '@/db/client';
import { createReviewInput, listReviewsQuery, updateReviewInput } from '@/server/contracts/review';
import { parse } from '@/server/http/errors';
import { reviewParams, teamParams } from '@/server/http/params';
import { requireReview, requireTeam } from '@/server/services/access';
import type { Broadcast } from '@/server/services/broadcast';
import { createReview, getReview, listReviews, updateReview } from '@/server/services/reviews';

export function reviewsRouter({ db, broadcast }: { db: Database; broadcast: Broadcast }): Router {
  const router = Router();

  router.get('/teams/:teamId/reviews', async (req, res) => {
    const { teamId } = parse(teamParams, req.params);
    const { status } = parse(listReviewsQuery, req.query);
    await requireTeam(db, res.locals.user.id, teamId);
    res.json(await listReviews(db, teamId, status));
  });

  router.post('/teams/:teamId/reviews', async (req, res) => {
    const { teamId } = parse(teamParams, req.params);
    const input = parse(createReviewInput, req.body);
    await requireTeam(db, res.locals.user.id, teamId, { review: ['create'] });
    const created = await createReview({ db, broadcast, actorId: res.locals.user.id }, teamId, input);
    res.status(201).json(created);
  });

  router.get('/reviews/:reviewId', async (req, res) => {
    const { reviewId } = parse(reviewParams, req.params);
    const access = await requireReview(db, res.locals.user.id, reviewId);
    res.json({ ...(await getReview(db, reviewId)), myRole: access.role });
  });

  router.patch('/reviews/:reviewId', async (req, res) => {
    const { reviewId } = parse(reviewParams, req.params);
    const input = parse(updateReviewInput, req.body);
    // Renaming and archiving are separate permissions; ask for the ones this change needs.
    const needed: Array<'update' | 'archive'> = [];
    if (input.name !== undefined || input.summary !== undefined) needed.push('update');
    if (input.status !== undefined) needed.push('archive');
    await requireReview(db, res.locals.user.id, reviewId, { review: needed });
    res.json(await updateReview({ db, broadcast, actorId: res.locals.user.id }, reviewId, input));
  });

  return router;
}
