import type { RequestHandler } from 'express';

import { ApiError } from './errors';

const readOnly = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * Refuses a state-changing request sent by a page of another site, as better-auth does on
 * its own routes: SameSite cookies and CORS alone should not be all that stands in the way.
 * A request without Origin passes only when it carries no cookie (no session to misuse).
 */
export function refuseForeignOrigin(origin: string): RequestHandler {
  return (req, _res, next) => {
    if (readOnly.has(req.method)) return next();
    const sent = req.get('origin');
    const foreign = sent === undefined ? req.get('cookie') !== undefined : sent !== origin;
    if (foreign) {
      throw new ApiError(403, 'foreign_origin', 'This request came from a page outside Cyclemoot and was refused.');
    }
    next();
  };
}
