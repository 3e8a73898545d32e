import { useMutation, useQuery, useQueryClient, type QueryClient } from '@tanstack/react-query';
import { useEffect } from 'react';

import { getRealtimeSocket } from '@/realtime/client';
import type {
  Board,
  CandidateWire,
  Comment,
  CreateCandidateInput,
  DesignBasis,
  DesignBasisInput,
  PostCommentInput,
  Presence,
  Round,
  UpdateCandidateInput,
} from '@/server/contracts/board';
import type { ReviewNews, ReviewNewsEvent } from '@/server/contracts/news';

import { activityKeys } from './activity';
import { api } from './api';
import { onReviewNews } from './live';
import { apiOrigin } from './origin';
import { STALE } from './stale-times';

const r = (reviewId: string) => encodeURIComponent(reviewId);

export const boardKeys = {
  board: (reviewId: string) => ['board', reviewId] as const,
  comments: (reviewId: string) => ['board', reviewId, 'comments'] as const,
  rounds: (reviewId: string) => ['board', reviewId, 'rounds'] as const,
  presence: (reviewId: string) => ['board', reviewId, 'presence'] as const,
  mentionable: (reviewId: string) => ['board', reviewId, 'mentionable'] as const,
};

/** GET /api/reviews/:reviewId/board — kept current by the review room's events. */
export function useBoardQuery(reviewId: string | undefined) {
  return useQuery({
    queryKey: boardKeys.board(reviewId ?? ''),
    queryFn: ({ signal }) => api.get<Board>(`/api/reviews/${r(reviewId!)}/board`, signal),
    staleTime: STALE.seconds.thirty,
    enabled: !!reviewId,
  });
}

/** One candidate from the board cache (the detail page reads the same entry). */
export function useCandidate(reviewId: string, candidateId: string) {
  const board = useBoardQuery(reviewId);
  return { ...board, candidate: board.data?.candidates.find((c) => c.id === candidateId) };
}

/** Puts a candidate into the board; an older revision (an event that overtook an answer) never wins. */
export function upsertCandidate(qc: QueryClient, reviewId: string, candidate: CandidateWire) {
  qc.setQueryData<Board>(boardKeys.board(reviewId), (board) => {
    if (!board) return board;
    const index = board.candidates.findIndex((c) => c.id === candidate.id);
    if (index === -1) return { ...board, candidates: [...board.candidates, candidate] };
    if (board.candidates[index]!.revision > candidate.revision) return board;
    const candidates = board.candidates.slice();
    candidates[index] = candidate;
    return { ...board, candidates };
  });
}

function setBasis(qc: QueryClient, reviewId: string, designBasis: DesignBasis) {
  qc.setQueryData<Board>(boardKeys.board(reviewId), (board) =>
    board && board.designBasis.revision <= designBasis.revision ? { ...board, designBasis } : board,
  );
}

/** A round from an event carries no ballot of mine: keep the one I have. */
function setRound(qc: QueryClient, reviewId: string, round: Round) {
  const merge = (old: Round | null | undefined): Round =>
    old && old.id === round.id ? { ...round, myBallot: round.myBallot ?? old.myBallot } : round;
  qc.setQueryData<Board>(boardKeys.board(reviewId), (board) => {
    if (!board) return board;
    if (board.round && board.round.id !== round.id && board.round.number > round.number) return board;
    return { ...board, round: merge(board.round) };
  });
  qc.setQueryData<Round[]>(boardKeys.rounds(reviewId), (rounds) => {
    if (!rounds) return rounds;
    const index = rounds.findIndex((x) => x.id === round.id);
    if (index === -1) return [...rounds, round];
    const next = rounds.slice();
    next[index] = merge(rounds[index]);
    return next;
  });
}

function addComment(qc: QueryClient, reviewId: string, comment: Comment) {
  let added = false;
  qc.setQueryData<Comment[]>(boardKeys.comments(reviewId), (list) => {
    if (!list) return list;
    if (list.some((c) => c.id === comment.id)) return list;
    added = true;
    return [...list, comment];
  });
  const known = qc.getQueryData<Comment[]>(boardKeys.comments(reviewId));
  if (!known || added) {
    qc.setQueryData<Board>(boardKeys.board(reviewId), (board) => {
      if (!board) return board;
      const key = comment.candidateId ?? 'review';
      return { ...board, commentCounts: { ...board.commentCounts, [key]: (board.commentCounts[key] ?? 0) + 1 } };
    });
  }
}

export function usePutDesignBasisMutation(reviewId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (basis: DesignBasisInput) =>
      api.put<{ designBasis: DesignBasis; candidates: CandidateWire[] }>(
        `/api/reviews/${r(reviewId)}/design-basis`,
        basis,
      ),
    onSuccess: ({ designBasis, candidates }) => {
      setBasis(qc, reviewId, designBasis);
      for (const c of candidates) upsertCandidate(qc, reviewId, c);
    },
  });
}

