import { Link, type Href } from 'expo-router';
import { StyleSheet, View } from 'react-native';

import { safeNext } from '@/components/auth/credentials';
import { atoms } from '@/components/ui/atoms';
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

/** The line under the sign-in and sign-up forms that leads to the other one, keeping `next`. */
export function OtherWayIn({
  prompt,
  path,
  next,
  label,
  testID,
}: {
  prompt: string;
  path: '/sign-in' | '/sign-up';
  next: string | undefined;
  label: string;
  testID: string;
}) {
  const query = next ? `?next=${encodeURIComponent(safeNext(next))}` : '';
  return (
    <View style={[atoms.rowWrap, atoms.gap1]}>
      <Text tone="soft">{prompt}</Text>
      <TextLink href={`${path}${query}` as never} label={label} testID={testID} />
    </View>
  );
}

const styles = StyleSheet.create({
  link: { minHeight: touchTarget, justifyContent: 'center', display: 'flex', alignItems: 'center' },
  text: { textDecorationLine: 'underline' },
});
