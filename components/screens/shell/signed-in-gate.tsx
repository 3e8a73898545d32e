import { Redirect, usePathname } from 'expo-router';
import type { ReactNode } from 'react';
import { View } from 'react-native';

import { authClient } from '@/components/auth/auth-client';
import { isApiError } from '@/components/data/api-error';
import { useMeQuery } from '@/components/data/me';
import { CreateTeamScreen } from '@/components/screens/teams/create-team-screen';
import { CurrentTeamProvider } from '@/components/state/current-team';
import { ErrorState, LoadingState } from '@/components/ui/states';
import { useTheme } from '@/components/ui/theme';
import { UnitSystemProvider } from '@/components/ui/unit-system';

import { AppShell } from './app-shell';

function Centered({ children }: { children: ReactNode }) {
  const t = useTheme();
  return <View style={{ flex: 1, justifyContent: 'center', padding: 16, backgroundColor: t.surface }}>{children}</View>;
}

/** Signed-out visitors go to sign-in (and come back here after); the server checks every request anyway. */
export function SignedInGate({ children }: { children: ReactNode }) {
  const session = authClient.useSession();
  const pathname = usePathname();
  const signedIn = !!session.data;
  const me = useMeQuery(signedIn);

  if (session.isPending)
    return (
      <Centered>
        <LoadingState label="Checking your session…" />
      </Centered>
    );
  const next = pathname && pathname !== '/' ? `?next=${encodeURIComponent(pathname)}` : '';
  if (!signedIn || (isApiError(me.error) && me.error.isUnauthenticated)) return <Redirect href={`/sign-in${next}`} />;
  if (me.error)
    return (
      <Centered>
        <ErrorState error={me.error} onRetry={() => void me.refetch()} />
      </Centered>
    );
  if (!me.data)
    return (
      <Centered>
        <LoadingState />
      </Centered>
    );

  const { user, teams } = me.data;
  // Without a Team there is nothing to show but the way to start one (and Settings, to sign out).
  const body = teams.length === 0 && !pathname.startsWith('/settings') ? <CreateTeamScreen first /> : children;
  // Keyed by user: both providers read that user's stored choices afresh.
  return (
    <UnitSystemProvider key={user.id} userId={user.id}>
      <CurrentTeamProvider userId={user.id} teams={teams}>
        <AppShell userName={user.name}>{body}</AppShell>
      </CurrentTeamProvider>
    </UnitSystemProvider>
  );
}
