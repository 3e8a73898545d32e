import { CreateTeamScreen } from '@/components/screens/teams/create-team-screen';

export default function NewTeamRoute() {
  return <CreateTeamScreen />;
}
