import { useLocalSearchParams } from 'expo-router';

import { InvitationScreen } from '@/components/screens/auth/invitation-screen';

export default function InvitationRoute() {
  const { token } = useLocalSearchParams<{ token: string }>();
  return <InvitationScreen invitationId={token} />;
}
