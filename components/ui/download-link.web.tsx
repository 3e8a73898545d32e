import { Pressable, StyleSheet } from 'react-native';

import type { DownloadLinkProps } from './download-link';
import { focusRing, type PressState } from './focus';
import { Text } from './text';
import { useTheme } from './theme';
import { radius, space, touchTarget } from './tokens';

/**
 * A download on the web: a real <a href download> to the route. The page is served by
 * the API itself, so the session cookie goes along; phones and desktops save the file alike.
 */
export function DownloadLink({ url, label, accessibilityLabel, testID }: DownloadLinkProps) {
  const t = useTheme();
  const link = { href: url, hrefAttrs: { download: true, rel: 'noopener' } } as object;
  return (
    <Pressable
      role="link"
      {...link}
      accessibilityLabel={accessibilityLabel}
      testID={testID}
      style={({ focused, hovered }: PressState) => [
        styles.link,
        { borderColor: t.hairline, backgroundColor: hovered ? t.surfaceSunk : t.surfaceRaised },
        focused && focusRing(t),
      ]}
    >
      <Text size="small" weight="medium">
        ↓ {label}
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
