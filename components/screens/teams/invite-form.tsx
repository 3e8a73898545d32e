import { useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { useInviteMemberMutation } from '@/components/data/teams';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { Choice, emailInput, Field, FormError } from '@/components/ui/field';
import { useMessage } from '@/components/ui/message';
import { Heading, Text } from '@/components/ui/text';
import { space } from '@/components/ui/tokens';
import { showFieldErrors, useField } from '@/components/ui/use-field';
import { roleLabels, teamRoles, type TeamRole } from '@/server/contracts/roles';
import { inviteInput } from '@/server/contracts/team';

const roleOptions = teamRoles.map((r) => ({ value: r, label: roleLabels[r] }));

const roleHints: Record<TeamRole, string> = {
  owner: 'Manages the Team, its members and invitations, and everything a Lead does.',
  lead: 'Runs Reviews: creates, renames and archives them, and signs the Decision record.',
  engineer: 'Creates and tunes Candidates, answers comments.',
  reviewer: 'Reads, comments, votes and scores.',
  observer: 'Reads everything, changes nothing.',
};

/** Invite by e-mail with a role; the same schema as the server checks the address as you type. */
export function InviteForm({ teamId }: { teamId: string }) {
  const email = useField(inviteInput.shape.email);
  const [role, setRole] = useState<TeamRole>('engineer');
  const invite = useInviteMemberMutation(teamId);
  const message = useMessage();
  const [formError, setFormError] = useState<string | null>(null);

  const submit = () => {
    if (!email.validate()) return;
    const address = email.value.trim().toLowerCase();
    setFormError(null);
    invite.mutate(
      { email: address, role },
      {
        onSuccess: () => {
          message.show(`Invitation sent to ${address} as ${roleLabels[role]}.`);
          email.reset();
        },
        onError: (error) => setFormError(showFieldErrors(error, { email })),
      },
    );
  };

  return (
    <Card style={styles.card} testID="invite-form">
      <Heading level={2}>Invite someone</Heading>
      <Field
        label="E-mail"
        placeholder="name@company.example"
        value={email.value}
        onChangeText={email.setValue}
        error={email.error}
        {...emailInput}
        // Someone else's address: the browser must not offer the user's own.
        autoComplete="off"
        onSubmitEditing={submit}
        testID="invite-email-input"
      />
      <Choice label="Role" options={roleOptions} value={role} onChange={setRole} testID="invite-role" />
      <Text size="small" tone="muted">
        {roleHints[role]}
      </Text>
      <FormError message={formError} testID="invite-error" />
      <View style={styles.actions}>
        <Button label="Send invitation" busy={invite.isPending} onPress={submit} testID="invite-send-button" />
      </View>
    </Card>
  );
}

const styles = StyleSheet.create({
  card: { gap: space[2] },
  actions: { flexDirection: 'row', justifyContent: 'flex-end' },
});
