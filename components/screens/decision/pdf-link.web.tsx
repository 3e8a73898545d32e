import { Pressable, StyleSheet } from 'react-native';

import { focusRing, type PressState } from '@/components/ui/focus';
import { Text } from '@/components/ui/text';
import { useTheme } from '@/components/ui/theme';
import { radius, space, touchTarget } from '@/components/ui/tokens';

/**
 * The PDF on the web: a real <a href download> to the route. The page is served by the API
 * itself, so the session cookie goes along; phones and desktops save the file alike.
 */
export function PdfLink({ url, number, testID }: { url: string; number: number; testID: string }) {
  const t = useTheme();
  const link = { href: url, hrefAttrs: { download: true, rel: 'noopener' } } as object;
  return (
    <Pressable
      role="link"
      {...link}
      accessibilityLabel={`Download revision ${number} of the decision record as PDF`}
      testID={testID}
      style={({ focused, hovered }: PressState) => [
        styles.link,
        { borderColor: t.hairline, backgroundColor: hovered ? t.surfaceSunk : t.surfaceRaised },
        focused && focusRing(t),
      ]}
    >
      <Text size="small" weight="medium">
        ↓ PDF
      </Text>
    </Pressable>
  );
}

const styles = StyleSheet.create({
  link: {
    minHeight: touchTarget,
    paddingHorizontal: space[2],
    borderWidth: 1,
    borderRadius: radius.control,
    alignItems: 'center',
    justifyContent: 'center',
  },
});
