import { Router } from 'express';

import { evaluateRequestSchema, sweepRequestSchema } from '@/server/contracts/cycle';
import { parse } from '@/server/http/errors';
import { evaluate, sweep } from '@/server/services/cycles';

/** POST /evaluate (one cycle) and POST /sweep (one input over a range); mounted at /api/cycles. */
export function cyclesRouter(): Router {
  const router = Router();

  router.post('/evaluate', (req, res) => {
    const input = parse(evaluateRequestSchema, req.body);
    res.json(evaluate(input));
  });

  router.post('/sweep', (req, res) => {
    const input = parse(sweepRequestSchema, req.body);
    res.json(sweep(input));
  });

  return router;
}
