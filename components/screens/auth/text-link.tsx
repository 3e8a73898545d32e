import { Link, type Href } from 'expo-router';
import { StyleSheet } from 'react-native';

import { Text } from '@/components/ui/text';
import { touchTarget } from '@/components/ui/tokens';

/** An inline link with a full-height press target. */
export function TextLink({ href, label, testID }: { href: Href; label: string; testID: string }) {
  return (
    <Link href={href} testID={testID} style={styles.link} accessibilityLabel={label}>
      <Text weight="medium" tone="cold" style={styles.text}>
        {label}
      </Text>
    </Link>
  );
}

const styles = StyleSheet.create({
  link: { minHeight: touchTarget, justifyContent: 'center', display: 'flex', alignItems: 'center' },
  text: { textDecorationLine: 'underline' },
});
