import { Slot } from 'expo-router';

import { SignedInGate } from '@/components/screens/shell/signed-in-gate';

/** Everything here needs a session: the gate redirects to sign-in, then shows the shell. */
export default function AppLayout() {
  return (
    <SignedInGate>
      <Slot />
    </SignedInGate>
  );
}
