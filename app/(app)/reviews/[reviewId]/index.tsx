import { useLocalSearchParams } from 'expo-router';

import { ReviewScreen } from '@/components/screens/reviews/review-screen';

export default function ReviewRoute() {
  const { reviewId } = useLocalSearchParams<{ reviewId: string }>();
  return <ReviewScreen reviewId={reviewId} />;
}
