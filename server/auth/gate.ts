import { getRequest, setResponse } from 'better-call/node';
import express, { Router, type Request, type Response } from 'express';
import { RateLimiterMemory, RateLimiterRes } from 'rate-limiter-flexible';
import type { z } from 'zod';

import { isTeamOwnerRuleViolation } from '@/db/constraints';
import type { Auth } from '@/server/auth/auth';
import { clientAddressHeader } from '@/server/auth/client-address';
import {
  emptyInput,
  invitationInput,
  inviteMemberInput,
  removeMemberInput,
  resendVerificationInput,
  signInInput,
  signUpInput,
  teamIdInput,
  updateMemberRoleInput,
  verifyEmailQuery,
} from '@/server/contracts/auth';
import { createTeamInput } from '@/server/contracts/team';
import { ApiError, parse } from '@/server/http/errors';

/** A limit: at most `points` requests in `seconds`. */
export type LimitRule = { points: number; seconds: number };

export type AuthLimits = {
  /** Every auth request from one client address. */
  perAddress: LimitRule;
  signInPerAddress: LimitRule;
  /** Sign-in attempts for one account, from anywhere; a successful sign-in clears it. */
  signInPerAccount: LimitRule;
  signUpPerAddress: LimitRule;
  /** Mails one address can be sent (sign-up, a new confirmation link). */
  mailPerAccount: LimitRule;
};

/**
 * A meeting room signs in from one address (behind one NAT, or all on loopback here), so
 * the per-address limits are roomy; guessing one account's password is bounded per
 * account, wherever the guesses come from, and does not touch anyone else's sign-in.
 */
export const productionAuthLimits: AuthLimits = {
  perAddress: { points: 600, seconds: 60 },
  signInPerAddress: { points: 60, seconds: 60 },
  signInPerAccount: { points: 10, seconds: 15 * 60 },
  signUpPerAddress: { points: 10, seconds: 60 },
  mailPerAccount: { points: 5, seconds: 60 * 60 },
};

type LimitName = keyof AuthLimits;

/** The largest body any auth endpoint needs (a sign-up is well under 1 kB). */
export const authBodyLimitBytes = 16 * 1024;

type Endpoint = {
  body?: z.ZodType;
  query?: z.ZodType;
  /** Buckets this request draws on, besides the per-address one. */
  limits?: (input: { address: string; body: Record<string, unknown> }) => Array<[LimitName, string]>;
};

const emailOf = (body: Record<string, unknown>) => String(body.email);

/**
 * The better-auth endpoints the app uses, and only those: every other route better-auth
 * has (listing a Team's invitations to any member, changing a profile image, organization
 * metadata …) bypassed the product's rules and is not served.
 */
const endpoints: Record<string, Endpoint> = {
  'POST /sign-up/email': {
    body: signUpInput,
    limits: ({ address, body }) => [
      ['signUpPerAddress', address],
      ['mailPerAccount', emailOf(body)],
    ],
  },
  'POST /sign-in/email': {
    body: signInInput,
    limits: ({ address, body }) => [
      ['signInPerAddress', address],
      ['signInPerAccount', emailOf(body)],
    ],
  },
  'POST /send-verification-email': {
    body: resendVerificationInput,
    limits: ({ body }) => [['mailPerAccount', emailOf(body)]],
  },
  'GET /verify-email': { query: verifyEmailQuery },
  'POST /sign-out': { body: emptyInput.optional() },
  'GET /get-session': {},
  'POST /organization/create': { body: createTeamInput },
  'POST /organization/delete': { body: teamIdInput },
  'POST /organization/leave': { body: teamIdInput },
  'POST /organization/invite-member': { body: inviteMemberInput },
  'POST /organization/cancel-invitation': { body: invitationInput },
  'POST /organization/accept-invitation': { body: invitationInput },
  'POST /organization/reject-invitation': { body: invitationInput },
  'POST /organization/remove-member': { body: removeMemberInput },
  'POST /organization/update-member-role': { body: updateMemberRoleInput },
};

