import { useQuery } from '@tanstack/react-query';

import type { Activity } from '@/server/contracts/team';

import { api } from './api';
import { STALE } from './stale-times';

export const activityKeys = {
  all: ['activity'] as const,
  team: (teamId: string) => ['activity', teamId] as const,
  review: (reviewId: string) => ['activity', 'review', reviewId] as const,
};

/** GET /api/teams/:teamId/activity — newest first. */
export function useActivityQuery(teamId: string | undefined) {
  return useQuery({
    queryKey: activityKeys.team(teamId ?? ''),
    queryFn: ({ signal }) => api.get<Activity[]>(`/api/teams/${encodeURIComponent(teamId!)}/activity`, signal),
    staleTime: STALE.seconds.ten,
    enabled: !!teamId,
  });
}

/** GET /api/reviews/:reviewId/activity — newest first. */
export function useReviewActivityQuery(reviewId: string | undefined) {
  return useQuery({
    queryKey: activityKeys.review(reviewId ?? ''),
    queryFn: ({ signal }) =>
      api.get<Activity[]>(`/api/reviews/${encodeURIComponent(reviewId!)}/activity?limit=200`, signal),
    staleTime: STALE.seconds.ten,
    enabled: !!reviewId,
  });
}
