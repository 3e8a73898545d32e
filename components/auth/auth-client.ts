import { organizationClient } from 'better-auth/client/plugins';
import { createAuthClient } from 'better-auth/react';

import { apiOrigin } from '@/components/data/origin';
import { accessControl, roles } from '@/server/contracts/roles';

/**
 * better-auth's client: sign-up, sign-in, sign-out, the session, and Teams (better-auth
 * organizations) with our five roles. Cookies on the same origin.
 */
export const authClient = createAuthClient({
  baseURL: apiOrigin() + '/api/auth',
  fetchOptions: { credentials: 'include' },
  plugins: [organizationClient({ ac: accessControl, roles })],
});

export type Session = typeof authClient.$Infer.Session;
