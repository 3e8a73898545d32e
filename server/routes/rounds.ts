import { Router } from 'express';
import { z } from 'zod';

import type { Database } from '@/db/client';
import { ballotInput, openRoundInput } from '@/server/contracts/board';
import { parse } from '@/server/http/errors';
import { reviewParams } from '@/server/http/params';
import { requireReview } from '@/server/services/access';
import type { Broadcast } from '@/server/services/broadcast';
import { castBallot, closeRound, listRounds, openRound } from '@/server/services/rounds';

const roundParams = z.object({ reviewId: z.string().min(1).max(100), roundId: z.string().min(1).max(100) });

/** Closing takes no fields; an empty body or `{}`. */
const closeRoundInput = z.strictObject({});

/** Preference rounds of a Review: the Lead (or Owner) opens and closes, members cast ballots. */
export function roundsRouter({ db, broadcast }: { db: Database; broadcast: Broadcast }): Router {
  const router = Router();

  router.get('/reviews/:reviewId/rounds', async (req, res) => {
    const { reviewId } = parse(reviewParams, req.params);
    const access = await requireReview(db, res.locals.user.id, reviewId);
    res.json(await listRounds(db, reviewId, { userId: res.locals.user.id, role: access.role }));
  });

  router.post('/reviews/:reviewId/rounds', async (req, res) => {
    const { reviewId } = parse(reviewParams, req.params);
    const input = parse(openRoundInput, req.body);
    const userId = res.locals.user.id;
    const access = await requireReview(db, userId, reviewId, { round: ['open'] });
    const round = await openRound({ db, broadcast, actorId: userId }, reviewId, input, { userId, role: access.role });
    res.status(201).json(round);
  });

  router.put('/reviews/:reviewId/rounds/:roundId/ballot', async (req, res) => {
    const { reviewId, roundId } = parse(roundParams, req.params);
    const { votes } = parse(ballotInput, req.body);
    const userId = res.locals.user.id;
    const access = await requireReview(db, userId, reviewId, { vote: ['cast'] });
    res.json(
      await castBallot({ db, broadcast, actorId: userId }, reviewId, roundId, votes, { userId, role: access.role }),
    );
  });

  router.post('/reviews/:reviewId/rounds/:roundId/close', async (req, res) => {
    const { reviewId, roundId } = parse(roundParams, req.params);
    parse(closeRoundInput, req.body ?? {});
    const userId = res.locals.user.id;
    const access = await requireReview(db, userId, reviewId, { round: ['close'] });
    res.json(await closeRound({ db, broadcast, actorId: userId }, reviewId, roundId, { userId, role: access.role }));
  });

  return router;
}
