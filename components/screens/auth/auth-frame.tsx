import type { ReactNode } from 'react';
import { ScrollView, StyleSheet, View } from 'react-native';

import { Brand } from '@/components/ui/brand';
import { CautionLine } from '@/components/ui/caution-line';
import { useDocumentTitle } from '@/components/ui/document-title';
import { useIsWide } from '@/components/ui/layout';
import { Heading, Text } from '@/components/ui/text';
import { useTheme } from '@/components/ui/theme';
import { radius, space } from '@/components/ui/tokens';

/** The signed-out pages: brand, one card with the form, what the product is for. */
export function AuthFrame({
  title,
  lead,
  children,
  testID,
}: {
  title: string;
  lead?: ReactNode;
  children: ReactNode;
  testID: string;
}) {
  const t = useTheme();
  const wide = useIsWide();
  useDocumentTitle(title);
  return (
    <ScrollView
      style={{ flex: 1, backgroundColor: t.surface }}
      contentContainerStyle={[styles.page, wide && styles.pageWide]}
      keyboardShouldPersistTaps="handled"
    >
      <View style={[styles.inner, wide && styles.innerWide]}>
        {wide ? (
          <View style={styles.aside}>
            <Brand large />
            <Text size="title" tone="soft" style={{ maxWidth: 420 }}>
              Set up cycle Candidates for a site, compare them side by side, and record the Team’s decision with its
              reasons.
            </Text>
            <LoopSketch />
          </View>
        ) : (
          <Brand large />
        )}
        <View style={[styles.card, { backgroundColor: t.surfaceRaised, borderColor: t.hairline }]} testID={testID}>
          <Heading level={1}>{title}</Heading>
          {lead ? <View>{typeof lead === 'string' ? <Text tone="soft">{lead}</Text> : lead}</View> : null}
          {children}
        </View>
      </View>
      <View style={[styles.foot, wide && { maxWidth: 960 }]}>
        <CautionLine />
      </View>
    </ScrollView>
  );
}

/** A quiet picture of what the product is about: heat in along the top, heat out along the bottom. */
function LoopSketch() {
  const t = useTheme();
  return (
    <View style={styles.sketch} aria-hidden>
      <View style={[styles.sketchLine, { backgroundColor: t.heat }]} />
      <View style={[styles.sketchLine, { backgroundColor: t.cold, width: '62%' }]} />
      <Text size="caption" tone="muted">
        Heat added · heat rejected
      </Text>
    </View>
  );
}

const styles = StyleSheet.create({
  page: { flexGrow: 1, padding: space[2], paddingTop: space[4], gap: space[3], alignItems: 'center' },
  pageWide: { justifyContent: 'center', padding: space[5] },
  inner: { width: '100%', maxWidth: 440, gap: space[3] },
  innerWide: { maxWidth: 960, flexDirection: 'row', alignItems: 'center', gap: space[8] },
  aside: { flex: 1, gap: space[3] },
  card: { width: '100%', maxWidth: 440, borderWidth: 1, borderRadius: radius.card, padding: space[3], gap: space[2] },
  foot: { width: '100%', maxWidth: 440, marginTop: 'auto' },
  sketch: { gap: space[1], maxWidth: 320 },
  sketchLine: { height: 3, borderRadius: 2, width: '80%' },
});
