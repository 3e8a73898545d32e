import { useLocalSearchParams } from 'expo-router';

import { SiteYearScreen } from '@/components/screens/site-year/site-year-screen';

export default function SiteYearRoute() {
  const { reviewId } = useLocalSearchParams<{ reviewId: string }>();
  return <SiteYearScreen reviewId={reviewId} />;
}
