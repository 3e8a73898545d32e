import { Link } from 'expo-router';
import { StyleSheet, View } from 'react-native';

import { useDocumentTitle } from '@/components/ui/document-title';
import { BrandMark } from '@/components/ui/icons';
import { Heading, Text } from '@/components/ui/text';
import { useTheme } from '@/components/ui/theme';
import { radius, space, touchTarget } from '@/components/ui/tokens';

export function NotFoundScreen() {
  const t = useTheme();
  useDocumentTitle('Not found');
  return (
    <View style={[styles.page, { backgroundColor: t.surface }]} testID="not-found-screen">
      <BrandMark size={40} ink={t.text} />
      <Heading level={1}>This page does not exist</Heading>
      <Text tone="soft" align="center">
        The link may be old, or the Review may belong to a Team you are not a member of.
      </Text>
      <Link href="/" style={[styles.link, { borderColor: t.hairline }]} testID="not-found-home">
        <Text weight="medium">Go to your Reviews</Text>
      </Link>
    </View>
  );
}

const styles = StyleSheet.create({
  page: { flex: 1, alignItems: 'center', justifyContent: 'center', gap: space[2], padding: space[3] },
  link: {
    minHeight: touchTarget,
    paddingHorizontal: space[2],
    paddingVertical: space[1] + 2,
    borderWidth: 1,
    borderRadius: radius.control,
  },
});
