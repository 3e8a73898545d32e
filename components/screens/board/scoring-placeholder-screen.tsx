import { StyleSheet, View } from 'react-native';

import { useReviewQuery } from '@/components/data/reviews';
import { CautionLine } from '@/components/ui/caution-line';
import { useIsWide } from '@/components/ui/layout';
import { PressableLink } from '@/components/ui/pressable-link';
import { Screen } from '@/components/ui/screen';
import { EmptyState } from '@/components/ui/states';
import { Text } from '@/components/ui/text';
import { space } from '@/components/ui/tokens';

import { BoardBar } from './board-bar';

const about = {
  matrix: {
    title: 'Comparison matrix',
    text: 'The weighted table of candidates against the design basis criteria comes with scoring: each reviewer’s Scores per candidate and criterion, weighted into one matrix you can export.',
  },
  decision: {
    title: 'Decision record',
    text: 'The Decision record comes with scoring: the chosen candidate, its rationale, assumptions and dissent, signed by the Lead and read-only once signed.',
  },
} as const;

/** Matrix and Decision until scoring is built: what will be here, and the way back to the board. */
export function ScoringPlaceholderScreen({ reviewId, place }: { reviewId: string; place: 'matrix' | 'decision' }) {
  const review = useReviewQuery(reviewId);
  const wide = useIsWide();
  const { title, text } = about[place];
  return (
    <View style={styles.fill}>
      <Screen
        title={title}
        eyebrow={review.data ? `Review · ${review.data.name}` : 'Review'}
        footer={<CautionLine />}
        testID={`${place}-screen`}
      >
        {wide ? <BoardBar reviewId={reviewId} current={place} layout="tabs" /> : null}
        <EmptyState
          title="Comes with scoring"
          testID={`${place}-comes-with-scoring`}
          action={
            <PressableLink
              href={`/reviews/${encodeURIComponent(reviewId)}`}
              accessibilityLabel="Back to the board"
              testID="back-to-board"
              style={styles.back}
            >
              <Text weight="medium" tone="cold">
                ← Back to the board
              </Text>
            </PressableLink>
          }
        >
          {text}
        </EmptyState>
      </Screen>
      {!wide ? <BoardBar reviewId={reviewId} current={place} layout="bar" /> : null}
    </View>
  );
}

const styles = StyleSheet.create({
  fill: { flex: 1 },
  back: { minHeight: 44, justifyContent: 'center', paddingHorizontal: space[1] },
});
