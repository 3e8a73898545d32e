import { useQueryClient } from '@tanstack/react-query';
import { useRouter } from 'expo-router';
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { authClient } from '@/components/auth/auth-client';
import { useMeQuery } from '@/components/data/me';
import { useSettingsQuery, useUpdateSettingsMutation } from '@/components/data/settings';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { Choice } from '@/components/ui/field';
import { unitSystemLabels, type UnitSystem } from '@/components/ui/format';
import { useMessage } from '@/components/ui/message';
import { messageFor } from '@/components/ui/message-for';
import { Screen } from '@/components/ui/screen';
import { Heading, Text } from '@/components/ui/text';
import { space } from '@/components/ui/tokens';
import { useUnitSystem } from '@/components/ui/unit-system';
import { closeRealtimeSocket } from '@/realtime/client';

// Said in words: every number on screen comes from a computation, never from an example.
const unitSummary: Record<UnitSystem, string> = {
  si: 'Temperatures in K, pressures in kPa, flows in kg/s, specific work in kJ/kg, heat rate in kJ/kWh.',
  us: 'Temperatures in °F, pressures in psia, flows in lb/s, specific work in Btu/lb, heat rate in Btu/kWh.',
};

const unitOptions = (['si', 'us'] as const).map((value) => ({ value, label: unitSystemLabels[value] }));

type DigestChoice = 'off' | 'daily';
const digestOptions = [
  { value: 'off', label: 'No digest' },
  { value: 'daily', label: 'Every morning' },
] as const;

/** The daily digest of comments, kept with the account like the units. */
function DigestCard() {
  const settings = useSettingsQuery();
  const update = useUpdateSettingsMutation();
  const value: DigestChoice = settings.data?.dailyDigest ? 'daily' : 'off';
  return (
    <Card style={styles.card}>
      <Heading level={2}>E-mail</Heading>
      <Choice<DigestChoice>
        label="Daily digest of comments"
        options={digestOptions}
        value={value}
        onChange={(next) => update.mutate({ dailyDigest: next === 'daily' })}
        testID="daily-digest"
        error={update.error ? `Not saved: ${messageFor(update.error)}` : null}
      />
      <Text size="small" tone="soft" testID="daily-digest-summary">
        {value === 'daily'
          ? 'Each morning at 07:00 UTC, one e-mail with the comments others posted in your Reviews since the last one (none when nothing is new).'
          : 'You hear by e-mail only when someone @mentions you, invites you or signs a decision.'}
      </Text>
    </Card>
  );
}

/** Account with sign-out, and the display units. */
export function SettingsScreen() {
  const me = useMeQuery();
  const { system, setSystem, saveError } = useUnitSystem();
  const qc = useQueryClient();
  const router = useRouter();
  const message = useMessage();
  const [signingOut, setSigningOut] = useState(false);

  const signOut = async () => {
    setSigningOut(true);
    const { error } = await authClient.signOut();
    setSigningOut(false);
    if (error) {
      message.show(error.message ?? 'Could not sign out. Try again.');
      return;
    }
    closeRealtimeSocket();
    qc.clear();
    router.replace('/sign-in');
  };

  return (
    <Screen title="Settings" testID="settings-screen">
      <Card style={styles.card}>
        <Heading level={2}>Account</Heading>
        <View>
          <Text weight="medium" testID="settings-name">
            {me.data?.user.name ?? '—'}
          </Text>
          <Text tone="soft" testID="settings-email">
            {me.data?.user.email ?? ''}
          </Text>
        </View>
        <View style={styles.actions}>
          <Button
            label="Sign out"
            variant="secondary"
            busy={signingOut}
            onPress={() => void signOut()}
            testID="sign-out-button"
          />
        </View>
      </Card>
      <Card style={styles.card}>
        <Heading level={2}>Units</Heading>
        <Choice<UnitSystem>
          label="Unit system"
          options={unitOptions}
          value={system}
          onChange={setSystem}
          testID="unit-system"
          error={saveError ? `Not saved: ${messageFor(saveError)}` : null}
        />
        <Text size="small" tone="soft" testID="unit-summary">
          {unitSummary[system]}
        </Text>
        <Text size="small" tone="muted">
          Kept with your account, the same on every device you sign in on. Plant power reads in MW in both systems (in
          US customary, hp below 1 MW).
        </Text>
      </Card>
      <DigestCard />
    </Screen>
  );
}

const styles = StyleSheet.create({
  card: { gap: space[2] },
  actions: { flexDirection: 'row' },
});
