import type { ErrorEnvelope } from '@/server/contracts/errors';
import { EngineInputError } from '@/server/engine';

import { isDatabaseUnavailable } from './database-errors';
import { ApiError } from './errors';

export const databaseUnavailableMessage =
  'The database is not reachable right now; nothing was changed. Try again in a moment.';

/** What a failure becomes for the client, whichever way it leaves (HTTP response or socket ack). */
export type MappedError = {
  status: number;
  body: ErrorEnvelope['error'];
  /** Seconds the client should wait before trying again, when known. */
  retryAfter?: number;
  /** `unexpected` failures are logged in full; `unavailable` with one line; the rest not at all. */
  log: 'none' | 'unavailable' | 'unexpected';
};

type BodyParserError = Error & { type?: string; status?: number; limit?: number };

/**
 * The one error mapper. ApiErrors keep their status; the engine's input errors are a 422
 * naming the field; body-parser failures their 4xx; a lost database 503; anything else a
 * 500 that shows no detail (the request id points to the log).
 */
export function mapError(error: unknown): MappedError {
  if (error instanceof ApiError) {
    return { status: error.status, body: { code: error.code, message: error.message, ...error.details }, log: 'none' };
  }
  if (error instanceof EngineInputError) {
    const api = ApiError.invalidField(error.field, error.message);
    return { status: 422, body: { code: api.code, message: api.message, ...api.details }, log: 'none' };
  }
  const parserError = error as BodyParserError;
  if (parserError?.type === 'entity.parse.failed') {
    return {
      status: 400,
      body: { code: 'malformed_json', message: 'The request body is not valid JSON.' },
      log: 'none',
    };
  }
  if (parserError?.type === 'entity.too.large') {
    return {
      status: 413,
      body: { code: 'body_too_large', message: `The request body is larger than ${parserError.limit} bytes.` },
      log: 'none',
    };
  }
  if (parserError?.type === 'encoding.unsupported' || parserError?.type === 'charset.unsupported') {
    return { status: 415, body: { code: 'unsupported_encoding', message: parserError.message }, log: 'none' };
  }
  if (typeof parserError?.status === 'number' && parserError.status >= 400 && parserError.status < 500) {
    return { status: parserError.status, body: { code: 'bad_request', message: parserError.message }, log: 'none' };
  }
  if (isDatabaseUnavailable(error)) {
    // The pool reconnects by itself once Postgres is back; a transaction that failed to
    // reach it committed nothing, so the answer can say so.
    return {
      status: 503,
      body: { code: 'database_unavailable', message: databaseUnavailableMessage },
      retryAfter: 5,
      log: 'unavailable',
    };
  }
  return {
    status: 500,
    body: {
      code: 'internal',
      message: 'Something went wrong on the server. Try again; if it persists, quote the request id.',
    },
    log: 'unexpected',
  };
}
