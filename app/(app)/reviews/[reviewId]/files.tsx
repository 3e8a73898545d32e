import { useLocalSearchParams } from 'expo-router';

import { FilesScreen } from '@/components/screens/files/files-screen';

export default function FilesRoute() {
  const { reviewId } = useLocalSearchParams<{ reviewId: string }>();
  return <FilesScreen reviewId={reviewId} />;
}
