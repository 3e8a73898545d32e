import { useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { useReviewsQuery, type ReviewListStatus } from '@/components/data/reviews';
import { useTeamLiveUpdates } from '@/components/data/team-live-updates';
import { useCurrentTeam } from '@/components/state/current-team';
import { Button } from '@/components/ui/button';
import { Choice } from '@/components/ui/field';
import { count } from '@/components/ui/format';
import { PlusIcon } from '@/components/ui/icons';
import { useIsWide } from '@/components/ui/layout';
import { Screen } from '@/components/ui/screen';
import { EmptyState, ErrorState, LoadingState } from '@/components/ui/states';
import { Text } from '@/components/ui/text';
import { useTheme } from '@/components/ui/theme';
import { space } from '@/components/ui/tokens';
import { roleAllows, roleLabels } from '@/server/contracts/roles';

import { CreateReviewForm } from './create-review-form';
import { ReviewCard } from './review-card';

const filters: Array<{ value: ReviewListStatus; label: string }> = [
  { value: 'active', label: 'Active' },
  { value: 'archived', label: 'Archived' },
  { value: 'all', label: 'All' },
];

/** The current Team's Reviews: create (Owner, Lead), rename inline, archive / restore, filter. */
export function ReviewsScreen() {
  const t = useTheme();
  const wide = useIsWide();
  const { team } = useCurrentTeam();
  const [status, setStatus] = useState<ReviewListStatus>('active');
  const [creating, setCreating] = useState(false);
  const reviews = useReviewsQuery(team?.id, status);
  useTeamLiveUpdates(team?.id);

  if (!team) return null;
  const canCreate = roleAllows(team.role, { review: ['create'] });
  const canEdit = roleAllows(team.role, { review: ['update'] });
  const canArchive = roleAllows(team.role, { review: ['archive'] });

  const newButton =
    canCreate && !creating ? (
      <Button
        label="New review"
        icon={<PlusIcon colour={t.onAccent} />}
        onPress={() => setCreating(true)}
        testID="new-review-button"
      />
    ) : null;

  let body;
  if (reviews.error) body = <ErrorState error={reviews.error} onRetry={() => void reviews.refetch()} />;
  else if (!reviews.data) body = <LoadingState label="Loading reviews…" />;
  else if (reviews.data.length === 0)
    body = (
      <EmptyState title={status === 'archived' ? 'No archived reviews' : 'No reviews yet'} testID="reviews-empty">
        {status === 'archived'
          ? 'Reviews you archive land here and can be restored.'
          : canCreate
            ? 'Start one with “New review”: name the decision this Team has to make.'
            : `A Lead or Owner starts Reviews. As ${roleLabels[team.role]} you will see them here.`}
      </EmptyState>
    );
  else
    body = (
      <View style={[styles.list, wide && styles.grid]} testID="review-list">
        {reviews.data.map((review) => (
          <View key={review.id} style={wide ? styles.gridCell : undefined}>
            <ReviewCard review={review} canEdit={canEdit} canArchive={canArchive} />
          </View>
        ))}
      </View>
    );

  return (
    <Screen
      title="Reviews"
      eyebrow={`${team.name} · ${roleLabels[team.role]}`}
      actions={newButton}
      testID="reviews-screen"
    >
      {creating ? <CreateReviewForm teamId={team.id} onDone={() => setCreating(false)} /> : null}
      <View style={styles.filterRow}>
        <View style={{ flexShrink: 1 }}>
          <Choice label="Show" options={filters} value={status} onChange={setStatus} testID="review-filter" />
        </View>
        {reviews.data ? (
          <Text size="small" tone="muted" testID="review-count">
            {count(reviews.data.length, 'review', 'reviews')}
          </Text>
        ) : null}
      </View>
      {body}
    </Screen>
  );
}

const styles = StyleSheet.create({
  filterRow: {
    flexDirection: 'row',
    alignItems: 'flex-end',
    justifyContent: 'space-between',
    gap: space[2],
    flexWrap: 'wrap',
  },
  list: { gap: space[2] },
  grid: { flexDirection: 'row', flexWrap: 'wrap' },
  gridCell: { width: `calc(50% - ${space[1]}px)` as unknown as number },
});
