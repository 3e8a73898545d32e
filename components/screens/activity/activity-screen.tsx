import { StyleSheet, View } from 'react-native';

import { useActivityQuery } from '@/components/data/activity';
import { useTeamLiveUpdates } from '@/components/data/team-live-updates';
import { useCurrentTeam } from '@/components/state/current-team';
import { Card } from '@/components/ui/card';
import { formatAgo, formatDateTime } from '@/components/ui/format';
import { PressableLink } from '@/components/ui/pressable-link';
import { Screen } from '@/components/ui/screen';
import { EmptyState, ErrorState, LoadingState } from '@/components/ui/states';
import { Text } from '@/components/ui/text';
import { useTheme } from '@/components/ui/theme';
import { space } from '@/components/ui/tokens';

import { describeActivity } from './describe';

/** The current Team's history, newest first. */
export function ActivityScreen() {
  const t = useTheme();
  const { team } = useCurrentTeam();
  const activity = useActivityQuery(team?.id);
  useTeamLiveUpdates(team?.id);
  if (!team) return null;

  let body;
  if (activity.error) body = <ErrorState error={activity.error} onRetry={() => void activity.refetch()} />;
  else if (!activity.data) body = <LoadingState label="Loading activity…" />;
  else if (activity.data.length === 0)
    body = (
      <EmptyState title="Nothing has happened yet">
        Every change to this Team’s Reviews will be listed here, newest first.
      </EmptyState>
    );
  else
    body = (
      <Card style={styles.list} testID="activity-list">
        {activity.data.map((a, i) => (
          <View
            key={a.id}
            style={[styles.row, i > 0 && { borderTopWidth: 1, borderTopColor: t.hairline }]}
            testID="activity-item"
          >
            <View style={[styles.mark, { backgroundColor: a.kind.endsWith('archived') ? t.warning : t.cold }]} />
            <View style={styles.text}>
              <Text>
                <Text weight="semibold">{a.actor?.name ?? 'Someone'}</Text> {describeActivity(a, 'team')}
              </Text>
              <View style={styles.metaRow}>
                <Text size="small" tone="muted" accessibilityLabel={formatDateTime(a.createdAt)}>
                  {formatAgo(a.createdAt)}
                </Text>
                {a.reviewId && a.kind !== 'review:archived' ? (
                  <PressableLink
                    href={`/reviews/${a.reviewId}`}
                    accessibilityLabel={`Open the review ${typeof a.detail.name === 'string' ? a.detail.name : ''}`.trim()}
                    style={styles.link}
                  >
                    <Text size="small" tone="cold" weight="medium">
                      Open review
                    </Text>
                  </PressableLink>
                ) : null}
              </View>
            </View>
          </View>
        ))}
      </Card>
    );

  return (
    <Screen title="Activity" eyebrow={team.name} testID="activity-screen">
      {body}
    </Screen>
  );
}

const styles = StyleSheet.create({
  list: { padding: 0 },
  row: {
    flexDirection: 'row',
    gap: space[1] + space.half,
    paddingHorizontal: space[2],
    paddingTop: space[2],
    paddingBottom: space.half,
  },
  mark: { width: 8, height: 8, borderRadius: 4, marginTop: 8 },
  text: { flex: 1, gap: space.half },
  metaRow: { flexDirection: 'row', alignItems: 'center', gap: space[2] },
  link: { minHeight: 44, minWidth: 44, justifyContent: 'center' },
});
