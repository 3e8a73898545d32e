import { ReviewsScreen } from '@/components/screens/reviews/reviews-screen';

export default function ReviewsRoute() {
  return <ReviewsScreen />;
}
