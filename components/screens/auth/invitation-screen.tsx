import { useRouter } from 'expo-router';
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { authClient } from '@/components/auth/auth-client';
import { isApiError } from '@/components/data/api-error';
import { useAcceptInvitationMutation, useInvitationQuery, type InvitationSummary } from '@/components/data/invitations';
import { rememberTeam } from '@/components/state/current-team';
import { Badge } from '@/components/ui/badge';
import { Button } from '@/components/ui/button';
import { Choice, FormError } from '@/components/ui/field';
import { formatDate } from '@/components/ui/format';
import { messageFor } from '@/components/ui/message-for';
import { EmptyState, ErrorState, LoadingState } from '@/components/ui/states';
import { Text } from '@/components/ui/text';
import { useTheme } from '@/components/ui/theme';
import { radius, space } from '@/components/ui/tokens';
import { roleLabels } from '@/server/contracts/roles';

import { AuthFrame } from './auth-frame';
import { SignInForm } from './sign-in-form';
import { SignUpForm } from './sign-up-form';
import { TextLink } from './text-link';

type Mode = 'sign-up' | 'sign-in';

/**
 * Says who invited whom to which Team and as what, before any sign-in; then sign up or
 * sign in with the invited e-mail, accept, and land in the Team.
 */
export function InvitationScreen({ invitationId }: { invitationId: string }) {
  const invitation = useInvitationQuery(invitationId);
  const session = authClient.useSession();
  // better-auth refetches the session after a sign-up; showing "loading" then would unmount
  // the form and lose its "check your inbox" step.
  // React's "state from an earlier render" pattern: set once, never reset.
  const [sessionKnown, setSessionKnown] = useState(false);
  if (!session.isPending && !sessionKnown) setSessionKnown(true);
  // The moment the screen opened; expiry is judged against it, not re-read on every render.
  const [openedAt] = useState(() => Date.now());

  if (invitation.error) {
    const missing = isApiError(invitation.error) && invitation.error.status === 404;
    return (
      <AuthFrame title="Invitation" testID="invitation-screen">
        {missing ? (
          <EmptyState title="This invitation was not found" testID="invitation-missing">
            The link may be incomplete, or the invitation was withdrawn. Ask the Team’s Owner to invite you again.
          </EmptyState>
        ) : (
          <ErrorState error={invitation.error} onRetry={() => void invitation.refetch()} />
        )}
        <TextLink href="/sign-in" label="Go to sign-in" testID="invitation-to-sign-in" />
      </AuthFrame>
    );
  }
  if (!invitation.data || !sessionKnown) {
    return (
      <AuthFrame title="Invitation" testID="invitation-screen">
        <LoadingState label="Reading the invitation…" />
      </AuthFrame>
    );
  }

  const inv = invitation.data;
  const expired = new Date(inv.expiresAt).getTime() < openedAt;
  if (inv.status !== 'pending' || expired) {
    const why =
      inv.status === 'accepted'
        ? 'It has already been accepted.'
        : inv.status === 'canceled'
          ? 'The Team’s Owner withdrew it.'
          : inv.status === 'rejected'
            ? 'It was declined.'
            : `It expired on ${formatDate(inv.expiresAt)}.`;
    return (
      <AuthFrame title={`Invitation to ${inv.teamName}`} testID="invitation-screen">
        <EmptyState title="This invitation can no longer be used" testID="invitation-closed">
          {why} {inv.status === 'accepted' ? 'Sign in to open the Team.' : 'Ask the Team’s Owner for a new one.'}
        </EmptyState>
        <TextLink
          href={session.data ? '/' : '/sign-in'}
          label={session.data ? 'Go to your Reviews' : 'Go to sign-in'}
          testID="invitation-onward"
        />
      </AuthFrame>
    );
  }

  return (
    <AuthFrame title={`Join ${inv.teamName}`} lead={<InvitationSummaryCard inv={inv} />} testID="invitation-screen">
      <InvitationAction inv={inv} signedInEmail={session.data?.user.email ?? null} />
    </AuthFrame>
  );
}

function InvitationSummaryCard({ inv }: { inv: InvitationSummary }) {
  const t = useTheme();
  return (
    <View style={[styles.summary, { backgroundColor: t.surfaceSunk }]} testID="invitation-summary">
      <Text>
        <Text weight="semibold">{inv.inviterName ?? 'A former member'}</Text> invited{' '}
        <Text weight="semibold">{inv.email}</Text> to the Team <Text weight="semibold">{inv.teamName}</Text>.
      </Text>
      <View style={styles.roleRow}>
        <Text size="small" tone="soft">
          Role
        </Text>
        <Badge label={roleLabels[inv.role] ?? inv.role} tone="cold" testID="invitation-role" />
        <Text size="small" tone="muted">
          · valid until {formatDate(inv.expiresAt)}
        </Text>
      </View>
    </View>
  );
}

function InvitationAction({ inv, signedInEmail }: { inv: InvitationSummary; signedInEmail: string | null }) {
  const router = useRouter();
  const accept = useAcceptInvitationMutation();
  const [mode, setMode] = useState<Mode>('sign-up');
  const [signingOut, setSigningOut] = useState(false);

  const acceptAndEnter = async () => {
    const { teamId } = await accept.mutateAsync({ invitationId: inv.id });
    const session = await authClient.getSession();
    const userId = session.data?.user.id;
    if (userId && teamId) rememberTeam(userId, teamId);
    router.replace('/');
  };
  const acceptError = (
    <FormError message={accept.error ? messageFor(accept.error) : null} testID="invitation-accept-error" />
  );

  if (signedInEmail && signedInEmail.toLowerCase() === inv.email.toLowerCase()) {
    return (
      <View style={styles.block}>
        <Text tone="soft">You are signed in as {signedInEmail}.</Text>
        {acceptError}
        <Button
          label={`Accept and join ${inv.teamName}`}
          busy={accept.isPending}
          onPress={() => void acceptAndEnter().catch(() => {})}
          testID="accept-invitation-button"
        />
      </View>
    );
  }

  if (signedInEmail) {
    return (
      <View style={styles.block}>
        <Text tone="soft" testID="invitation-wrong-account">
          You are signed in as {signedInEmail}, but this invitation is for {inv.email}. Sign out, then continue as{' '}
          {inv.email}.
        </Text>
        <Button
          label="Sign out and continue"
          variant="secondary"
          busy={signingOut}
          onPress={async () => {
            setSigningOut(true);
            await authClient.signOut();
            setSigningOut(false);
          }}
          testID="invitation-sign-out"
        />
      </View>
    );
  }

  const onDone = () => acceptAndEnter().catch(() => {});
  // The confirmation link of a new account comes back here, signed in, to accept.
  const here = `/invitation/${inv.id}`;
  return (
    <View style={styles.block}>
      <Choice<Mode>
        label="To accept"
        options={[
          { value: 'sign-up', label: 'I am new here' },
          { value: 'sign-in', label: 'I have an account' },
        ]}
        value={mode}
        onChange={setMode}
        testID="invitation-mode"
      />
      {acceptError}
      {mode === 'sign-up' ? (
        <SignUpForm initialEmail={inv.email} returnTo={here} />
      ) : (
        <SignInForm initialEmail={inv.email} returnTo={here} onSignedIn={onDone} />
      )}
    </View>
  );
}

const styles = StyleSheet.create({
  summary: { borderRadius: radius.control, padding: space[2], gap: space[1] },
  roleRow: { flexDirection: 'row', alignItems: 'center', gap: space[1], flexWrap: 'wrap' },
  block: { gap: space[2] },
});
