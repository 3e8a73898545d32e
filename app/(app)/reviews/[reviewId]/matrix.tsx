import { useLocalSearchParams } from 'expo-router';

import { ScoringPlaceholderScreen } from '@/components/screens/board/scoring-placeholder-screen';

export default function MatrixRoute() {
  const { reviewId } = useLocalSearchParams<{ reviewId: string }>();
  return <ScoringPlaceholderScreen reviewId={reviewId} place="matrix" />;
}
