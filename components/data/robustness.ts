import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useEffect } from 'react';

import { getRealtimeSocket } from '@/realtime/client';
import type { Robustness, StartRunInput } from '@/server/contracts/robustness';

import { api } from './api';
import { onAnyReviewNews, onReviewNews } from './live';
import { apiOrigin } from './origin';
import { STALE } from './stale-times';

const r = (reviewId: string) => encodeURIComponent(reviewId);

export const robustnessKeys = { run: (reviewId: string) => ['robustness', reviewId] as const };

/** GET /api/reviews/:reviewId/robustness — the latest run; kept current by `useRobustnessLiveUpdates`. */
export function useRobustnessQuery(reviewId: string) {
  return useQuery({
    queryKey: robustnessKeys.run(reviewId),
    queryFn: ({ signal }) => api.get<Robustness>(`/api/reviews/${r(reviewId)}/robustness`, signal),
    staleTime: STALE.seconds.thirty,
  });
}

export function useStartRunMutation(reviewId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: StartRunInput) => api.post<{ runId: string }>(`/api/reviews/${r(reviewId)}/robustness`, input),
    onSuccess: () => void qc.invalidateQueries({ queryKey: robustnessKeys.run(reviewId) }),
  });
}

export function useCancelRunMutation(reviewId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (runId: string) =>
      api.delete<Robustness>(`/api/reviews/${r(reviewId)}/robustness/${encodeURIComponent(runId)}`),
    onSuccess: (run) => qc.setQueryData(robustnessKeys.run(reviewId), run),
  });
}

/**
 * The room's news of a run: progress patches the count in the cache (no request), the end
 * of a run fetches the result once; so does anything that can put it out of date (a candidate,
 * the basis, a score, the site year) and a reconnect.
 */
export function useRobustnessLiveUpdates(reviewId: string | undefined) {
  const qc = useQueryClient();
  useEffect(() => {
    if (!reviewId) return;
    const socket = getRealtimeSocket(apiOrigin());
    const refetch = () => void qc.invalidateQueries({ queryKey: robustnessKeys.run(reviewId) });
    const offs = [
      onReviewNews(socket, 'robustness:progress', ({ reviewId: of, runId, done }) => {
        if (of !== reviewId) return;
        const cached = qc.getQueryData<Robustness>(robustnessKeys.run(reviewId));
        if (!cached || cached.runId !== runId) return refetch();
        qc.setQueryData<Robustness>(robustnessKeys.run(reviewId), { ...cached, done: Math.max(cached.done, done) });
      }),
      onReviewNews(socket, 'robustness:finished', (news) => news.reviewId === reviewId && refetch()),
      onAnyReviewNews(
        socket,
        ['candidate:added', 'candidate:recomputed', 'basis:updated', 'score:changed', 'site-year:updated'],
        refetch,
      ),
    ];
    socket.on('connect', refetch);
    return () => {
      for (const off of offs) off();
      socket.off('connect', refetch);
    };
  }, [reviewId, qc]);
}
