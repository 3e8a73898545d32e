import { StyleSheet } from 'react-native';

import { PressableLink } from './pressable-link';
import { Text } from './text';
import { space, touchTarget } from './tokens';

/** The quiet "← Place" link at the top of a screen that leads one level up. */
export function BackLink({ href, to, label, testID }: { href: string; to: string; label: string; testID: string }) {
  return (
    <PressableLink href={href} accessibilityLabel={label} testID={testID} style={styles.back}>
      <Text size="small" tone="soft">
        ← {to}
      </Text>
    </PressableLink>
  );
}

const styles = StyleSheet.create({
  back: { minHeight: touchTarget, justifyContent: 'center', alignSelf: 'flex-start', paddingRight: space[1] },
});
