import { usePathname } from 'expo-router';
import type { ReactNode } from 'react';
import { StyleSheet, View } from 'react-native';
import { useSafeAreaInsets } from 'react-native-safe-area-context';

import { Brand } from '@/components/ui/brand';
import { BrandMark } from '@/components/ui/icons';
import { useIsWide } from '@/components/ui/layout';
import { Text } from '@/components/ui/text';
import { useTheme } from '@/components/ui/theme';
import { space } from '@/components/ui/tokens';

import { MainBarProvider } from './main-bar';
import { navItems } from './nav-items';
import { NavLink } from './nav-link';
import { TeamSwitcher } from './team-switcher';

/** Phones: a top strip with the Team switcher and a bottom bar. ≥ 1024 px: a side rail. */
export function AppShell({ userName, children }: { userName: string; children: ReactNode }) {
  const t = useTheme();
  const wide = useIsWide();
  const pathname = usePathname();
  const insets = useSafeAreaInsets();

  if (wide) {
    return (
      <View style={[styles.wide, { backgroundColor: t.surface }]}>
        <View
          style={[styles.rail, { borderRightColor: t.hairline, backgroundColor: t.surfaceRaised }]}
          role="navigation"
          accessibilityLabel="Main"
        >
          <Brand />
          <TeamSwitcher />
          <View style={styles.railNav}>
            {navItems.map((item) => (
              <NavLink key={item.href} item={item} active={item.matches(pathname)} layout="rail" />
            ))}
          </View>
          <View style={styles.railFoot}>
            <Text size="small" tone="muted" numberOfLines={1}>
              Signed in as
            </Text>
            <Text size="small" weight="medium" numberOfLines={1} testID="signed-in-name">
              {userName}
            </Text>
          </View>
        </View>
        <View style={styles.main} role="main">
          {children}
        </View>
      </View>
    );
  }

  return (
    <MainBarProvider>
      {(mainBarHidden) => (
        <View style={[styles.phone, { backgroundColor: t.surface, paddingTop: insets.top }]}>
          <View style={[styles.topStrip, { borderBottomColor: t.hairline }]}>
            <BrandMark size={28} ink={t.text} />
            <TeamSwitcher />
          </View>
          <View style={styles.main} role="main">
            {children}
          </View>
          {mainBarHidden ? null : (
            <View
              style={[
                styles.bar,
                { borderTopColor: t.hairline, backgroundColor: t.surfaceRaised, paddingBottom: insets.bottom },
              ]}
              role="navigation"
              accessibilityLabel="Main"
            >
              {navItems.map((item) => (
                <NavLink key={item.href} item={item} active={item.matches(pathname)} layout="bar" />
              ))}
            </View>
          )}
        </View>
      )}
    </MainBarProvider>
  );
}

const styles = StyleSheet.create({
  wide: { flex: 1, flexDirection: 'row' },
  rail: { width: 256, borderRightWidth: 1, padding: space[2], gap: space[2] },
  railNav: { gap: space.half, marginTop: space[1] },
  railFoot: { marginTop: 'auto', gap: 0 },
  main: { flex: 1, minWidth: 0 },
  phone: { flex: 1 },
  topStrip: {
    flexDirection: 'row',
    alignItems: 'center',
    gap: space[1] + space.half,
    paddingHorizontal: space[2],
    paddingVertical: space[1],
    borderBottomWidth: 1,
  },
  bar: { flexDirection: 'row', borderTopWidth: 1 },
});
