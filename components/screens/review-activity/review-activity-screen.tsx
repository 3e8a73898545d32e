import { StyleSheet, View } from 'react-native';

import { useReviewActivityQuery } from '@/components/data/activity';
import { useBoardQuery, useReviewLiveUpdates } from '@/components/data/board';
import { useDecisionLiveUpdates } from '@/components/data/decision';
import { Card } from '@/components/ui/card';
import { CautionLine } from '@/components/ui/caution-line';
import { formatAgo, formatDateTime } from '@/components/ui/format';
import { useIsWide } from '@/components/ui/layout';
import { Screen } from '@/components/ui/screen';
import { EmptyState, ErrorState, LoadingState } from '@/components/ui/states';
import { Text } from '@/components/ui/text';
import { useTheme } from '@/components/ui/theme';
import { space } from '@/components/ui/tokens';

import { describeActivity } from '../activity/describe';
import { BoardBar } from '../board/board-bar';

/** One Review's Activity as a timeline, newest first, kept current while the board's room is joined. */
export function ReviewActivityScreen({ reviewId }: { reviewId: string }) {
  const t = useTheme();
  const wide = useIsWide();
  const board = useBoardQuery(reviewId);
  const activity = useReviewActivityQuery(reviewId);
  useReviewLiveUpdates(reviewId);
  useDecisionLiveUpdates(reviewId);

  let body;
  if (activity.error) body = <ErrorState error={activity.error} onRetry={() => void activity.refetch()} />;
  else if (!activity.data) body = <LoadingState label="Loading activity…" />;
  else if (activity.data.length === 0)
    body = <EmptyState title="Nothing has happened yet">Every change to this Review will be listed here.</EmptyState>;
  else
    body = (
      <Card style={styles.list} testID="review-activity-list">
        {activity.data.map((a, i) => (
          <View key={a.id} style={styles.row} testID="review-activity-item">
            <View style={styles.rail}>
              <View
                style={[
                  styles.dot,
                  {
                    backgroundColor: a.kind.startsWith('decision:')
                      ? t.good
                      : a.kind.startsWith('candidate:')
                        ? t.heat
                        : t.cold,
                  },
                ]}
              />
              {i < activity.data.length - 1 ? <View style={[styles.line, { backgroundColor: t.hairline }]} /> : null}
            </View>
            <View style={styles.text}>
              <Text>
                <Text weight="semibold">{a.actor?.name ?? 'Someone'}</Text> {describeActivity(a, 'review')}
              </Text>
              <Text size="small" tone="muted" accessibilityLabel={formatDateTime(a.createdAt)}>
                {formatAgo(a.createdAt)} · {formatDateTime(a.createdAt)}
              </Text>
            </View>
          </View>
        ))}
      </Card>
    );

  return (
    <View style={styles.fill}>
      <Screen
        title="Activity"
        eyebrow={board.data ? `Review · ${board.data.review.name}` : 'Review'}
        footer={<CautionLine />}
        testID="review-activity-screen"
      >
        {wide ? <BoardBar reviewId={reviewId} current="activity" layout="tabs" /> : null}
        {body}
      </Screen>
      {!wide ? <BoardBar reviewId={reviewId} current="activity" layout="bar" /> : null}
    </View>
  );
}

const styles = StyleSheet.create({
  fill: { flex: 1 },
  list: { paddingVertical: space[1] },
  row: { flexDirection: 'row', gap: space[1] + space.half, minHeight: 56 },
  rail: { width: 12, alignItems: 'center' },
  dot: { width: 10, height: 10, borderRadius: 5, marginTop: 7 },
  line: { width: 2, flex: 1, marginTop: 2 },
  text: { flex: 1, gap: 2, paddingBottom: space[1] + space.half },
});