function minutes(ms: number) {
  const m = Math.ceil(ms / 60_000);
  return m <= 1 ? 'a minute' : `${m} minutes`;
}

const limitMessages: Record<LimitName, (wait: string) => string> = {
  perAddress: (w) => `Too many requests from your network. Try again in ${w}.`,
  signInPerAddress: (w) => `Too many sign-in attempts from your network. Try again in ${w}.`,
  signInPerAccount: (w) => `Too many sign-in attempts for this account. Try again in ${w}.`,
  signUpPerAddress: (w) => `Too many new accounts from your network. Try again in ${w}.`,
  mailPerAccount: (w) => `Too many e-mails to this address. Try again in ${w}.`,
};

/**
 * Everything in front of better-auth: only the endpoints above, bodies capped and checked
 * with the product's schemas before better-auth reads them, limits per client address and
 * per account, the client address taken from the socket (or a configured proxy), and
 * better-auth's unexpected failures answered in the product's envelope.
 */
export function authGate({
  auth,
  origin,
  limits = productionAuthLimits,
}: {
  auth: Auth;
  origin: string;
  limits?: AuthLimits;
}): Router {
  const limiters = Object.fromEntries(
    Object.entries(limits).map(([name, rule]) => [
      name,
      new RateLimiterMemory({ keyPrefix: name, points: rule.points, duration: rule.seconds }),
    ]),
  ) as Record<LimitName, RateLimiterMemory>;

  const draw = async (buckets: Array<[LimitName, string]>) => {
    for (const [name, key] of buckets) {
      try {
        await limiters[name].consume(key.toLowerCase());
      } catch (error) {
        if (!(error instanceof RateLimiterRes)) throw error;
        const limited = new ApiError(429, 'rate_limited', limitMessages[name](minutes(error.msBeforeNext)));
        throw Object.assign(limited, { retryAfterSeconds: Math.ceil(error.msBeforeNext / 1000) });
      }
    }
  };

  const router = Router();
  router.use(express.json({ type: () => true, limit: authBodyLimitBytes, strict: true }));
  router.use(async (req: Request, res: Response) => {
    const endpoint = endpoints[`${req.method} ${req.path}`];
    if (!endpoint) throw new ApiError(404, 'route_not_found', `No API route ${req.method} /api/auth${req.path}.`);
    const address = req.ip ?? req.socket.remoteAddress ?? 'unknown';
    try {
      await draw([['perAddress', address]]);
      if (endpoint.query) parse(endpoint.query, req.query);
      const body = endpoint.body ? parse(endpoint.body, req.body) : undefined;
      await draw(endpoint.limits?.({ address, body: (body ?? {}) as Record<string, unknown> }) ?? []);
      // better-auth reads the checked, normalised body, never the raw one.
      req.body = body;
      req.headers['content-type'] = 'application/json';
      delete req.headers['content-length'];
    } catch (error) {
      const wait = (error as { retryAfterSeconds?: number }).retryAfterSeconds;
      if (wait) res.setHeader('retry-after', String(wait));
      throw error;
    }
    req.headers[clientAddressHeader] = address;

    // better-auth throws what it did not expect (`onAPIError.throw`): the owner rule of the
    // database becomes a 409, and the error handler answers a lost database with 503.
    let response: globalThis.Response;
    try {
      response = await auth.handler(getRequest({ request: req, base: origin }));
    } catch (error) {
      if (isTeamOwnerRuleViolation(error)) {
        throw new ApiError(409, 'team_needs_owner', 'A Team must keep at least one Owner.');
      }
      throw error;
    }
    if (response.status >= 500)
      throw new Error(`better-auth answered ${response.status} for ${req.method} ${req.path}`);
    if (req.path === '/sign-in/email' && response.status === 200) {
      await limiters.signInPerAccount.delete(emailOf(req.body as Record<string, unknown>).toLowerCase());
    }
    await setResponse(res, response);
  });
  return router;
}
