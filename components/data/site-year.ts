import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useEffect } from 'react';

import { getRealtimeSocket } from '@/realtime/client';
import type { SiteYear, SiteYearSummary } from '@/server/contracts/site-year';

import { activityKeys } from './activity';
import { api } from './api';
import { onAnyReviewNews, onReviewNews } from './live';
import { apiOrigin } from './origin';
import { STALE } from './stale-times';

const r = (reviewId: string) => encodeURIComponent(reviewId);

export const siteYearKeys = {
  year: (reviewId: string) => ['site-year', reviewId] as const,
};

/** GET /api/reviews/:reviewId/site-year — refetched when the room hears a change (useSiteYearLiveUpdates). */
export function useSiteYearQuery(reviewId: string | undefined) {
  return useQuery({
    queryKey: siteYearKeys.year(reviewId ?? ''),
    queryFn: ({ signal }) => api.get<SiteYear>(`/api/reviews/${r(reviewId!)}/site-year`, signal),
    staleTime: STALE.seconds.thirty,
    enabled: !!reviewId,
  });
}

/** A file the web file picker gave, or anything FormData takes. */
export type ProfileFile = Blob & { name?: string };

/** PUT the profile as multipart (field `file`); errors come back as the one ApiError (row errors in fieldErrors.file). */
export async function uploadSiteYear(reviewId: string, file: ProfileFile): Promise<SiteYearSummary> {
  const form = new FormData();
  form.append('file', file, file.name ?? 'site-year.csv');
  return api.putForm<SiteYearSummary>(`/api/reviews/${r(reviewId)}/site-year`, form);
}

export function useUploadSiteYear(reviewId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (file: ProfileFile) => uploadSiteYear(reviewId, file),
    onSuccess: () => {
      void qc.invalidateQueries({ queryKey: siteYearKeys.year(reviewId) });
      void qc.invalidateQueries({ queryKey: activityKeys.all });
    },
  });
}

export function useDeleteSiteYear(reviewId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () => api.delete<void>(`/api/reviews/${r(reviewId)}/site-year`),
    onSuccess: () => {
      void qc.invalidateQueries({ queryKey: siteYearKeys.year(reviewId) });
      void qc.invalidateQueries({ queryKey: activityKeys.all });
    },
  });
}

/**
 * Listens on the review's room (joined by useReviewLiveUpdates, which the screen also calls)
 * and refetches the site year when it changed (a `site-year:updated` checked with its contract
 * schema first, for this review only). On a reconnect it refetches once.
 */
export function useSiteYearLiveUpdates(reviewId: string | undefined) {
  const qc = useQueryClient();
  useEffect(() => {
    if (!reviewId) return;
    const socket = getRealtimeSocket(apiOrigin());
    const refetch = () => void qc.invalidateQueries({ queryKey: siteYearKeys.year(reviewId) });
    // The site year reads differently after a new profile, a changed basis or candidate.
    const offs = [
      onReviewNews(socket, 'site-year:updated', (news) => news.reviewId === reviewId && refetch()),
      onAnyReviewNews(socket, ['basis:updated', 'candidate:added', 'candidate:recomputed'], refetch),
    ];
    socket.on('connect', refetch);
    return () => {
      for (const off of offs) off();
      socket.off('connect', refetch);
    };
  }, [reviewId, qc]);
}
