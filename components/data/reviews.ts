import { useMutation, useQuery, useQueryClient, type QueryClient } from '@tanstack/react-query';

import type { CreateReviewInput, Review, UpdateReviewInput } from '@/server/contracts/review';
import type { TeamRole } from '@/server/contracts/roles';

import { activityKeys } from './activity';
import { api } from './api';
import { STALE } from './stale-times';

export type ReviewListStatus = 'active' | 'archived' | 'all';
export type ReviewWithRole = Review & { myRole: TeamRole };

export const reviewKeys = {
  all: ['reviews'] as const,
  team: (teamId: string) => ['reviews', 'team', teamId] as const,
  list: (teamId: string, status: ReviewListStatus) => ['reviews', 'team', teamId, status] as const,
  detail: (reviewId: string) => ['reviews', 'detail', reviewId] as const,
};

const listStatuses: ReviewListStatus[] = ['active', 'archived', 'all'];

/**
 * Puts a created or changed Review into every cached list of its team (moving it between
 * the active and archived lists) and into its detail entry. Used by mutations and by the
 * live `review:created` / `review:updated` events, so both paths agree.
 */
export function upsertReviewInCache(qc: QueryClient, review: Review) {
  for (const status of listStatuses) {
    qc.setQueryData<Review[]>(reviewKeys.list(review.teamId, status), (list) => {
      if (!list) return list;
      const belongs = status === 'all' || status === review.status;
      const index = list.findIndex((r) => r.id === review.id);
      if (index === -1) return belongs ? [review, ...list] : list;
      if (!belongs) return list.filter((r) => r.id !== review.id);
      // An older copy (e.g. an event that overtook the mutation's answer) never wins.
      if (list[index]!.updatedAt > review.updatedAt) return list;
      const next = list.slice();
      next[index] = review;
      return next;
    });
  }
  qc.setQueryData<ReviewWithRole>(reviewKeys.detail(review.id), (old) =>
    old && old.updatedAt <= review.updatedAt ? { ...old, ...review } : old,
  );
}

/** GET /api/teams/:teamId/reviews?status= */
export function useReviewsQuery(teamId: string | undefined, status: ReviewListStatus) {
  return useQuery({
    queryKey: reviewKeys.list(teamId ?? '', status),
    queryFn: ({ signal }) =>
      api.get<Review[]>(`/api/teams/${encodeURIComponent(teamId!)}/reviews?status=${status}`, signal),
    staleTime: STALE.seconds.thirty,
    enabled: !!teamId,
  });
}

/** GET /api/reviews/:reviewId — the Review with my role in its Team. */
export function useReviewQuery(reviewId: string | undefined) {
  return useQuery({
    queryKey: reviewKeys.detail(reviewId ?? ''),
    queryFn: ({ signal }) => api.get<ReviewWithRole>(`/api/reviews/${encodeURIComponent(reviewId!)}`, signal),
    staleTime: STALE.seconds.thirty,
    enabled: !!reviewId,
  });
}

export function useCreateReviewMutation(teamId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateReviewInput) =>
      api.post<Review>(`/api/teams/${encodeURIComponent(teamId)}/reviews`, input),
    onSuccess: (review) => {
      upsertReviewInCache(qc, review);
      void qc.invalidateQueries({ queryKey: activityKeys.team(teamId) });
    },
  });
}

export function useUpdateReviewMutation() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ reviewId, patch }: { reviewId: string; patch: UpdateReviewInput }) =>
      api.patch<Review>(`/api/reviews/${encodeURIComponent(reviewId)}`, patch),
    onSuccess: (review) => {
      upsertReviewInCache(qc, review);
      void qc.invalidateQueries({ queryKey: activityKeys.team(review.teamId) });
    },
  });
}
