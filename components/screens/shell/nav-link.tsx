import { StyleSheet, View } from 'react-native';

import { focusRing, type PressState } from '@/components/ui/focus';
import { PressableLink } from '@/components/ui/pressable-link';
import { Text } from '@/components/ui/text';
import { useTheme } from '@/components/ui/theme';
import { radius, space, touchTarget } from '@/components/ui/tokens';

import type { NavItem } from './nav-items';

/** One navigation entry: a real link (middle-click, keyboard), marked current when active. */
export function NavLink({ item, active, layout }: { item: NavItem; active: boolean; layout: 'rail' | 'bar' }) {
  const t = useTheme();
  const colour = active ? t.text : t.textMuted;
  const { Icon } = item;
  return (
    <PressableLink
      href={item.href}
      accessibilityLabel={item.label}
      aria-current={active ? 'page' : undefined}
      testID={item.testID}
      style={({ focused, hovered }: PressState) => [
        layout === 'rail' ? styles.rail : styles.bar,
        layout === 'rail' && active && { backgroundColor: t.surfaceSunk },
        layout === 'rail' && hovered && !active && { backgroundColor: t.surfaceSunk },
        focused && focusRing(t, true),
      ]}
    >
      <Icon colour={colour} size={layout === 'rail' ? 20 : 24} />
      <Text
        size={layout === 'rail' ? 'body' : 'caption'}
        weight={active ? 'semibold' : 'medium'}
        style={{ color: colour }}
      >
        {item.label}
      </Text>
      {layout === 'bar' && active ? <View style={[styles.barMark, { backgroundColor: t.text }]} /> : null}
    </PressableLink>
  );
}

const styles = StyleSheet.create({
  rail: {
    flexDirection: 'row',
    alignItems: 'center',
    gap: space[1] + space.half,
    minHeight: touchTarget,
    paddingHorizontal: space[1] + space.half,
    borderRadius: radius.control,
  },
  barMark: {
    position: 'absolute',
    top: 0,
    left: '30%',
    right: '30%',
    height: 3,
    borderBottomLeftRadius: 2,
    borderBottomRightRadius: 2,
  },
  bar: {
    flex: 1,
    alignItems: 'center',
    justifyContent: 'center',
    gap: 2,
    minHeight: touchTarget + space[1] + space.half,
    paddingVertical: space.half,
  },
});
