import { StyleSheet, View } from 'react-native';

import { focusRing, type PressState } from '@/components/ui/focus';
import { PressableLink } from '@/components/ui/pressable-link';
import { Text } from '@/components/ui/text';
import { useTheme } from '@/components/ui/theme';
import { space, touchTarget } from '@/components/ui/tokens';

import { useReplacesMainBar } from '../shell/main-bar';

export type BoardPlace = 'board' | 'matrix' | 'decision' | 'activity';

const places: Array<{ key: BoardPlace; label: string; href: (reviewId: string) => string }> = [
  { key: 'board', label: 'Board', href: (id) => `/reviews/${encodeURIComponent(id)}` },
  { key: 'matrix', label: 'Matrix', href: (id) => `/reviews/${encodeURIComponent(id)}/matrix` },
  { key: 'decision', label: 'Decision', href: (id) => `/reviews/${encodeURIComponent(id)}/decision` },
  { key: 'activity', label: 'Activity', href: (id) => `/reviews/${encodeURIComponent(id)}/activity` },
];

/**
 * The places of one Review: Board · Matrix · Decision · Activity. A bar along the bottom on
 * a phone (where it stands in for the main bar), a row of tabs under the title on a wide screen.
 */
export function BoardBar({
  reviewId,
  current,
  layout,
}: {
  reviewId: string;
  current: BoardPlace;
  layout: 'bar' | 'tabs';
}) {
  const t = useTheme();
  useReplacesMainBar(layout === 'bar');
  return (
    <View
      role="navigation"
      accessibilityLabel="This review"
      style={[
        layout === 'bar' ? styles.bar : styles.tabs,
        layout === 'bar'
          ? { borderTopColor: t.hairline, backgroundColor: t.surfaceRaised }
          : { borderBottomColor: t.hairline },
      ]}
      testID={`review-places-${layout}`}
    >
      {places.map((p) => {
        const active = p.key === current;
        return (
          <PressableLink
            key={p.key}
            href={p.href(reviewId)}
            accessibilityLabel={p.label}
            aria-current={active ? 'page' : undefined}
            testID={`review-place-${p.key}`}
            style={({ focused, hovered }: PressState) => [
              layout === 'bar' ? styles.barItem : styles.tab,
              hovered && !active && { backgroundColor: t.surfaceSunk },
              active && { borderColor: t.text },
              focused && focusRing(t, true),
            ]}
          >
            <Text size="small" weight={active ? 'semibold' : 'medium'} tone={active ? 'default' : 'muted'}>
              {p.label}
            </Text>
          </PressableLink>
        );
      })}
    </View>
  );
}

const styles = StyleSheet.create({
  bar: { flexDirection: 'row', borderTopWidth: 1 },
  barItem: {
    flex: 1,
    minHeight: touchTarget + 4,
    alignItems: 'center',
    justifyContent: 'center',
    borderTopWidth: 3,
    borderColor: 'transparent',
  },
  tabs: { flexDirection: 'row', borderBottomWidth: 1, gap: space[1] },
  tab: {
    minHeight: touchTarget,
    paddingHorizontal: space[2],
    justifyContent: 'center',
    borderBottomWidth: 3,
    borderColor: 'transparent',
  },
});
