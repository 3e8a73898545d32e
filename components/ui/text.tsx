import { Text as RNText, type TextProps as RNTextProps, type TextStyle } from 'react-native';

import { useTheme } from './theme';
import type { Theme } from './themes';
import { fontFamily, typeScale, type TypeSize } from './tokens';

type Tone = 'default' | 'soft' | 'muted' | 'danger' | 'good' | 'warning' | 'heat' | 'cold' | 'onAccent';
type Weight = 'regular' | 'medium' | 'semibold';

export type TextProps = RNTextProps & {
  size?: TypeSize;
  tone?: Tone;
  weight?: Weight;
  /** Numbers: IBM Plex Mono with tabular figures. */
  mono?: boolean;
  align?: TextStyle['textAlign'];
};

/** The colour of a tone in a theme. */
export function toneColour(t: Theme, tone: Tone): string {
  return {
    default: t.text,
    soft: t.textSoft,
    muted: t.textMuted,
    danger: t.danger,
    good: t.good,
    warning: t.warning,
    heat: t.heat,
    cold: t.cold,
    onAccent: t.onAccent,
  }[tone];
}

function family(weight: Weight, mono: boolean): string {
  if (mono) return weight === 'regular' ? fontFamily.mono : fontFamily.monoMedium;
  if (weight === 'semibold') return fontFamily.sansSemiBold;
  if (weight === 'medium') return fontFamily.sansMedium;
  return fontFamily.sans;
}

/** All text of the app goes through here so the faces and colours stay ours. */
export function Text({
  size = 'body',
  tone = 'default',
  weight = 'regular',
  mono = false,
  align,
  style,
  ...rest
}: TextProps) {
  const t = useTheme();
  return (
    <RNText
      {...rest}
      style={[
        typeScale[size],
        { color: toneColour(t, tone), fontFamily: family(weight, mono), textAlign: align },
        mono && { fontVariant: ['tabular-nums'] },
        style,
      ]}
    />
  );
}

export function Heading({ level = 1, ...rest }: TextProps & { level?: 1 | 2 | 3 }) {
  const size: TypeSize = level === 1 ? 'heading' : level === 2 ? 'title' : 'body';
  // react-native-web renders role heading + aria-level as <h1>…<h3>; the native types lack aria-level.
  const levelProp = { 'aria-level': level } as object;
  return <Text role="heading" {...levelProp} size={size} weight="semibold" {...rest} />;
}

/** A number with its unit; the unit is set in the text face so the figure stands out. */
export function Quantity({
  value,
  unit,
  size = 'body',
  testID,
}: {
  value: string;
  unit: string;
  size?: TypeSize;
  testID?: string;
}) {
  return (
    <Text size={size} testID={testID}>
      <Text size={size} mono>
        {value}
      </Text>
      {unit ? <Text size={size} tone="soft">{` ${unit}`}</Text> : null}
    </Text>
  );
}
