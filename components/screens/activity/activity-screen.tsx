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
import type { Activity } from '@/server/contracts/team';

const str = (v: unknown) => (typeof v === 'string' ? v : '');

/** A sentence for each kind of entry; unknown kinds still read as plain words. */
function describeActivity(a: Activity): string {
  const d = a.detail;
  switch (a.kind) {
    case 'review:created':
      return `started the Review “${str(d.name)}”`;
    case 'review:renamed':
      return `renamed the Review “${str(d.from)}” to “${str(d.to)}”`;
    case 'review:summary-changed':
      return `changed the summary of “${str(d.name)}”`;
    case 'review:archived':
      return `archived the Review “${str(d.name)}”`;
    case 'review:restored':
      return `restored the Review “${str(d.name)}”`;
    case 'basis:updated':
      return `changed the design basis of “${str(d.reviewName)}”`;
    case 'candidate:added':
      return `added the candidate “${str(d.name)}” to “${str(d.reviewName)}”`;
    case 'candidate:renamed':
      return `renamed the candidate “${str(d.from)}” to “${str(d.to)}”`;
    case 'candidate:status-changed':
      return `marked the candidate “${str(d.name)}” ${str(d.statusLabel).toLowerCase()}`;
    case 'candidate:recomputed':
      return `changed the parameters of “${str(d.name)}”`;
    case 'round:opened':
      return `opened preference round ${str(String(d.number ?? ''))} in “${str(d.reviewName)}”`;
    case 'round:closed':
      return `closed preference round ${str(String(d.number ?? ''))} in “${str(d.reviewName)}”`;
    case 'comment:posted':
      return `commented in “${str(d.reviewName)}”`;
    default: {
      const name = str(d.name);
      return (a.kind as string).replace(/[:._-]+/g, ' ') + (name ? ` “${name}”` : '');
    }
  }
}

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
                <Text weight="semibold">{a.actor?.name ?? 'Someone'}</Text> {describeActivity(a)}
              </Text>
              <View style={styles.metaRow}>
                <Text size="small" tone="muted" accessibilityLabel={formatDateTime(a.createdAt)}>
                  {formatAgo(a.createdAt)}
                </Text>
                {a.reviewId && a.kind !== 'review:archived' ? (
                  <PressableLink
                    href={`/reviews/${a.reviewId}`}
                    accessibilityLabel={`Open the review ${str(a.detail.name) || ''}`.trim()}
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
