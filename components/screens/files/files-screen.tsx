import { StyleSheet, View } from 'react-native';

import { useBoardQuery, useReviewLiveUpdates } from '@/components/data/board';
import { useIsWide } from '@/components/ui/layout';
import { Screen } from '@/components/ui/screen';
import { ErrorState, LoadingState } from '@/components/ui/states';

import { BoardBar } from '../board/board-bar';
import { FilesPanel } from './files-panel';

/** /reviews/[reviewId]/files: every file of the Review, live. */
export function FilesScreen({ reviewId }: { reviewId: string }) {
  const board = useBoardQuery(reviewId);
  // Joins the Review's room, so file:added / file:removed reach this screen.
  useReviewLiveUpdates(reviewId);
  const wide = useIsWide();
  const body = board.error ? (
    <ErrorState error={board.error} onRetry={() => void board.refetch()} />
  ) : board.isPending ? (
    <LoadingState />
  ) : (
    <FilesPanel reviewId={reviewId} />
  );
  return (
    <View style={styles.fill}>
      <Screen
        title="Files"
        eyebrow={board.data ? `Review · ${board.data.review.name}` : 'Review'}
        testID="files-screen"
      >
        {wide ? <BoardBar reviewId={reviewId} current="board" layout="tabs" /> : null}
        {body}
      </Screen>
      {!wide ? <BoardBar reviewId={reviewId} current="board" layout="bar" /> : null}
    </View>
  );
}

const styles = StyleSheet.create({ fill: { flex: 1 } });
