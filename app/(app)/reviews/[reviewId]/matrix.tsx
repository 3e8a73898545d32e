import { useLocalSearchParams } from 'expo-router';

import { MatrixScreen } from '@/components/screens/matrix/matrix-screen';

export default function MatrixRoute() {
  const { reviewId } = useLocalSearchParams<{ reviewId: string }>();
  return <MatrixScreen reviewId={reviewId} />;
}
