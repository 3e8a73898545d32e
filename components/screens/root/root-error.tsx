import type { ErrorBoundaryProps } from 'expo-router';
import { StyleSheet, View } from 'react-native';

import { Button } from '@/components/ui/button';
import { messageFor } from '@/components/ui/message-for';
import { Heading, Text } from '@/components/ui/text';
import { useTheme } from '@/components/ui/theme';
import { space } from '@/components/ui/tokens';

/** Shown when a screen throws while rendering; the rest of the app keeps its state. */
export function RootError({ error, retry }: ErrorBoundaryProps) {
  const t = useTheme();
  return (
    <View style={[styles.page, { backgroundColor: t.surface }]} role="alert" testID="root-error">
      <Heading level={1}>Something broke on this screen</Heading>
      <Text tone="soft" align="center">
        {messageFor(error)}
      </Text>
      <Button label="Try again" onPress={() => void retry()} testID="root-error-retry" />
    </View>
  );
}

const styles = StyleSheet.create({
  page: { flex: 1, alignItems: 'center', justifyContent: 'center', gap: space[2], padding: space[3] },
});
