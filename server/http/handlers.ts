import { randomUUID } from 'node:crypto';

import type { ErrorRequestHandler, RequestHandler } from 'express';

import type { ErrorEnvelope } from '@/server/contracts/errors';

import { mapError } from './error-mapper';
import { ApiError } from './errors';

/** Gives every request an id, echoed in `x-request-id` and in error envelopes. */
export const requestId: RequestHandler = (req, res, next) => {
  const incoming = req.get('x-request-id');
  res.locals.requestId = incoming && /^[\w-]{1,64}$/.test(incoming) ? incoming : randomUUID();
  res.setHeader('x-request-id', res.locals.requestId);
  next();
};

/** Unknown API paths get the envelope, not an HTML page. */
export const apiNotFound: RequestHandler = (req) => {
  throw new ApiError(404, 'route_not_found', `No API route ${req.method} ${req.path}.`);
};

/** The one error handler: every failure leaves as `{ error: { code, message, … } }`. */
export const errorHandler: ErrorRequestHandler = (err, req, res, _next) => {
  const requestId = res.locals.requestId as string | undefined;
  const mapped = mapError(err);
  if (mapped.log === 'unavailable') {
    console.error(`[http] ${req.method} ${req.originalUrl}: the database is not reachable (request ${requestId})`);
  } else if (mapped.log === 'unexpected') {
    console.error(`[http] ${req.method} ${req.originalUrl} failed (request ${requestId}):`, err);
  }
  if (res.headersSent) return;
  if (mapped.retryAfter) res.setHeader('Retry-After', String(mapped.retryAfter));
  res.status(mapped.status).json({ error: { ...mapped.body, requestId } } satisfies ErrorEnvelope);
};
