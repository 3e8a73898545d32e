import { useEffect } from 'react';
import { StyleSheet, View } from 'react-native';

import { useReviewQuery } from '@/components/data/reviews';
import { useTeamLiveUpdates } from '@/components/data/team-live-updates';
import { useCurrentTeam } from '@/components/state/current-team';
import { Badge } from '@/components/ui/badge';
import { Card } from '@/components/ui/card';
import { CautionLine } from '@/components/ui/caution-line';
import { formatDate } from '@/components/ui/format';
import { PressableLink } from '@/components/ui/pressable-link';
import { Screen } from '@/components/ui/screen';
import { EmptyState, ErrorState, LoadingState } from '@/components/ui/states';
import { Heading, Text } from '@/components/ui/text';
import { useTheme } from '@/components/ui/theme';
import { space } from '@/components/ui/tokens';
import { roleLabels } from '@/server/contracts/roles';

/** A Review's page, ready for the board: name, summary and the place Candidates will take. */
export function ReviewScreen({ reviewId }: { reviewId: string }) {
  const t = useTheme();
  const review = useReviewQuery(reviewId);
  const { team, teams, selectTeam } = useCurrentTeam();
  useTeamLiveUpdates(review.data?.teamId);

  // Opening a link to another of my Teams' Reviews makes that Team current.
  const reviewTeamId = review.data?.teamId;
  useEffect(() => {
    if (reviewTeamId && reviewTeamId !== team?.id && teams.some((x) => x.id === reviewTeamId)) selectTeam(reviewTeamId);
  }, [reviewTeamId, team?.id, teams, selectTeam]);

  const back = (
    <PressableLink href="/" accessibilityLabel="Back to reviews" testID="back-to-reviews" style={styles.back}>
      <Text size="small" tone="soft">
        ← Reviews
      </Text>
    </PressableLink>
  );

  if (review.error) {
    return (
      <Screen title="Review" testID="review-screen">
        {back}
        <ErrorState error={review.error} onRetry={() => void review.refetch()} />
      </Screen>
    );
  }
  if (!review.data) {
    return (
      <Screen title="Review" testID="review-screen">
        <LoadingState label="Loading the review…" />
      </Screen>
    );
  }
  const r = review.data;
  return (
    <Screen
      title={r.name}
      eyebrow={`Review · ${teams.find((x) => x.id === r.teamId)?.name ?? ''}`}
      testID="review-screen"
      footer={<CautionLine />}
    >
      <View style={styles.meta}>
        {back}
        <Badge
          label={r.status === 'archived' ? 'Archived' : 'Active'}
          tone={r.status === 'archived' ? 'warning' : 'good'}
          testID="review-status"
        />
        <Text size="small" tone="muted">
          You are {roleLabels[r.myRole]} · started {formatDate(r.createdAt)}
          {r.createdBy ? ` by ${r.createdBy.name}` : ''}
        </Text>
      </View>
      <Card>
        <Heading level={2} style={{ marginBottom: space.half }}>
          Summary
        </Heading>
        <Text tone={r.summary ? 'default' : 'muted'} testID="review-summary">
          {r.summary || 'No summary yet.'}
        </Text>
      </Card>
      <EmptyState title="No candidates yet" testID="candidates-empty">
        Candidates come next: each one a cycle configuration — Simple, Regenerative, Intercooled, Reheat or Intercooled
        + reheat + regenerative — computed by the server and compared side by side on this board.
      </EmptyState>
      <View style={[styles.note, { borderColor: t.hairline }]}>
        <Text size="small" tone="soft">
          The Design basis (site, fuel, required net power, limits and criteria) will be set here before the first
          Candidate.
        </Text>
      </View>
    </Screen>
  );
}

const styles = StyleSheet.create({
  meta: { flexDirection: 'row', alignItems: 'center', gap: space[1] + space.half, flexWrap: 'wrap' },
  back: { minHeight: 44, justifyContent: 'center', paddingRight: space[1] },
  note: { borderLeftWidth: 3, paddingLeft: space[2], paddingVertical: space.half },
});
