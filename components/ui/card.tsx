import { View, type ViewProps } from 'react-native';

import { atoms } from './atoms';
import { useTheme } from './theme';

/** 12 px radius, 1 px hairline, no shadow. */
export function Card({ style, sunk, ...rest }: ViewProps & { sunk?: boolean }) {
  const t = useTheme();
  return (
    <View
      {...rest}
      style={[atoms.card, { borderColor: t.hairline, backgroundColor: sunk ? t.surfaceSunk : t.surfaceRaised }, style]}
    />
  );
}
