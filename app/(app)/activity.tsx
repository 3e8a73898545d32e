import { ActivityScreen } from '@/components/screens/activity/activity-screen';

export default function ActivityRoute() {
  return <ActivityScreen />;
}
