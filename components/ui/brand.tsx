import { StyleSheet, View } from 'react-native';

import { BrandMark } from './icons';
import { Text } from './text';
import { useTheme } from './theme';
import { space } from './tokens';

/** The brand mark with the product's name: `large` on the signed-out pages, rail size inside the app. */
export function Brand({ large = false }: { large?: boolean }) {
  const t = useTheme();
  return (
    <View style={[styles.brand, large ? styles.large : styles.rail]}>
      <BrandMark size={large ? 36 : 28} ink={t.text} />
      <Text size={large ? 'heading' : 'title'} weight="semibold">
        Cyclemoot
      </Text>
    </View>
  );
}

const styles = StyleSheet.create({
  brand: { flexDirection: 'row', alignItems: 'center' },
  large: { gap: space[1] + space.half },
  rail: { gap: space[1], minHeight: space[6] },
});
