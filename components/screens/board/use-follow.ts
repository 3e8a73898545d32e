import { useQuery, useQueryClient } from '@tanstack/react-query';
import { useCallback, useEffect, useMemo } from 'react';

import { STALE } from '@/components/data/stale-times';
import type { Board } from '@/server/contracts/board';

/**
 * Following Gather the room, shared by the board and the candidate page so that it survives
 * moving between them: whom I stopped following (until their gathering ends), and which
 * gathering the phone has already opened the detail page for (so coming back to the board
 * does not push me there again; the gatherer moving on does).
 */
type FollowState = { stoppedBy: string | null; opened: string | null };
const initial: FollowState = { stoppedBy: null, opened: null };
const followKey = (reviewId: string) => ['follow', reviewId] as const;

export type Follow = {
  gathering: Board['gathering'];
  /** Someone else gathers at a candidate on this board, and I have not stopped following. */
  following: boolean;
  iGather: boolean;
  /** Someone else gathers, and I stopped following them. */
  stopped: boolean;
  /** `${gatherer}:${candidate}`: one key per place a gatherer takes the room. */
  placeKey: string | null;
  opened: string | null;
  stopFollowing(): void;
  followAgain(): void;
  markOpened(key: string): void;
};

export function useFollow(reviewId: string, board: Board | undefined, meId: string | undefined): Follow {
  const qc = useQueryClient();
  const state =
    useQuery<FollowState>({
      queryKey: followKey(reviewId),
      queryFn: () => initial,
      staleTime: STALE.infinity,
      gcTime: STALE.infinity,
    }).data ?? initial;
  const set = useCallback(
    (patch: Partial<FollowState>) =>
      qc.setQueryData<FollowState>(followKey(reviewId), (s) => ({ ...(s ?? initial), ...patch })),
    [qc, reviewId],
  );

  const gathering = board?.gathering ?? null;
  const known = !!gathering && !!board?.candidates.some((c) => c.id === gathering.candidateId);
  const iGather = !!gathering && !!meId && gathering.by.id === meId;
  const following = known && !!meId && !iGather && state.stoppedBy !== gathering!.by.id;
  const stopped = known && !iGather && !following;

  // A gathering that ends clears "stopped following", so the next one is followed again.
  useEffect(() => {
    if (board && !gathering && (state.stoppedBy || state.opened)) set({ stoppedBy: null, opened: null });
  }, [board, gathering, state.stoppedBy, state.opened, set]);

  const byId = gathering?.by.id;
  return useMemo(
    () => ({
      gathering,
      following,
      iGather,
      stopped,
      placeKey: gathering ? `${gathering.by.id}:${gathering.candidateId}` : null,
      opened: state.opened,
      stopFollowing: () => byId && set({ stoppedBy: byId }),
      followAgain: () => set({ stoppedBy: null, opened: null }),
      markOpened: (key: string) => set({ opened: key }),
    }),
    [gathering, following, iGather, stopped, state.opened, byId, set],
  );
}
