import { randomUUID } from 'node:crypto';

import type { ErrorRequestHandler, RequestHandler } from 'express';

import type { ErrorEnvelope } from '@/server/contracts/errors';

import { isDatabaseUnavailable } from './database-errors';
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

export const databaseUnavailableMessage =
  'The database is not reachable right now; nothing was changed. Try again in a moment.';

type BodyParserError = Error & { type?: string; status?: number; limit?: number };

/** The one error handler: every failure leaves as `{ error: { code, message, … } }`. */
export const errorHandler: ErrorRequestHandler = (err, req, res, _next) => {
  const requestId = res.locals.requestId as string | undefined;
  const send = (status: number, body: ErrorEnvelope['error']) => {
    if (res.headersSent) return;
    res.status(status).json({ error: { ...body, requestId } } satisfies ErrorEnvelope);
  };
  if (err instanceof ApiError) {
    send(err.status, { code: err.code, message: err.message, ...err.details });
    return;
  }
  const parserError = err as BodyParserError;
  if (parserError.type === 'entity.parse.failed') {
    send(400, { code: 'malformed_json', message: 'The request body is not valid JSON.' });
    return;
  }
  if (parserError.type === 'entity.too.large') {
    send(413, { code: 'body_too_large', message: `The request body is larger than ${parserError.limit} bytes.` });
    return;
  }
  if (parserError.type === 'encoding.unsupported' || parserError.type === 'charset.unsupported') {
    send(415, { code: 'unsupported_encoding', message: parserError.message });
    return;
  }
  if (typeof parserError.status === 'number' && parserError.status >= 400 && parserError.status < 500) {
    send(parserError.status, { code: 'bad_request', message: parserError.message });
    return;
  }
  if (isDatabaseUnavailable(err)) {
    // The pool reconnects by itself once Postgres is back; a transaction that failed to
    // reach it committed nothing, so the answer can say so.
    console.error(`[http] ${req.method} ${req.originalUrl}: the database is not reachable (request ${requestId})`);
    res.setHeader('Retry-After', '5');
    send(503, { code: 'database_unavailable', message: databaseUnavailableMessage });
    return;
  }
  console.error(`[http] ${req.method} ${req.originalUrl} failed (request ${requestId}):`, err);
  send(500, {
    code: 'internal',
    message: 'Something went wrong on the server. Try again; if it persists, quote the request id.',
  });
};
