import { useLocalSearchParams } from 'expo-router';

import { CandidateScreen } from '@/components/screens/candidate/candidate-screen';

export default function CandidateRoute() {
  const { reviewId, candidateId } = useLocalSearchParams<{ reviewId: string; candidateId: string }>();
  return <CandidateScreen reviewId={reviewId} candidateId={candidateId} />;
}
