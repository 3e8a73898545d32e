import type { ReactNode } from 'react';
import { ScrollView, StyleSheet, View } from 'react-native';

import { atoms } from './atoms';
import { useDocumentTitle } from './document-title';
import { useIsWide } from './layout';
import { Heading, Text } from './text';
import { useTheme } from './theme';
import { space } from './tokens';

/** The scrolling body of a screen: one reading column, a title block, then the content. */
export function Screen({
  title,
  eyebrow,
  actions,
  footer,
  children,
  testID,
}: {
  title: string;
  eyebrow?: string;
  actions?: ReactNode;
  footer?: ReactNode;
  children: ReactNode;
  testID?: string;
}) {
  const t = useTheme();
  const wide = useIsWide();
  useDocumentTitle(title);
  return (
    <ScrollView
      style={{ flex: 1, backgroundColor: t.surface }}
      contentContainerStyle={[styles.content, { padding: wide ? space[4] : space[2] }]}
      keyboardShouldPersistTaps="handled"
      testID={testID}
    >
      <View style={[atoms.column, atoms.gap3, styles.grow]}>
        <View style={[styles.titleRow]}>
          <View style={[atoms.flex1, styles.titleText]}>
            {eyebrow ? (
              <Text size="small" tone="muted" numberOfLines={1}>
                {eyebrow}
              </Text>
            ) : null}
            <Heading level={1}>{title}</Heading>
          </View>
          {actions ? <View style={[atoms.row, atoms.gap1]}>{actions}</View> : null}
        </View>
        <View style={[atoms.gap2, styles.grow]}>{children}</View>
        {footer}
      </View>
    </ScrollView>
  );
}

const styles = StyleSheet.create({
  content: { flexGrow: 1, paddingBottom: space[8] + space[4] },
  grow: { flexGrow: 1 },
  titleRow: { flexDirection: 'row', alignItems: 'flex-end', gap: space[2], flexWrap: 'wrap' },
  titleText: { minWidth: 200 },
});
