import { useState } from 'react';
import { Pressable, StyleSheet, View } from 'react-native';

import { useBoardQuery, useReviewLiveUpdates } from '@/components/data/board';
import {
  decisionPdfURL,
  useDecisionLiveUpdates,
  useDecisionQuery,
  useReopenDecisionMutation,
} from '@/components/data/decision';
import { Button } from '@/components/ui/button';
import { CautionLine } from '@/components/ui/caution-line';
import { DownloadLink } from '@/components/ui/download-link';
import { focusRing, type PressState } from '@/components/ui/focus';
import { useIsWide } from '@/components/ui/layout';
import { useMessage } from '@/components/ui/message';
import { Screen } from '@/components/ui/screen';
import { ErrorState, LoadingState } from '@/components/ui/states';
import { Text } from '@/components/ui/text';
import { useTheme } from '@/components/ui/theme';
import { radius, space, touchTarget } from '@/components/ui/tokens';
import type { DecisionRevision } from '@/server/contracts/decision';
import { roleAllows } from '@/server/contracts/roles';

import { BoardBar } from '../board/board-bar';
import { DecisionForm } from './decision-form';
import { DecisionView } from './decision-view';

/** The revisions as a row of choices, newest first; the one shown is marked. */
function RevisionPicker({
  revisions,
  shown,
  onPick,
}: {
  revisions: DecisionRevision[];
  shown: number;
  onPick: (n: number) => void;
}) {
  const t = useTheme();
  return (
    <View style={styles.picker} role="radiogroup" accessibilityLabel="Revision" testID="decision-revisions">
      {revisions.map((r) => {
        const selected = r.number === shown;
        return (
          <Pressable
            key={r.id}
            role="radio"
            aria-checked={selected}
            accessibilityState={{ selected, checked: selected }}
            accessibilityLabel={`Revision ${r.number}, ${r.status === 'signed' ? 'signed' : 'draft'}`}
            onPress={() => onPick(r.number)}
            testID={`decision-revision-${r.number}`}
            style={({ focused }: PressState) => [
              styles.chip,
              {
                borderColor: selected ? t.text : t.hairline,
                backgroundColor: selected ? t.surfaceSunk : t.surfaceRaised,
              },
              focused && focusRing(t),
            ]}
          >
            <Text size="small" weight={selected ? 'semibold' : 'regular'}>
              Revision {r.number} · {r.status === 'signed' ? 'Signed' : 'Draft'}
            </Text>
          </Pressable>
        );
      })}
    </View>
  );
}

/**
 * The Decision record of a Review: the open draft as a form for the Lead and Owner (read for
 * everyone else), Sign with a confirmation, the signed revision read-only with signer, time
 * and the figures it rests on, Reopen, every earlier revision, and the PDF of the one shown.
 */
export function DecisionScreen({ reviewId }: { reviewId: string }) {
  const board = useBoardQuery(reviewId);
  const decision = useDecisionQuery(reviewId);
  useReviewLiveUpdates(reviewId);
  useDecisionLiveUpdates(reviewId);
  const reopen = useReopenDecisionMutation(reviewId);
  const message = useMessage();
  const wide = useIsWide();
  const [picked, setPicked] = useState<number | null>(null);

  const record = decision.data;
  const canEdit = !!board.data && roleAllows(board.data.myRole, { decision: ['edit'] });
  const current = record?.current;
  const shown = record?.revisions.find((r) => r.number === picked) ?? current;

  let body;
  if (decision.error) body = <ErrorState error={decision.error} onRetry={() => void decision.refetch()} />;
  else if (board.error) body = <ErrorState error={board.error} onRetry={() => void board.refetch()} />;
  else if (!record || !board.data || !shown || !current) body = <LoadingState label="Loading the decision record…" />;
  else {
    const candidates = board.data.candidates;
    const editing = canEdit && shown.id === current.id && shown.status === 'draft';
    body = (
      <View style={styles.body}>
        <View style={styles.toolbar}>
          {record.revisions.length > 1 ? (
            <RevisionPicker revisions={record.revisions} shown={shown.number} onPick={setPicked} />
          ) : null}
          <View style={styles.tools}>
            <DownloadLink
              url={decisionPdfURL(reviewId, shown.number)}
              label="PDF"
              accessibilityLabel={`Download revision ${shown.number} of the decision record as PDF`}
              testID="decision-pdf"
            />
            {canEdit && current.status === 'signed' && shown.id === current.id ? (
              <Button
                label={`Reopen as revision ${current.number + 1}`}
                variant="secondary"
                small
                busy={reopen.isPending}
                onPress={() =>
                  reopen.mutate(undefined, {
                    onSuccess: (r) => {
                      setPicked(null);
                      message.show(`Revision ${r.number} is open as a draft.`);
                    },
                    onError: (error) => message.showError(error),
                  })
                }
                testID="decision-reopen"
              />
            ) : null}
          </View>
        </View>
        {shown.id !== current.id ? (
          <Text size="small" tone="warning" testID="decision-earlier-note">
            An earlier revision. The current one is revision {current.number} ({current.status}).
          </Text>
        ) : null}
        {!canEdit && shown.status === 'draft' ? (
          <Text size="small" tone="muted" testID="decision-read-only-note">
            The Lead or Owner writes and signs the decision record; you can read the draft as it stands.
          </Text>
        ) : null}
        {editing ? (
          <DecisionForm key={shown.id} reviewId={reviewId} draft={shown} candidates={candidates} />
        ) : (
          <DecisionView revision={shown} candidates={candidates} />
        )}
      </View>
    );
  }

  return (
    <View style={styles.fill}>
      <Screen
        title="Decision record"
        eyebrow={board.data ? `Review · ${board.data.review.name}` : 'Review'}
        footer={<CautionLine />}
        testID="decision-screen"
      >
        {wide ? <BoardBar reviewId={reviewId} current="decision" layout="tabs" /> : null}
        {body}
      </Screen>
      {!wide ? <BoardBar reviewId={reviewId} current="decision" layout="bar" /> : null}
    </View>
  );
}

const styles = StyleSheet.create({
  fill: { flex: 1 },
  body: { gap: space[2] },
  toolbar: { gap: space[1] },
  tools: { flexDirection: 'row', flexWrap: 'wrap', gap: space[1], alignItems: 'center' },
  picker: { flexDirection: 'row', flexWrap: 'wrap', gap: space[1] },
  chip: {
    minHeight: touchTarget,
    paddingHorizontal: space[2],
    borderWidth: 1,
    borderRadius: radius.control,
    justifyContent: 'center',
  },
});
