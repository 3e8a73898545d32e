import { useQueryClient } from '@tanstack/react-query';
import { useEffect } from 'react';

import { getRealtimeSocket } from '@/realtime/client';
import { teamNews } from '@/realtime/events';

import { activityKeys } from './activity';
import { apiOrigin } from './origin';
import { reviewKeys, upsertReviewInCache } from './reviews';

/**
 * Joins the Team's live room while mounted and patches the react-query cache with what
 * others change (Reviews created, renamed, archived). Re-joins and refetches after a reconnect.
 */
export function useTeamLiveUpdates(teamId: string | undefined) {
  const qc = useQueryClient();
  useEffect(() => {
    if (!teamId) return;
    const socket = getRealtimeSocket(apiOrigin());
    const join = () => socket.emit('team:join', { teamId });
    // After a dropped connection, events may have been missed: join again and refetch.
    const rejoin = () => {
      join();
      void qc.invalidateQueries({ queryKey: reviewKeys.team(teamId) });
      void qc.invalidateQueries({ queryKey: activityKeys.team(teamId) });
    };
    // A payload that does not match the contract never touches the cache.
    const onReview = (raw: unknown) => {
      const parsed = teamNews['review:updated'].safeParse(raw);
      if (!parsed.success) return;
      const { review } = parsed.data;
      if (review.teamId !== teamId) return;
      upsertReviewInCache(qc, review);
      void qc.invalidateQueries({ queryKey: activityKeys.team(teamId) });
    };
    if (socket.connected) join();
    socket.on('connect', rejoin);
    socket.on('review:created', onReview);
    socket.on('review:updated', onReview);
    return () => {
      socket.off('connect', rejoin);
      socket.off('review:created', onReview);
      socket.off('review:updated', onReview);
      if (socket.connected) socket.emit('team:leave', { teamId });
    };
  }, [teamId, qc]);
}