export function useCreateCandidateMutation(reviewId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateCandidateInput) =>
      api.post<CandidateWire>(`/api/reviews/${r(reviewId)}/candidates`, input),
    onSuccess: (candidate) => upsertCandidate(qc, reviewId, candidate),
  });
}

export function useUpdateCandidateMutation(reviewId: string, candidateId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: UpdateCandidateInput) =>
      api.patch<CandidateWire>(`/api/reviews/${r(reviewId)}/candidates/${encodeURIComponent(candidateId)}`, input),
    onSuccess: (candidate) => upsertCandidate(qc, reviewId, candidate),
  });
}

export function useRoundsQuery(reviewId: string) {
  return useQuery({
    queryKey: boardKeys.rounds(reviewId),
    queryFn: ({ signal }) => api.get<Round[]>(`/api/reviews/${r(reviewId)}/rounds`, signal),
    staleTime: STALE.seconds.thirty,
  });
}

export function useOpenRoundMutation(reviewId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: { votesPerPerson: number; blind: boolean }) =>
      api.post<Round>(`/api/reviews/${r(reviewId)}/rounds`, input),
    onSuccess: (round) => setRound(qc, reviewId, round),
  });
}

export function useBallotMutation(reviewId: string, roundId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (votes: Record<string, number>) =>
      api.put<Round>(`/api/reviews/${r(reviewId)}/rounds/${encodeURIComponent(roundId)}/ballot`, { votes }),
    onSuccess: (round) => setRound(qc, reviewId, round),
  });
}

export function useCloseRoundMutation(reviewId: string, roundId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () => api.post<Round>(`/api/reviews/${r(reviewId)}/rounds/${encodeURIComponent(roundId)}/close`, {}),
    onSuccess: (round) => setRound(qc, reviewId, round),
  });
}

/** Every comment of the review (on the review and on its candidates), oldest first. */
export function useCommentsQuery(reviewId: string) {
  return useQuery({
    queryKey: boardKeys.comments(reviewId),
    queryFn: ({ signal }) => api.get<Comment[]>(`/api/reviews/${r(reviewId)}/comments`, signal),
    staleTime: STALE.seconds.thirty,
  });
}

export function useMentionableQuery(reviewId: string) {
  return useQuery({
    queryKey: boardKeys.mentionable(reviewId),
    queryFn: ({ signal }) =>
      api.get<Array<{ id: string; name: string }>>(`/api/reviews/${r(reviewId)}/mentionable`, signal),
    staleTime: STALE.minutes.five,
  });
}

/** Posts a comment; a retry after a lost answer sends the same clientId and is stored once. */
export function usePostCommentMutation(reviewId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: PostCommentInput) => api.post<Comment>(`/api/reviews/${r(reviewId)}/comments`, input),
    retry: 2,
    onSuccess: (comment) => addComment(qc, reviewId, comment),
  });
}

/** People on the board now, from `presence:changed` (filled only while the room is joined). */
export function usePresence(reviewId: string) {
  return useQuery<Presence[]>({
    queryKey: boardKeys.presence(reviewId),
    queryFn: () => [],
    staleTime: STALE.infinity,
  });
}

export type Gathering = Board['gathering'];

/**
 * Joins the review's room while mounted and patches the cache from its events (each payload
 * checked with its contract schema first; one that does not fit is dropped). After a
 * reconnect it joins again and fetches the board afresh, so it shows the same state.
 * `onGathered` hears Gather the room.
 */
export function useReviewLiveUpdates(
  reviewId: string | undefined,
  onGathered?: (gathering: { candidateId: string | null; by: { id: string; name: string } }) => void,
) {
  const qc = useQueryClient();
  useEffect(() => {
    if (!reviewId) return;
    const socket = getRealtimeSocket(apiOrigin());
    const join = () => socket.emit('review:join', { reviewId });
    const rejoin = () => {
      join();
      void qc.invalidateQueries({ queryKey: boardKeys.board(reviewId) });
      void qc.invalidateQueries({ queryKey: boardKeys.comments(reviewId) });
      void qc.invalidateQueries({ queryKey: boardKeys.rounds(reviewId) });
    };
    const on = <E extends ReviewNewsEvent>(event: E, apply: (payload: ReviewNews[E]) => void) =>
      onReviewNews(socket, event, apply);
    const mine = (id: string) => id === reviewId;
    const offs = [
      on('candidate:added', ({ candidate }) => mine(candidate.reviewId) && upsertCandidate(qc, reviewId, candidate)),
      on(
        'candidate:recomputed',
        ({ candidate }) => mine(candidate.reviewId) && upsertCandidate(qc, reviewId, candidate),
      ),
      on('basis:updated', ({ designBasis }) => setBasis(qc, reviewId, designBasis)),
      on('round:opened', ({ round }) => setRound(qc, reviewId, round)),
      on('round:tallied', ({ round }) => setRound(qc, reviewId, round)),
      on('round:closed', ({ round }) => setRound(qc, reviewId, round)),
      on('comment:posted', ({ comment }) => mine(comment.reviewId) && addComment(qc, reviewId, comment)),
      on('presence:changed', (p) => mine(p.reviewId) && qc.setQueryData(boardKeys.presence(reviewId), p.people)),
      on('room:gathered', (g) => {
        if (!mine(g.reviewId)) return;
        qc.setQueryData<Board>(boardKeys.board(reviewId), (board) =>
          board ? { ...board, gathering: g.candidateId ? { candidateId: g.candidateId, by: g.by } : null } : board,
        );
        onGathered?.({ candidateId: g.candidateId, by: g.by });
      }),
    ];
    if (socket.connected) join();
    socket.on('connect', rejoin);
    return () => {
      for (const off of offs) off();
      socket.off('connect', rejoin);
      if (socket.connected) socket.emit('review:leave', { reviewId });
      void qc.invalidateQueries({ queryKey: activityKeys.all });
    };
  }, [reviewId, qc, onGathered]);
}

