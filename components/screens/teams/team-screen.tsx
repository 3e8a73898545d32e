import { StyleSheet, View } from 'react-native';

import { authClient } from '@/components/auth/auth-client';
import { useTeamQuery } from '@/components/data/teams';
import { useCurrentTeam } from '@/components/state/current-team';
import { Card } from '@/components/ui/card';
import { count } from '@/components/ui/format';
import { Screen } from '@/components/ui/screen';
import { ErrorState, LoadingState } from '@/components/ui/states';
import { Heading, Text } from '@/components/ui/text';
import { space } from '@/components/ui/tokens';
import { roleAllows, roleLabels } from '@/server/contracts/roles';

import { InvitationRow } from './invitation-row';
import { InviteForm } from './invite-form';
import { MemberRow } from './member-row';

/** Members with their roles; the Owner invites, changes roles, removes, cancels invitations. */
export function TeamScreen() {
  const { team } = useCurrentTeam();
  const detail = useTeamQuery(team?.id);
  const session = authClient.useSession();
  const myUserId = session.data?.user.id;

  const title = team?.name ?? 'Team';
  if (detail.error) {
    return (
      <Screen title={title} eyebrow="Team">
        <ErrorState error={detail.error} onRetry={() => void detail.refetch()} />
      </Screen>
    );
  }
  if (!detail.data) {
    return (
      <Screen title={title} eyebrow="Team">
        <LoadingState label="Loading members…" />
      </Screen>
    );
  }

  const data = detail.data;
  const canManageMembers = roleAllows(data.myRole, { member: ['update'] });
  const canInvite = roleAllows(data.myRole, { invitation: ['create'] });
  const canCancel = roleAllows(data.myRole, { invitation: ['cancel'] });

  return (
    <Screen title={data.name} eyebrow={`Team · you are ${roleLabels[data.myRole]}`} testID="team-screen">
      {canInvite ? <InviteForm teamId={data.id} /> : null}

      <View style={styles.section}>
        <Heading level={2}>Members</Heading>
        <Text size="small" tone="muted" testID="member-count">
          {count(data.members.length, 'member', 'members')}
        </Text>
      </View>
      <Card style={styles.list} testID="member-list">
        {data.members.map((member, i) => (
          <MemberRow
            key={member.memberId}
            teamId={data.id}
            member={member}
            isMe={member.userId === myUserId}
            canManage={canManageMembers}
            first={i === 0}
          />
        ))}
      </Card>

      {canInvite ? (
        <>
          <View style={styles.section}>
            <Heading level={2}>Pending invitations</Heading>
            <Text size="small" tone="muted" testID="invitation-count">
              {count(data.invitations.length, 'invitation', 'invitations')}
            </Text>
          </View>
          {data.invitations.length === 0 ? (
            <Text tone="muted" testID="no-invitations">
              No invitations waiting. Invite someone above.
            </Text>
          ) : (
            <Card style={styles.list} testID="invitation-list">
              {data.invitations.map((invitation, i) => (
                <InvitationRow
                  key={invitation.id ?? invitation.email}
                  teamId={data.id}
                  invitation={invitation}
                  canCancel={canCancel}
                  first={i === 0}
                />
              ))}
            </Card>
          )}
        </>
      ) : null}
    </Screen>
  );
}

const styles = StyleSheet.create({
  section: { flexDirection: 'row', alignItems: 'baseline', justifyContent: 'space-between', marginTop: space[1] },
  list: { padding: 0 },
});
