import { useLocalSearchParams } from 'expo-router';

import { BoardScreen } from '@/components/screens/board/board-screen';

export default function BoardRoute() {
  const { reviewId } = useLocalSearchParams<{ reviewId: string }>();
  return <BoardScreen reviewId={reviewId} />;
}
