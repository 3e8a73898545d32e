import { useRouter } from 'expo-router';
import { useEffect } from 'react';
import { StyleSheet, View } from 'react-native';

import {
  gatherRoom,
  reportViewing,
  useCandidate,
  useReviewLiveUpdates,
  useUpdateCandidateMutation,
  type CycleResultWire,
} from '@/components/data/board';
import { useMeQuery } from '@/components/data/me';
import { TsDiagram } from '@/components/diagrams';
import { candidateHref } from '@/components/screens/board/candidate-card';
import { CommentThread } from '@/components/screens/board/comment-thread';
import { GatherBanner } from '@/components/screens/board/gather-banner';
import { useBoardKeys } from '@/components/screens/board/use-board-keys';
import { useFollow } from '@/components/screens/board/use-follow';
import { FilesPanel } from '@/components/screens/files/files-panel';
import { BackLink } from '@/components/ui/back-link';
import { Badge } from '@/components/ui/badge';
import { Card } from '@/components/ui/card';
import { CautionLine } from '@/components/ui/caution-line';
import { Choice } from '@/components/ui/field';
import { formatAgo } from '@/components/ui/format';
import { useMessage } from '@/components/ui/message';
import { Screen } from '@/components/ui/screen';
import { ErrorState, LoadingState } from '@/components/ui/states';
import { Heading, Text } from '@/components/ui/text';
import { space } from '@/components/ui/tokens';
import { useUnitSystem } from '@/components/ui/unit-system';
import {
  candidateStatuses,
  presetLabels,
  statusLabels,
  type CandidateStatus,
  type CandidateWire,
} from '@/server/contracts/board';
import { roleAllows } from '@/server/contracts/roles';

import { ParameterForm } from './parameter-form';
import { FigureTable, StateTable, SweepPanel, Warnings } from './results-parts';
import { useParameterDraft } from './use-parameter-draft';

/** Candidate detail: parameters with a live preview, results, state points, T-s diagram, sweep, comments. */
export function CandidateScreen({ reviewId, candidateId }: { reviewId: string; candidateId: string }) {
  const board = useCandidate(reviewId, candidateId);
  useReviewLiveUpdates(reviewId);
  useEffect(() => {
    reportViewing(reviewId, candidateId);
    return () => reportViewing(reviewId, null);
  }, [reviewId, candidateId]);

  // Following Gather the room here: the page moves with the gatherer; Escape stops following.
  const router = useRouter();
  const follow = useFollow(reviewId, board.data, useMeQuery().data?.user.id);
  const { following, gathering, placeKey, markOpened } = follow;
  const goTo = following && gathering && gathering.candidateId !== candidateId ? gathering.candidateId : null;
  useEffect(() => {
    if (!goTo || !placeKey) return;
    markOpened(placeKey);
    router.replace(candidateHref(reviewId, goTo));
  }, [goTo, placeKey, markOpened, router, reviewId]);
  useEffect(() => {
    if (following && placeKey && gathering?.candidateId === candidateId) markOpened(placeKey);
  }, [following, placeKey, gathering, candidateId, markOpened]);
  useBoardKeys({ onEscape: following ? follow.stopFollowing : undefined });
  const banner =
    board.data && gathering ? (
      <GatherBanner
        board={board.data}
        gatheredName={board.data.candidates.find((c) => c.id === gathering.candidateId)?.name}
        following={following}
        iGather={follow.iGather}
        stopped={follow.stopped}
        onStopFollowing={follow.stopFollowing}
        onFollowAgain={follow.followAgain}
        onStopGathering={() => void gatherRoom(reviewId, null)}
      />
    ) : null;

  const back = (
    <BackLink
      href={`/reviews/${encodeURIComponent(reviewId)}`}
      to="Board"
      label="Back to the board"
      testID="back-to-board"
    />
  );

  if (board.error)
    return (
      <Screen title="Candidate" testID="candidate-screen">
        {back}
        <ErrorState error={board.error} onRetry={() => void board.refetch()} />
      </Screen>
    );
  if (!board.data)
    return (
      <Screen title="Candidate" testID="candidate-screen">
        <LoadingState label="Loading the candidate…" />
      </Screen>
    );
  if (!board.candidate)
    return (
      <Screen title="Candidate" testID="candidate-screen">
        {back}
        <ErrorState
          error={{ status: 404, message: 'This candidate is not on the board.' }}
          testID="candidate-missing"
        />
      </Screen>
    );
  return (
    <CandidateBody
      reviewId={reviewId}
      candidate={board.candidate}
      reviewName={board.data.review.name}
      canEdit={roleAllows(board.data.myRole, { candidate: ['update'] })}
      back={
        <>
          {back}
          {banner}
        </>
      }
    />
  );
}

