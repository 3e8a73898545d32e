import { useLocalSearchParams } from 'expo-router';

import { DecisionScreen } from '@/components/screens/decision/decision-screen';

export default function DecisionRoute() {
  const { reviewId } = useLocalSearchParams<{ reviewId: string }>();
  return <DecisionScreen reviewId={reviewId} />;
}
