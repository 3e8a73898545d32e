import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useEffect } from 'react';

import { getRealtimeSocket } from '@/realtime/client';
import { reviewNews } from '@/realtime/events';
import type { Robustness, StartRunInput } from '@/server/contracts/robustness';

import { api } from './api';
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
    const onProgress = (raw: unknown) => {
      const parsed = reviewNews['robustness:progress'].safeParse(raw);
      if (!parsed.success || parsed.data.reviewId !== reviewId) return;
      const { runId, done } = parsed.data;
      const cached = qc.getQueryData<Robustness>(robustnessKeys.run(reviewId));
      if (!cached || cached.runId !== runId) return refetch();
      qc.setQueryData<Robustness>(robustnessKeys.run(reviewId), { ...cached, done: Math.max(cached.done, done) });
    };
    const onFinished = (raw: unknown) => {
      const parsed = reviewNews['robustness:finished'].safeParse(raw);
      if (parsed.success && parsed.data.reviewId === reviewId) refetch();
    };
    const staling = [
      'candidate:added',
      'candidate:recomputed',
      'basis:updated',
      'score:changed',
      'site-year:updated',
    ] as const;
    socket.on('robustness:progress' as never, onProgress as never);
    socket.on('robustness:finished' as never, onFinished as never);
    for (const e of staling) socket.on(e as never, refetch as never);
    socket.on('connect', refetch);
    return () => {
      socket.off('robustness:progress' as never, onProgress as never);
      socket.off('robustness:finished' as never, onFinished as never);
      for (const e of staling) socket.off(e as never, refetch as never);
      socket.off('connect', refetch);
    };
  }, [reviewId, qc]);
}
