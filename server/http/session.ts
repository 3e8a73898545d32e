import { fromNodeHeaders } from 'better-auth/node';
import type { RequestHandler } from 'express';

import type { Auth } from '@/server/auth/auth';

import { ApiError } from './errors';

export type SignedInUser = { id: string; name: string; email: string };

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface Locals {
      requestId: string;
      user: SignedInUser;
    }
  }
}

/** Rejects requests without a valid session with 401; otherwise puts the user in `res.locals.user`. */
export function requireSession(auth: Auth): RequestHandler {
  return async (req, res, next) => {
    const session = await auth.api.getSession({ headers: fromNodeHeaders(req.headers) });
    if (!session) throw ApiError.unauthorized();
    res.locals.user = { id: session.user.id, name: session.user.name, email: session.user.email };
    next();
  };
}
