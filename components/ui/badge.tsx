import { StyleSheet, View } from 'react-native';

import { Text } from './text';
import { useTheme } from './theme';
import { radius, space } from './tokens';

type Tone = 'neutral' | 'good' | 'warning' | 'danger' | 'cold' | 'heat';

/** A small label (a role, a status). Colour is never the only signal: the word is always there. */
export function Badge({ label, tone = 'neutral', testID }: { label: string; tone?: Tone; testID?: string }) {
  const t = useTheme();
  const colour = {
    neutral: t.textSoft,
    good: t.good,
    warning: t.warning,
    danger: t.danger,
    cold: t.cold,
    heat: t.heat,
  }[tone];
  return (
    <View style={[styles.badge, { borderColor: colour }]} testID={testID}>
      <Text size="caption" weight="medium" style={{ color: colour }}>
        {label}
      </Text>
    </View>
  );
}

const styles = StyleSheet.create({
  badge: { borderWidth: 1, borderRadius: radius.pill, paddingHorizontal: space[1], paddingVertical: 2 },
});