function CandidateBody({
  reviewId,
  candidate,
  reviewName,
  canEdit,
  back,
}: {
  reviewId: string;
  candidate: CandidateWire;
  reviewName: string;
  canEdit: boolean;
  back: React.ReactNode;
}) {
  const { system } = useUnitSystem();
  const draft = useParameterDraft(reviewId, candidate, system);
  const update = useUpdateCandidateMutation(reviewId, candidate.id);
  const message = useMessage();
  const saved = candidate.results as CycleResultWire | null;
  const preview = draft.preview.result;

  const setStatus = (status: CandidateStatus) => {
    if (status === candidate.status) return;
    update.mutate(
      { status },
      { onSuccess: (c) => message.show(`Status: ${statusLabels[c.status]}.`), onError: message.showError },
    );
  };

  return (
    <Screen
      title={candidate.name}
      eyebrow={`Candidate · ${reviewName}`}
      testID="candidate-screen"
      footer={<CautionLine />}
    >
      {back}
      <Card style={[styles.head, { borderLeftColor: candidate.colour }]} testID="candidate-head">
        <View style={styles.row}>
          {candidate.preset ? <Badge label={presetLabels[candidate.preset]} tone="neutral" /> : null}
          <Badge
            label={statusLabels[candidate.status]}
            tone={candidate.status === 'chosen' || candidate.status === 'shortlisted' ? 'good' : 'neutral'}
            testID="candidate-status"
          />
          <Text size="caption" tone="muted">
            Revision {candidate.revision} · {formatAgo(candidate.updatedAt)}
            {candidate.updatedBy ? ` by ${candidate.updatedBy.name}` : ''}
          </Text>
        </View>
        {canEdit ? (
          <Choice
            label="Status"
            options={candidateStatuses.map((s) => ({ value: s, label: statusLabels[s] }))}
            value={candidate.status}
            onChange={setStatus}
            testID="candidate-status-choice"
          />
        ) : null}
      </Card>

      <View style={styles.columns}>
        <View style={styles.column}>
          <ParameterForm draft={draft} system={system} canEdit={canEdit} />
        </View>
        <View style={styles.column}>
          {candidate.error && !draft.dirty ? (
            <Text tone="danger" role="alert" testID="candidate-engine-error">
              The engine refuses this combination: {candidate.error.message}
            </Text>
          ) : null}
          <FigureTable saved={saved} preview={preview} previewPending={draft.preview.pending} system={system} />
          {saved ? <Warnings result={saved} /> : null}
          {saved ? (
            <Card style={styles.gap}>
              <Heading level={2}>T-s diagram</Heading>
              <TsDiagram
                name={candidate.name}
                cycle={saved}
                size="large"
                colour={candidate.colour}
                unitSystem={system}
                testID="ts-saved"
              />
            </Card>
          ) : null}
          {preview ? (
            <Card style={styles.gap} testID="ts-preview-card">
              <Heading level={2}>T-s diagram — preview, not saved</Heading>
              <TsDiagram
                name={`${candidate.name} (preview)`}
                cycle={preview}
                size="large"
                colour={candidate.colour}
                unitSystem={system}
                testID="ts-preview"
              />
            </Card>
          ) : null}
        </View>
      </View>
      {saved ? <StateTable result={saved} system={system} /> : null}
      {saved ? <SweepPanel input={candidate.input} colour={candidate.colour} system={system} /> : null}
      <Card style={styles.gap}>
        <Heading level={2}>Comments</Heading>
        <CommentThread reviewId={reviewId} candidateId={candidate.id} />
      </Card>
      <Card style={styles.gap}>
        <Heading level={2}>Files of this candidate</Heading>
        <FilesPanel reviewId={reviewId} candidateId={candidate.id} />
      </Card>
    </Screen>
  );
}

const styles = StyleSheet.create({
  head: { borderLeftWidth: 6, gap: space[1] },
  row: { flexDirection: 'row', alignItems: 'center', gap: space[1], flexWrap: 'wrap' },
  columns: { flexDirection: 'row', flexWrap: 'wrap', gap: space[2] },
  column: { flexGrow: 1, flexBasis: 320, minWidth: 0, gap: space[2] },
  gap: { gap: space[1] },
});
