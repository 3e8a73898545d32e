import { useRouter } from 'expo-router';
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { useCreateTeamMutation } from '@/components/data/teams';
import { useCurrentTeam } from '@/components/state/current-team';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { Field, FormError } from '@/components/ui/field';
import { Screen } from '@/components/ui/screen';
import { Text } from '@/components/ui/text';
import { space } from '@/components/ui/tokens';
import { showFieldErrors, useField } from '@/components/ui/use-field';
import { teamName } from '@/server/contracts/team';

/** Start a Team; its creator becomes the Owner. `first` when the user has none yet. */
export function CreateTeamScreen({ first = false }: { first?: boolean }) {
  const router = useRouter();
  const { selectTeam } = useCurrentTeam();
  const name = useField(teamName);
  const create = useCreateTeamMutation();
  const [formError, setFormError] = useState<string | null>(null);

  const submit = () => {
    if (!name.validate()) return;
    setFormError(null);
    create.mutate(
      { name: name.value },
      {
        onSuccess: (team) => {
          selectTeam(team.id);
          router.replace('/');
        },
        onError: (error) => setFormError(showFieldErrors(error, { name })),
      },
    );
  };

  return (
    <Screen
      title={first ? 'Start your first team' : 'New team'}
      eyebrow={first ? 'Welcome to Cyclemoot' : 'Teams'}
      testID="create-team-screen"
    >
      <Text tone="soft">
        {first
          ? 'A Team holds your Reviews and the people who take part in them. You will be its Owner and can invite others by e-mail.'
          : 'You will be the Owner of the new Team and can invite others by e-mail.'}
      </Text>
      <Card style={styles.form}>
        <Field
          label="Team name"
          placeholder="e.g. Northfield peaking unit"
          value={name.value}
          onChangeText={name.setValue}
          error={name.error}
          autoFocus
          maxLength={80}
          onSubmitEditing={submit}
          testID="team-name-input"
        />
        <FormError message={formError} testID="create-team-error" />
        <View style={styles.actions}>
          <Button label="Create team" busy={create.isPending} onPress={submit} testID="create-team-button" />
        </View>
      </Card>
    </Screen>
  );
}

const styles = StyleSheet.create({
  form: { gap: space[2] },
  actions: { flexDirection: 'row', justifyContent: 'flex-end' },
});
