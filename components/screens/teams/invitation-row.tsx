import { StyleSheet, View } from 'react-native';

import { useCancelInvitationMutation } from '@/components/data/teams';
import { Badge } from '@/components/ui/badge';
import { Button } from '@/components/ui/button';
import { formatDate } from '@/components/ui/format';
import { useMessage } from '@/components/ui/message';
import { Text } from '@/components/ui/text';
import { useTheme } from '@/components/ui/theme';
import { space } from '@/components/ui/tokens';
import { roleLabels } from '@/server/contracts/roles';
import type { PendingInvitation } from '@/server/contracts/team';

export function InvitationRow({
  teamId,
  invitation,
  canCancel,
  first,
}: {
  teamId: string;
  invitation: PendingInvitation;
  canCancel: boolean;
  first: boolean;
}) {
  const t = useTheme();
  const cancel = useCancelInvitationMutation(teamId);
  const message = useMessage();
  // Null where the server hides it: this viewer may not cancel the invitation.
  const invitationId = invitation.id;
  return (
    <View
      style={[styles.row, !first && { borderTopWidth: 1, borderTopColor: t.hairline }]}
      testID={`invitation-${invitation.email}`}
    >
      <View style={styles.who}>
        <Text weight="medium" numberOfLines={1}>
          {invitation.email}
        </Text>
        <Text size="small" tone="soft" numberOfLines={1}>
          {invitation.invitedBy ? `Invited by ${invitation.invitedBy} · ` : ''}expires{' '}
          {formatDate(invitation.expiresAt)}
        </Text>
      </View>
      <Badge label={roleLabels[invitation.role]} />
      {canCancel && invitationId ? (
        <Button
          label="Cancel"
          accessibilityLabel={`Cancel the invitation to ${invitation.email}`}
          variant="quiet"
          small
          busy={cancel.isPending}
          onPress={() =>
            cancel.mutate(
              { invitationId },
              {
                onSuccess: () => message.show(`Invitation to ${invitation.email} cancelled.`),
                onError: message.showError,
              },
            )
          }
          testID={`invitation-cancel-${invitation.email}`}
        />
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  row: { flexDirection: 'row', alignItems: 'center', gap: space[1] + space.half, padding: space[2] },
  who: { flex: 1, minWidth: 0 },
});
