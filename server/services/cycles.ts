import type { z } from 'zod';

import type { evaluateRequestSchema, sweepRequestSchema } from '@/server/contracts/cycle';
import { evaluateCycle, sweepCycle } from '@/server/engine';

/**
 * The one caller of the engine (REST evaluate and sweep, the command line, and the board's
 * recompute). The engine's input errors travel on as they are: the error mapper makes
 * them a 422 naming the field.
 */
export function evaluate(input: z.output<typeof evaluateRequestSchema>) {
  return evaluateCycle(input);
}

export function sweep(input: z.output<typeof sweepRequestSchema>) {
  return sweepCycle(input);
}
