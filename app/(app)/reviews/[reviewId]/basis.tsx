import { useLocalSearchParams } from 'expo-router';

import { BasisScreen } from '@/components/screens/design-basis/basis-screen';

export default function BasisRoute() {
  const { reviewId } = useLocalSearchParams<{ reviewId: string }>();
  return <BasisScreen reviewId={reviewId} />;
}
