import type { ReactNode } from 'react';
import {
  ActivityIndicator,
  Pressable,
  StyleSheet,
  View,
  type PressableProps,
  type StyleProp,
  type ViewStyle,
} from 'react-native';

import { focusRing, type PressState } from './focus';
import { Text } from './text';
import { useTheme } from './theme';
import { radius, space, touchTarget } from './tokens';

type Variant = 'primary' | 'secondary' | 'quiet' | 'danger' | 'inverse';

export type ButtonProps = Omit<PressableProps, 'children' | 'style'> & {
  label: string;
  /** Defaults to `label`; give a fuller one when the label alone is ambiguous ("Rename" → "Rename Review X"). */
  accessibilityLabel?: string;
  variant?: Variant;
  busy?: boolean;
  icon?: ReactNode;
  small?: boolean;
  style?: StyleProp<ViewStyle>;
  testID: string;
};

/** Every press target of the app: at least 44 px, labelled, keyboard usable (Enter / Space on web). */
export function Button({
  label,
  accessibilityLabel,
  variant = 'primary',
  busy,
  disabled,
  icon,
  small,
  style,
  ...rest
}: ButtonProps) {
  const t = useTheme();
  const inactive = disabled || busy;
  const colours = {
    primary: { bg: t.accent, fg: t.onAccent, border: t.accent },
    secondary: { bg: t.surfaceRaised, fg: t.text, border: t.hairline },
    quiet: { bg: 'transparent', fg: t.text, border: 'transparent' },
    danger: { bg: 'transparent', fg: t.danger, border: t.danger },
    /** On a surface of the text colour (the message line). */
    inverse: { bg: 'transparent', fg: t.surface, border: 'transparent' },
  }[variant];
  return (
    <Pressable
      accessibilityRole="button"
      accessibilityLabel={accessibilityLabel ?? label}
      accessibilityState={{ disabled: !!inactive, busy: !!busy }}
      disabled={inactive}
      {...rest}
      style={({ pressed, hovered, focused }: PressState) => [
        styles.base,
        small && styles.small,
        { backgroundColor: colours.bg, borderColor: colours.border },
        (pressed || hovered) && !inactive && { opacity: 0.82 },
        focused && focusRing(t),
        inactive && { opacity: 0.5 },
        style,
      ]}
    >
      {busy ? <ActivityIndicator size="small" color={colours.fg} /> : icon ? <View>{icon}</View> : null}
      <Text weight="medium" size={small ? 'small' : 'body'} style={{ color: colours.fg }} numberOfLines={1}>
        {label}
      </Text>
    </Pressable>
  );
}

const styles = StyleSheet.create({
  base: {
    minHeight: touchTarget,
    minWidth: touchTarget,
    paddingHorizontal: space[2],
    borderRadius: radius.control,
    borderWidth: 1,
    flexDirection: 'row',
    alignItems: 'center',
    justifyContent: 'center',
    gap: space[1],
  },
  small: { paddingHorizontal: space[1] + space.half },
});
