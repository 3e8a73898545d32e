import { useQueryClient } from '@tanstack/react-query';
import { useEffect } from 'react';

import { getRealtimeSocket } from '@/realtime/client';
import type { Review } from '@/server/contracts/review';

import { activityKeys } from './activity';
import { apiOrigin } from './origin';
import { upsertReviewInCache } from './reviews';

/**
 * Joins the Team's live room while mounted and patches the react-query cache with what
 * others change (Reviews created, renamed, archived). Re-joins after a reconnect.
 */
export function useTeamLiveUpdates(teamId: string | undefined) {
  const qc = useQueryClient();
  useEffect(() => {
    if (!teamId) return;
    const socket = getRealtimeSocket(apiOrigin());
    const join = () => socket.emit('team:join', { teamId });
    const onReview = ({ review }: { review: Review }) => {
      if (review.teamId !== teamId) return;
      upsertReviewInCache(qc, review);
      void qc.invalidateQueries({ queryKey: activityKeys.team(teamId) });
    };
    if (socket.connected) join();
    socket.on('connect', join);
    socket.on('review:created', onReview);
    socket.on('review:updated', onReview);
    return () => {
      socket.off('connect', join);
      socket.off('review:created', onReview);
      socket.off('review:updated', onReview);
      if (socket.connected) socket.emit('team:leave', { teamId });
    };
  }, [teamId, qc]);
}
