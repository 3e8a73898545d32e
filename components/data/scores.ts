import { useMutation, useQuery, useQueryClient, type QueryClient } from '@tanstack/react-query';
import { useEffect } from 'react';

import { getRealtimeSocket } from '@/realtime/client';
import type { Matrix, ScoreChanged } from '@/server/contracts/matrix';
import type { PutScoresInput, Score, Scores } from '@/server/contracts/scores';

import { api } from './api';
import { onAnyReviewNews, onReviewNews } from './live';
import { apiOrigin } from './origin';
import { STALE } from './stale-times';

const r = (reviewId: string) => encodeURIComponent(reviewId);

export const scoreKeys = {
  scores: (reviewId: string) => ['scores', reviewId] as const,
  matrix: (reviewId: string) => ['scores', reviewId, 'matrix'] as const,
};

/** GET /api/reviews/:reviewId/scores — mine and everyone's. */
export function useScoresQuery(reviewId: string) {
  return useQuery({
    queryKey: scoreKeys.scores(reviewId),
    queryFn: ({ signal }) => api.get<Scores>(`/api/reviews/${r(reviewId)}/scores`, signal),
    staleTime: STALE.seconds.thirty,
  });
}

/** GET /api/reviews/:reviewId/matrix — kept current by `useScoresLiveUpdates`. */
export function useMatrixQuery(reviewId: string) {
  return useQuery({
    queryKey: scoreKeys.matrix(reviewId),
    queryFn: ({ signal }) => api.get<Matrix>(`/api/reviews/${r(reviewId)}/matrix`, signal),
    staleTime: STALE.seconds.thirty,
  });
}

/** Where the downloads are (same origin on the web, so the session cookie goes along). */
export function matrixDownloadUrl(reviewId: string, kind: 'csv' | 'xlsx'): string {
  return `${apiOrigin()}/api/reviews/${r(reviewId)}/matrix.${kind}`;
}

const pair = (s: { candidateId: string; criterionId: string }) => `${s.candidateId}\u0000${s.criterionId}`;

/** One person's changed scores into the scores cache (null: withdrawn). */
function patchScores(qc: QueryClient, reviewId: string, changed: ScoreChanged['scores'], mineId?: string) {
  qc.setQueryData<Scores>(scoreKeys.scores(reviewId), (old) => {
    if (!old) return old;
    const byUser = changed[0]?.userId;
    if (!byUser) return old;
    const touched = new Set(changed.map(pair));
    const kept = (list: Score[]) => list.filter((s) => !(s.userId === byUser && touched.has(pair(s))));
    const added = changed.filter((s): s is Score => s.score !== null);
    const everyone = [...kept(old.everyone), ...added];
    const mine = byUser === mineId ? [...kept(old.mine), ...added] : old.mine;
    return { mine, everyone };
  });
}

/** The changed cells, every total and rank, into the matrix cache. */
function patchMatrix(qc: QueryClient, reviewId: string, news: ScoreChanged) {
  qc.setQueryData<Matrix>(scoreKeys.matrix(reviewId), (m) => {
    if (!m) return m;
    // News that overtook a newer read (two changes at once) would put older totals back.
    if (news.madeAt < m.madeAt) return m;
    const rows = m.rows.map((row) => {
      const cells = news.cells.filter((c) => c.criterionId === row.criterionId);
      if (cells.length === 0) return row;
      const next = { ...row.cells };
      for (const { candidateId, criterionId: _c, ...cell } of cells) if (next[candidateId]) next[candidateId] = cell;
      return { ...row, cells: next };
    });
    return {
      ...m,
      rows,
      totals: { ...m.totals, ...news.totals },
      ranks: { ...m.ranks, ...news.ranks },
      scorers: news.scorers,
    };
  });
}

/** PUT my scores; the answer is my scores as stored. The matrix follows from `score:changed`. */
export function usePutScoresMutation(reviewId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: PutScoresInput) => api.put<{ mine: Score[] }>(`/api/reviews/${r(reviewId)}/scores`, input),
    onSuccess: ({ mine }) => {
      qc.setQueryData<Scores>(scoreKeys.scores(reviewId), (old) => {
        if (!old) return old;
        const me = mine[0]?.userId ?? old.mine[0]?.userId;
        const others = me ? old.everyone.filter((s) => s.userId !== me) : old.everyone;
        return { mine, everyone: [...others, ...mine] };
      });
      // Once more in case the room's news was missed (a socket reconnecting): one small request.
      void qc.invalidateQueries({ queryKey: scoreKeys.matrix(reviewId) });
    },
  });
}

/**
 * Listens on the review's room for what changes the matrix: `score:changed` patches the
 * scores and the matrix (a change in who scored refetches it, as every measured cell moves);
 * `basis:updated` (weights, criteria, fired hours), candidate news, rounds and
 * `site-year:updated` (a profile stored or removed) refetch the matrix, so the ranking
 * follows a weight change at once and the site year's figures a new profile. The room itself is joined by the board's
 * `useReviewLiveUpdates`, which the matrix screen mounts too.
 */
export function useScoresLiveUpdates(reviewId: string | undefined, myUserId?: string) {
  const qc = useQueryClient();
  useEffect(() => {
    if (!reviewId) return;
    const socket = getRealtimeSocket(apiOrigin());
    const refetchMatrix = () => void qc.invalidateQueries({ queryKey: scoreKeys.matrix(reviewId) });
    const offs = [
      onReviewNews(socket, 'score:changed', (news) => {
        if (news.reviewId !== reviewId) return;
        patchScores(qc, reviewId, news.scores, myUserId);
        if (news.refetch) refetchMatrix();
        else patchMatrix(qc, reviewId, news);
      }),
      onAnyReviewNews(
        socket,
        [
          'basis:updated',
          'candidate:added',
          'candidate:recomputed',
          'round:opened',
          'round:tallied',
          'round:closed',
          'site-year:updated',
        ],
        refetchMatrix,
      ),
    ];
    const onReconnect = () => {
      refetchMatrix();
      void qc.invalidateQueries({ queryKey: scoreKeys.scores(reviewId) });
    };
    socket.on('connect', onReconnect);
    return () => {
      for (const off of offs) off();
      socket.off('connect', onReconnect);
    };
  }, [reviewId, myUserId, qc]);
}
