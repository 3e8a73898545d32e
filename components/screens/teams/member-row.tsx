import { useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { useRemoveMemberMutation, useUpdateMemberRoleMutation } from '@/components/data/teams';
import { Badge } from '@/components/ui/badge';
import { Button } from '@/components/ui/button';
import { Choice } from '@/components/ui/field';
import { formatDate } from '@/components/ui/format';
import { useMessage } from '@/components/ui/message';
import { Text } from '@/components/ui/text';
import { useTheme } from '@/components/ui/theme';
import { space } from '@/components/ui/tokens';
import { roleLabels, teamRoles, type TeamRole } from '@/server/contracts/roles';
import type { TeamMember } from '@/server/contracts/team';

const roleOptions = teamRoles.map((r) => ({ value: r, label: roleLabels[r] }));

export function MemberRow({
  teamId,
  member,
  isMe,
  canManage,
  first,
}: {
  teamId: string;
  member: TeamMember;
  isMe: boolean;
  canManage: boolean;
  first: boolean;
}) {
  const t = useTheme();
  const [editing, setEditing] = useState(false);
  const [confirmRemove, setConfirmRemove] = useState(false);
  const updateRole = useUpdateMemberRoleMutation(teamId);
  const remove = useRemoveMemberMutation(teamId);
  const message = useMessage();
  const manageable = canManage && !isMe;

  const changeRole = (role: TeamRole) => {
    if (role === member.role) return;
    updateRole.mutate(
      { memberId: member.memberId, role },
      {
        onSuccess: () => message.show(`${member.name} is now ${roleLabels[role]}.`),
        onError: message.showError,
      },
    );
  };

  return (
    <View
      style={[styles.row, !first && { borderTopWidth: 1, borderTopColor: t.hairline }]}
      testID={`member-${member.email}`}
    >
      <View style={styles.main}>
        <View style={styles.who}>
          <Text weight="semibold" numberOfLines={1}>
            {member.name}
            {isMe ? <Text tone="muted"> (you)</Text> : null}
          </Text>
          <Text size="small" tone="soft" numberOfLines={1}>
            {member.email} · joined {formatDate(member.joinedAt)}
          </Text>
        </View>
        <Badge
          label={roleLabels[member.role]}
          tone={member.role === 'owner' ? 'cold' : 'neutral'}
          testID={`member-role-${member.email}`}
        />
        {manageable ? (
          <Button
            label={editing ? 'Done' : 'Manage'}
            accessibilityLabel={editing ? `Close managing ${member.name}` : `Manage ${member.name}`}
            variant="quiet"
            small
            onPress={() => {
              setEditing(!editing);
              setConfirmRemove(false);
            }}
            testID={`member-manage-${member.email}`}
          />
        ) : null}
      </View>
      {manageable && editing ? (
        <View style={styles.editor}>
          <Choice
            label={`Role of ${member.name}`}
            options={roleOptions}
            value={member.role}
            onChange={changeRole}
            testID={`member-role-choice-${member.email}`}
          />
          {confirmRemove ? (
            <View style={styles.confirm}>
              <Text size="small" tone="danger" style={{ flex: 1 }}>
                Remove {member.name} from the Team? They lose access at once.
              </Text>
              <Button
                label="Keep"
                variant="secondary"
                small
                onPress={() => setConfirmRemove(false)}
                testID={`member-remove-cancel-${member.email}`}
              />
              <Button
                label="Remove"
                accessibilityLabel={`Remove ${member.name}`}
                variant="danger"
                small
                busy={remove.isPending}
                onPress={() =>
                  remove.mutate(
                    { memberId: member.memberId },
                    {
                      onSuccess: () => message.show(`${member.name} was removed from the Team.`),
                      onError: message.showError,
                    },
                  )
                }
                testID={`member-remove-confirm-${member.email}`}
              />
            </View>
          ) : (
            <View style={styles.confirm}>
              <Button
                label="Remove from team"
                accessibilityLabel={`Remove ${member.name} from the team`}
                variant="danger"
                small
                onPress={() => setConfirmRemove(true)}
                testID={`member-remove-${member.email}`}
              />
            </View>
          )}
        </View>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  row: { padding: space[2], gap: space[2] },
  main: { flexDirection: 'row', alignItems: 'center', gap: space[1] + space.half },
  who: { flex: 1, minWidth: 0 },
  editor: { gap: space[2] },
  confirm: { flexDirection: 'row', alignItems: 'center', gap: space[1], justifyContent: 'flex-end', flexWrap: 'wrap' },
});
