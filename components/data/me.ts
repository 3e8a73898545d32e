import { useQuery } from '@tanstack/react-query';

import type { Me } from '@/server/contracts/team';

import { api } from './api';
import { STALE } from './stale-times';

export const meKeys = {
  all: ['me'] as const,
};

/** GET /api/me — the signed-in user and their Teams with their role in each. */
export function useMeQuery(enabled = true) {
  return useQuery({
    queryKey: meKeys.all,
    queryFn: ({ signal }) => api.get<Me>('/api/me', signal),
    staleTime: STALE.minutes.one,
    enabled,
  });
}
