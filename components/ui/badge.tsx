import { StyleSheet, View } from 'react-native';

import { Text, toneColour } from './text';
import { useTheme } from './theme';
import { radius, space } from './tokens';

type Tone = 'neutral' | 'good' | 'warning' | 'danger' | 'cold' | 'heat';

/** A small label (a role, a status). Colour is never the only signal: the word is always there. */
export function Badge({ label, tone = 'neutral', testID }: { label: string; tone?: Tone; testID?: string }) {
  const t = useTheme();
  const textTone = tone === 'neutral' ? 'soft' : tone;
  return (
    <View style={[styles.badge, { borderColor: toneColour(t, textTone) }]} testID={testID}>
      <Text size="caption" weight="medium" tone={textTone}>
        {label}
      </Text>
    </View>
  );
}

const styles = StyleSheet.create({
  badge: { borderWidth: 1, borderRadius: radius.pill, paddingHorizontal: space[1], paddingVertical: 2 },
});
