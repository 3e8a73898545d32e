import { Router } from 'express';

import type { Database } from '@/db/client';
import { putScoresInput } from '@/server/contracts/scores';
import { parse } from '@/server/http/errors';
import { reviewParams } from '@/server/http/params';
import { requireReview } from '@/server/services/access';
import type { Broadcast } from '@/server/services/broadcast';
import { matrixOf } from '@/server/services/matrix';
import { matrixExport } from '@/server/services/matrix-exports';
import { putScores, scoresOf } from '@/server/services/scores';

/**
 * Scores and the comparison matrix of a Review: every member reads them (an Observer too);
 * the Lead, Engineers and Reviewers score. The exports are attachment downloads.
 */
export function scoresRouter({ db, broadcast }: { db: Database; broadcast: Broadcast }): Router {
  const router = Router();

  router.get('/reviews/:reviewId/scores', async (req, res) => {
    const { reviewId } = parse(reviewParams, req.params);
    await requireReview(db, res.locals.user.id, reviewId);
    res.json(await scoresOf(db, reviewId, res.locals.user.id));
  });

  router.put('/reviews/:reviewId/scores', async (req, res) => {
    const { reviewId } = parse(reviewParams, req.params);
    const { scores } = parse(putScoresInput, req.body);
    const userId = res.locals.user.id;
    await requireReview(db, userId, reviewId, { score: ['cast'] });
    res.json(await putScores({ db, broadcast, actorId: userId }, reviewId, scores));
  });

  router.get('/reviews/:reviewId/matrix', async (req, res) => {
    const { reviewId } = parse(reviewParams, req.params);
    await requireReview(db, res.locals.user.id, reviewId);
    res.json(await matrixOf(db, reviewId, res.locals.user.id));
  });

  router.get('/reviews/:reviewId/matrix.csv', async (req, res) => {
    const { reviewId } = parse(reviewParams, req.params);
    await requireReview(db, res.locals.user.id, reviewId);
    const { fileName, body } = await matrixExport(db, reviewId, res.locals.user.id, 'csv');
    res.attachment(fileName).type('text/csv; charset=utf-8').set('Cache-Control', 'no-store');
    // A byte-order mark, so a spreadsheet opening the file reads it as UTF-8.
    res.send(`\uFEFF${body as string}`);
  });

  router.get('/reviews/:reviewId/matrix.xlsx', async (req, res) => {
    const { reviewId } = parse(reviewParams, req.params);
    await requireReview(db, res.locals.user.id, reviewId);
    const { fileName, body } = await matrixExport(db, reviewId, res.locals.user.id, 'xlsx');
    res
      .attachment(fileName)
      .type('application/vnd.openxmlformats-officedocument.spreadsheetml.sheet')
      .set('Cache-Control', 'no-store');
    res.send(body);
  });

  return router;
}
