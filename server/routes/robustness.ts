import { Router } from 'express';
import { z } from 'zod';

import type { Database } from '@/db/client';
import { startRunInput } from '@/server/contracts/robustness';
import { parse } from '@/server/http/errors';
import { reviewParams } from '@/server/http/params';
import { requireReview } from '@/server/services/access';
import type { Broadcast } from '@/server/services/broadcast';
import { cancelRun, getRobustness, startRun } from '@/server/services/robustness';

const runParams = z.object({ reviewId: z.string().min(1).max(100), runId: z.uuid({ error: 'Not a run id.' }) });

/** How sure the ranking is: start (Lead, Engineer, Owner), read (members), cancel (Lead, Owner). */
export function robustnessRouter({ db, broadcast }: { db: Database; broadcast: Broadcast }): Router {
  const router = Router();

  router.get('/reviews/:reviewId/robustness', async (req, res) => {
    const { reviewId } = parse(reviewParams, req.params);
    await requireReview(db, res.locals.user.id, reviewId);
    res.json(await getRobustness(db, reviewId));
  });

  router.post('/reviews/:reviewId/robustness', async (req, res) => {
    const { reviewId } = parse(reviewParams, req.params);
    const input = parse(startRunInput, req.body);
    const actorId = res.locals.user.id;
    await requireReview(db, actorId, reviewId, { robustness: ['run'] });
    res.status(202).json(await startRun({ db, broadcast, actorId }, reviewId, input));
  });

  router.delete('/reviews/:reviewId/robustness/:runId', async (req, res) => {
    const { reviewId, runId } = parse(runParams, req.params);
    const actorId = res.locals.user.id;
    await requireReview(db, actorId, reviewId, { robustness: ['cancel'] });
    res.json(await cancelRun({ db, broadcast, actorId }, reviewId, runId));
  });

  return router;
}
