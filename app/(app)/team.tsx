import { TeamScreen } from '@/components/screens/teams/team-screen';

export default function TeamRoute() {
  return <TeamScreen />;
}