/** Tells the room which candidate I am looking at (null: the board as a whole). */
export function reportViewing(reviewId: string, candidateId: string | null) {
  getRealtimeSocket(apiOrigin()).emit('presence:viewing', { reviewId, candidateId });
}

/** Lead and Owner: move everyone's view to one candidate, or stop (null). */
export function gatherRoom(reviewId: string, candidateId: string | null) {
  return getRealtimeSocket(apiOrigin()).emitWithAck('room:gather', { reviewId, candidateId });
}

// ── The engine, for previews and sweeps of unsaved values ───────────────────────────────

/** What POST /api/cycles/evaluate answers (the engine's CycleResult as JSON). */
export type CycleResultWire = {
  states: Array<{
    n: number;
    label: string;
    temperatureK: number;
    pressureKPa: number;
    enthalpyKJPerKg: number;
    entropyKJPerKgK: number;
    massFlowRatio: number;
  }>;
  compressorWorkKJPerKg: number;
  turbineWorkKJPerKg: number;
  netWorkKJPerKg: number;
  heatInputKJPerKg: number;
  thermalEfficiency: number;
  backWorkRatio: number;
  regeneratorDutyKJPerKg: number;
  exhaustTemperatureK: number;
  fuelAirRatio: number | null;
  fuelLowerHeatingValueKJPerKg: number | null;
  airMassFlowKgPerS: number | null;
  fuelMassFlowKgPerS: number | null;
  heatRateKJPerKWh: number | null;
  co2KgPerMWh: number | null;
  paths: Array<{
    kind:
      'compression' | 'expansion' | 'heat-addition' | 'heat-rejection' | 'regenerator-heating' | 'regenerator-cooling';
    from: number;
    to: number;
    temperatureK: number[];
    entropyKJPerKgK: number[];
  }>;
  warnings: Array<{ code: string; message: string; field?: string }>;
};

export type SweepFiguresWire = {
  netWorkKJPerKg: number;
  thermalEfficiency: number;
  exhaustTemperatureK: number;
  heatRateKJPerKWh: number | null;
  warningCodes: string[];
};
export type SweepOptimumWire = { value: number; figures: SweepFiguresWire; atRangeEnd: boolean };
/** What POST /api/cycles/sweep answers. */
export type SweepResultWire = {
  parameter: string;
  from: number;
  to: number;
  points: Array<{
    value: number;
    figures: SweepFiguresWire | null;
    error: { field: string; message: string } | null;
  }>;
  optimumNetWork: SweepOptimumWire | null;
  optimumEfficiency: SweepOptimumWire | null;
};

export const cycleKeys = {
  evaluate: (input: unknown) => ['cycles', 'evaluate', JSON.stringify(input)] as const,
  sweep: (request: unknown) => ['cycles', 'sweep', JSON.stringify(request)] as const,
};

/**
 * The engine's answer for an engine input that is not saved (a candidate's draft); `input`
 * null waits. The engine's refusal comes back as the 422 ApiError naming the field.
 */
export function useEvaluateQuery(input: Record<string, unknown> | null) {
  return useQuery({
    queryKey: cycleKeys.evaluate(input),
    queryFn: () => api.post<CycleResultWire>('/api/cycles/evaluate', input),
    enabled: input !== null,
    staleTime: STALE.infinity,
    retry: false,
    placeholderData: (previous) => previous,
  });
}

/** A sweep of one input over a range (the engine's 422 names the field of a bad request). */
export function useSweepQuery(
  request: { base: Record<string, unknown>; parameter: string; from: number; to: number; points: number } | null,
) {
  return useQuery({
    queryKey: cycleKeys.sweep(request),
    queryFn: () => api.post<SweepResultWire>('/api/cycles/sweep', request),
    enabled: request !== null,
    staleTime: STALE.infinity,
    retry: false,
    placeholderData: (previous) => previous,
  });
}
