import { useMemo, useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { useBoardQuery, useReviewLiveUpdates } from '@/components/data/board';
import { useMeQuery } from '@/components/data/me';
import { matrixDownloadUrl, useMatrixQuery, useScoresLiveUpdates, useScoresQuery } from '@/components/data/scores';
import { Button } from '@/components/ui/button';
import { CautionLine } from '@/components/ui/caution-line';
import { DownloadLink } from '@/components/ui/download-link';
import { useIsWide } from '@/components/ui/layout';
import { PressableLink } from '@/components/ui/pressable-link';
import { Screen } from '@/components/ui/screen';
import { EmptyState, ErrorState, LoadingState } from '@/components/ui/states';
import { Text } from '@/components/ui/text';
import { space } from '@/components/ui/tokens';
import { useUnitSystem } from '@/components/ui/unit-system';
import { roleAllows } from '@/server/contracts/roles';

import { BoardBar } from '../board/board-bar';
import { RobustnessPanel } from '../robustness/robustness-panel';
import { rowsOf, sortCandidates, type Sort } from './matrix-model';
import { MatrixTable } from './matrix-table';
import { ScoreSheet } from './score-sheet';

/**
 * The comparison matrix of a Review: candidates as columns; figures with units, the site
 * year's figures, each criterion's weight, mean and spread, the weighted total and the rank;
 * the preference rounds' tallies. Sort by any row; score in the sheet; download CSV and XLSX.
 */
export function MatrixScreen({ reviewId }: { reviewId: string }) {
  const wide = useIsWide();
  const { system } = useUnitSystem();
  const me = useMeQuery();
  const board = useBoardQuery(reviewId);
  const matrix = useMatrixQuery(reviewId);
  const scores = useScoresQuery(reviewId);
  useReviewLiveUpdates(reviewId);
  useScoresLiveUpdates(reviewId, me.data?.user.id);
  const [sort, setSort] = useState<Sort>(null);
  const [scoring, setScoring] = useState(false);

  const rows = useMemo(() => (matrix.data ? rowsOf(matrix.data, system) : []), [matrix.data, system]);
  const order = useMemo(() => (matrix.data ? sortCandidates(matrix.data, rows, sort) : []), [matrix.data, rows, sort]);
  const onSort = (rowKey: string) =>
    setSort((s) =>
      s?.rowKey === rowKey ? (s.reversed ? null : { rowKey, reversed: true }) : { rowKey, reversed: false },
    );

  const canScore = !!board.data && roleAllows(board.data.myRole, { score: ['cast'] });
  const eyebrow = matrix.data ? `Review · ${matrix.data.reviewName}` : 'Review';

  let body;
  if (matrix.error) body = <ErrorState error={matrix.error} onRetry={() => void matrix.refetch()} />;
  else if (!matrix.data) body = <LoadingState label="Loading the comparison matrix…" />;
  else if (matrix.data.candidates.length === 0)
    body = (
      <EmptyState
        title="No candidates yet"
        testID="matrix-empty"
        action={
          <PressableLink href={`/reviews/${encodeURIComponent(reviewId)}`} style={styles.back} testID="back-to-board">
            <Text weight="medium" tone="cold">
              ← Add one on the board
            </Text>
          </PressableLink>
        }
      >
        The matrix compares candidates; add one on the board and it appears here. Exports need at least one.
      </EmptyState>
    );
  else {
    const m = matrix.data;
    body = (
      <View style={styles.stack}>
        <View style={styles.actions}>
          {canScore ? (
            <Button
              label={scoring ? 'Close scoring' : 'Score'}
              variant={scoring ? 'secondary' : 'primary'}
              onPress={() => setScoring((s) => !s)}
              testID="matrix-score"
            />
          ) : null}
          <DownloadLink
            url={matrixDownloadUrl(reviewId, 'csv')}
            label="CSV"
            accessibilityLabel="Download the comparison matrix as CSV"
            testID="matrix-download-csv"
          />
          <DownloadLink
            url={matrixDownloadUrl(reviewId, 'xlsx')}
            label="XLSX"
            accessibilityLabel="Download the comparison matrix as XLSX"
            testID="matrix-download-xlsx"
          />
        </View>
        {scoring && canScore ? (
          scores.data ? (
            <ScoreSheet reviewId={reviewId} matrix={m} mine={scores.data.mine} onClose={() => setScoring(false)} />
          ) : scores.error ? (
            <ErrorState error={scores.error} onRetry={() => void scores.refetch()} testID="scores-error" />
          ) : (
            <LoadingState label="Loading your scores…" />
          )
        ) : null}
        <MatrixTable matrix={m} rows={rows} order={order} sort={sort} onSort={onSort} wide={wide} />
        <View style={styles.rules} testID="matrix-rules">
          <Text size="small" tone="soft">
            {m.rules.preScore}
          </Text>
          <Text size="small" tone="soft">
            {m.rules.total} Equal totals share a rank.
          </Text>
          {m.year ? (
            <Text size="small" tone="soft" testID="matrix-year-rule">
              {m.year.rule}
            </Text>
          ) : null}
          <Text size="caption" tone="muted" testID="matrix-scorers">
            {m.scorers === 1 ? '1 person has' : `${m.scorers} people have`} scored · design basis revision{' '}
            {m.basisRevision}
          </Text>
        </View>
        {board.data ? (
          <RobustnessPanel
            reviewId={reviewId}
            candidates={m.candidates.map((c) => ({ id: c.id, name: c.name, colour: c.colour }))}
            myRole={board.data.myRole}
          />
        ) : null}
      </View>
    );
  }

  return (
    <View style={styles.fill}>
      <Screen title="Comparison matrix" eyebrow={eyebrow} footer={<CautionLine />} testID="matrix-screen">
        {wide ? <BoardBar reviewId={reviewId} current="matrix" layout="tabs" /> : null}
        {body}
      </Screen>
      {!wide ? <BoardBar reviewId={reviewId} current="matrix" layout="bar" /> : null}
    </View>
  );
}

const styles = StyleSheet.create({
  fill: { flex: 1 },
  stack: { gap: space[2] },
  actions: { flexDirection: 'row', flexWrap: 'wrap', gap: space[1], alignItems: 'center' },
  rules: { gap: space.half },
  back: { minHeight: 44, justifyContent: 'center', paddingHorizontal: space[1] },
});
