import { useMutation, useQuery, useQueryClient, type QueryClient } from '@tanstack/react-query';
import { useEffect } from 'react';

import { getRealtimeSocket } from '@/realtime/client';
import type {
  DecisionRecord,
  DecisionRevision,
  DecisionRevisionNews,
  UpdateDecisionInput,
} from '@/server/contracts/decision';

import { activityKeys } from './activity';
import { api } from './api';
import { onReviewNews } from './live';
import { apiOrigin } from './origin';
import { STALE } from './stale-times';

const r = (reviewId: string) => encodeURIComponent(reviewId);

export const decisionKeys = {
  record: (reviewId: string) => ['decision', reviewId] as const,
};

/** GET /api/reviews/:reviewId/decision — the current revision and every revision, newest first. */
export function useDecisionQuery(reviewId: string | undefined) {
  return useQuery({
    queryKey: decisionKeys.record(reviewId ?? ''),
    queryFn: ({ signal }) => api.get<DecisionRecord>(`/api/reviews/${r(reviewId!)}/decision`, signal),
    staleTime: STALE.seconds.thirty,
    enabled: !!reviewId,
  });
}

/** Puts a revision's fields into the record; a revision the cache does not hold yet means a refetch. */
function applyRevision(qc: QueryClient, reviewId: string, news: DecisionRevisionNews | DecisionRevision) {
  let known = false;
  qc.setQueryData<DecisionRecord>(decisionKeys.record(reviewId), (record) => {
    if (!record) return record;
    const index = record.revisions.findIndex((x) => x.id === news.id);
    if (index === -1) return record;
    known = true;
    const old = record.revisions[index]!;
    if (Date.parse(old.updatedAt) > Date.parse(news.updatedAt)) return record;
    const next: DecisionRevision = { ...old, ...news, snapshot: 'snapshot' in news ? news.snapshot : old.snapshot };
    const revisions = record.revisions.slice();
    revisions[index] = next;
    return { current: record.current.id === next.id ? next : record.current, revisions };
  });
  return known;
}

const refetch = (qc: QueryClient, reviewId: string) => {
  void qc.invalidateQueries({ queryKey: decisionKeys.record(reviewId) });
  void qc.invalidateQueries({ queryKey: activityKeys.review(reviewId) });
};

/** PUT the draft (the whole form: every field of the draft). */
export function useUpdateDecisionMutation(reviewId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: UpdateDecisionInput) =>
      api.put<DecisionRevision>(`/api/reviews/${r(reviewId)}/decision`, input),
    onSuccess: (revision) => {
      if (!applyRevision(qc, reviewId, revision)) refetch(qc, reviewId);
      void qc.invalidateQueries({ queryKey: activityKeys.review(reviewId) });
    },
  });
}

export function useSignDecisionMutation(reviewId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () => api.post<DecisionRevision>(`/api/reviews/${r(reviewId)}/decision/sign`, {}),
    onSuccess: (revision) => {
      applyRevision(qc, reviewId, revision);
      refetch(qc, reviewId);
    },
  });
}

export function useReopenDecisionMutation(reviewId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () => api.post<DecisionRevision>(`/api/reviews/${r(reviewId)}/decision/reopen`, {}),
    onSuccess: (revision) => {
      qc.setQueryData<DecisionRecord>(decisionKeys.record(reviewId), (record) =>
        record && !record.revisions.some((x) => x.id === revision.id)
          ? { current: revision, revisions: [revision, ...record.revisions] }
          : record,
      );
      refetch(qc, reviewId);
    },
  });
}

/** Where the PDF of the current revision, or of revision `n`, is downloaded from. */
export function decisionPdfURL(reviewId: string, revision?: number): string {
  return `${apiOrigin()}/api/reviews/${r(reviewId)}/decision.pdf${revision ? `?revision=${revision}` : ''}`;
}

/**
 * Patches the decision record from `decision:updated` and `decision:signed` (each payload
 * checked with its contract schema first). It listens only: the room is joined by the board's
 * `useReviewLiveUpdates(reviewId)`, which the screen calls beside it. A signature, a revision
 * the cache does not hold (a reopening) and a reconnect fetch the record afresh.
 */
export function useDecisionLiveUpdates(reviewId: string | undefined) {
  const qc = useQueryClient();
  useEffect(() => {
    if (!reviewId) return;
    const socket = getRealtimeSocket(apiOrigin());
    const offs = [
      onReviewNews(socket, 'decision:updated', (news) => {
        if (news.reviewId !== reviewId) return;
        if (!applyRevision(qc, reviewId, news.revision)) refetch(qc, reviewId);
        void qc.invalidateQueries({ queryKey: activityKeys.review(reviewId) });
      }),
      onReviewNews(socket, 'decision:signed', (news) => {
        if (news.reviewId !== reviewId) return;
        applyRevision(qc, reviewId, news.revision);
        refetch(qc, reviewId);
      }),
    ];
    const onConnect = () => refetch(qc, reviewId);
    socket.on('connect', onConnect);
    return () => {
      for (const off of offs) off();
      socket.off('connect', onConnect);
      void qc.invalidateQueries({ queryKey: activityKeys.all });
    };
  }, [reviewId, qc]);
}
