import { Router } from 'express';

import { evaluateRequestSchema, sweepRequestSchema } from '@/server/contracts/cycle';
import { EngineInputError, evaluateCycle, sweepCycle } from '@/server/engine';
import { ApiError, parse } from '@/server/http/errors';

/** Runs the engine and turns its input errors into a 422 naming the field. */
function runEngine<T>(compute: () => T): T {
  try {
    return compute();
  } catch (error) {
    if (error instanceof EngineInputError) throw ApiError.invalidField(error.field, error.message);
    throw error;
  }
}

/** POST /evaluate (one cycle) and POST /sweep (one input over a range); mounted at /api/cycles. */
export function cyclesRouter(): Router {
  const router = Router();

  router.post('/evaluate', (req, res) => {
    const input = parse(evaluateRequestSchema, req.body);
    res.json(runEngine(() => evaluateCycle(input)));
  });

  router.post('/sweep', (req, res) => {
    const input = parse(sweepRequestSchema, req.body);
    res.json(runEngine(() => sweepCycle(input)));
  });

  return router;
}
