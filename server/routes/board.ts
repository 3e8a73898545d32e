import { Router } from 'express';
import { z } from 'zod';

import type { Database } from '@/db/client';
import { createCandidateInput, designBasisInput, updateCandidateInput } from '@/server/contracts/board';
import type { ErrorEnvelope } from '@/server/contracts/errors';
import { mapError } from '@/server/http/error-mapper';
import { parse } from '@/server/http/errors';
import { reviewParams } from '@/server/http/params';
import { requireReview } from '@/server/services/access';
import { getBoard, updateDesignBasis } from '@/server/services/board';
import type { Broadcast } from '@/server/services/broadcast';
import { CandidateConflict, createCandidate, updateCandidate } from '@/server/services/candidates';

const candidateParams = z.object({ reviewId: z.string().min(1).max(100), candidateId: z.string().min(1).max(100) });

/** The live board of a Review: the board itself, its design basis and its candidates. */
export function boardRouter({ db, broadcast }: { db: Database; broadcast: Broadcast }): Router {
  const router = Router();

  router.get('/reviews/:reviewId/board', async (req, res) => {
    const { reviewId } = parse(reviewParams, req.params);
    const userId = res.locals.user.id;
    const access = await requireReview(db, userId, reviewId);
    res.json(await getBoard(db, reviewId, { userId, role: access.role }));
  });

  router.put('/reviews/:reviewId/design-basis', async (req, res) => {
    const { reviewId } = parse(reviewParams, req.params);
    const input = parse(designBasisInput, req.body);
    await requireReview(db, res.locals.user.id, reviewId, { basis: ['update'] });
    res.json(await updateDesignBasis({ db, broadcast, actorId: res.locals.user.id }, reviewId, input));
  });

  router.post('/reviews/:reviewId/candidates', async (req, res) => {
    const { reviewId } = parse(reviewParams, req.params);
    const input = parse(createCandidateInput, req.body);
    await requireReview(db, res.locals.user.id, reviewId, { candidate: ['create'] });
    res.status(201).json(await createCandidate({ db, broadcast, actorId: res.locals.user.id }, reviewId, input));
  });

  router.patch('/reviews/:reviewId/candidates/:candidateId', async (req, res) => {
    const { reviewId, candidateId } = parse(candidateParams, req.params);
    const input = parse(updateCandidateInput, req.body);
    const { teamId } = await requireReview(db, res.locals.user.id, reviewId, { candidate: ['update'] });
    const { id: actorId, name: actorName } = res.locals.user;
    try {
      res.json(await updateCandidate({ db, broadcast, actorId, actorName, teamId }, reviewId, candidateId, input));
    } catch (error) {
      // A stale revision answers with the candidate as it is now, beside the envelope.
      if (!(error instanceof CandidateConflict)) throw error;
      const envelope: ErrorEnvelope = { error: { ...mapError(error).body, requestId: res.locals.requestId } };
      res.status(409).json({ ...envelope, candidate: error.candidate });
    }
  });

  return router;
}
