import { useLocalSearchParams } from 'expo-router';

import { ReviewActivityScreen } from '@/components/screens/review-activity/review-activity-screen';

export default function ReviewActivityRoute() {
  const { reviewId } = useLocalSearchParams<{ reviewId: string }>();
  return <ReviewActivityScreen reviewId={reviewId} />;
}
