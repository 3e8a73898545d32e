import type { ReactNode } from 'react';
import { ActivityIndicator, StyleSheet, View } from 'react-native';

import { isApiError } from '@/components/data/api-error';

import { Button } from './button';
import { messageFor } from './message-for';
import { Text } from './text';
import { useTheme } from './theme';
import { space } from './tokens';

/** The four states of every screen, in order: error | loading | empty | content. */

export function ErrorState({
  error,
  onRetry,
  testID = 'error-state',
}: {
  error: unknown;
  onRetry?: () => void;
  testID?: string;
}) {
  const t = useTheme();
  // A missing item or a refused one stays so however often it is asked for: no retry then.
  const settled = isApiError(error) && (error.status === 403 || error.status === 404);
  return (
    <View style={[styles.box, { borderColor: t.danger }]} role="alert" testID={testID}>
      <Text weight="semibold" tone="danger">
        {settled ? (error.status === 404 ? 'Not found' : 'Not open to you') : 'Could not load this'}
      </Text>
      <Text tone="soft" align="center">
        {messageFor(error)}
      </Text>
      {onRetry && !settled ? (
        <Button label="Try again" variant="secondary" onPress={onRetry} testID={`${testID}-retry`} />
      ) : null}
    </View>
  );
}

export function LoadingState({ label = 'Loading…' }: { label?: string }) {
  const t = useTheme();
  return (
    <View style={styles.loading} accessibilityLabel={label} aria-busy testID="loading-state">
      <ActivityIndicator color={t.cold} />
      <Text size="small" tone="muted">
        {label}
      </Text>
    </View>
  );
}

export function EmptyState({
  title,
  children,
  action,
  testID = 'empty-state',
}: {
  title: string;
  children?: ReactNode;
  action?: ReactNode;
  testID?: string;
}) {
  const t = useTheme();
  return (
    <View style={[styles.box, { borderColor: t.hairline, borderStyle: 'dashed' }]} testID={testID}>
      <Text weight="semibold" align="center">
        {title}
      </Text>
      {children ? (
        <Text tone="soft" align="center">
          {children}
        </Text>
      ) : null}
      {action}
    </View>
  );
}

const styles = StyleSheet.create({
  box: {
    borderWidth: 1,
    borderRadius: 12,
    padding: space[3],
    gap: space[1] + space.half,
    alignItems: 'center',
  },
  loading: { padding: space[4], alignItems: 'center', gap: space[1] },
});
