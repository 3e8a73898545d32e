import type { ReactNode } from 'react';
import Svg, { Circle, G, Path, Rect } from 'react-native-svg';

type IconProps = { colour: string; size?: number };

/** Our own line glyphs, 24-unit grid, 1.75 stroke. Decorative: the control carries the label. */
function Glyph({ colour, size, children }: IconProps & { size: number; children: ReactNode }) {
  return (
    <Svg width={size} height={size} viewBox="0 0 24 24" aria-hidden>
      <G stroke={colour} strokeWidth={1.75} fill="none" strokeLinecap="round" strokeLinejoin="round">
        {children}
      </G>
    </Svg>
  );
}

export function ReviewsIcon({ colour, size = 24 }: IconProps) {
  return (
    <Glyph colour={colour} size={size}>
      <Rect x={4} y={7} width={16} height={13} rx={2.5} />
      <Path d="M7 4h10" />
      <Path d="M8 12h8M8 15.5h5" />
    </Glyph>
  );
}

export function TeamIcon({ colour, size = 24 }: IconProps) {
  return (
    <Glyph colour={colour} size={size}>
      <Circle cx={9} cy={8.5} r={3.25} />
      <Circle cx={16.5} cy={9.5} r={2.5} />
      <Path d="M3.5 19c.6-3.2 2.8-5 5.5-5s4.9 1.8 5.5 5M15 14.2c2.6-.4 4.7 1.1 5.3 4.3" />
    </Glyph>
  );
}

export function ActivityIcon({ colour, size = 24 }: IconProps) {
  return (
    <Glyph colour={colour} size={size}>
      <Path d="M3 12h4l2.5-6 5 12 2.5-6h4" />
    </Glyph>
  );
}

export function SettingsIcon({ colour, size = 24 }: IconProps) {
  return (
    <Glyph colour={colour} size={size}>
      <Path d="M4 7h9M17 7h3M4 17h3M11 17h9" />
      <Circle cx={15} cy={7} r={2} />
      <Circle cx={9} cy={17} r={2} />
    </Glyph>
  );
}

export function ChevronIcon({ colour, size = 20, up }: IconProps & { up?: boolean }) {
  return (
    <Glyph colour={colour} size={size}>
      <Path d={up ? 'M6 15l6-6 6 6' : 'M6 9l6 6 6-6'} />
    </Glyph>
  );
}

export function PlusIcon({ colour, size = 20 }: IconProps) {
  return (
    <Glyph colour={colour} size={size}>
      <Path d="M12 5v14M5 12h14" />
    </Glyph>
  );
}

/** The brand mark: a closed loop, heat added on top (copper), heat rejected below (glacier). */
export function BrandMark({ size = 28, ink = '#1E2327' }: { size?: number; ink?: string }) {
  return (
    <Svg width={size} height={size} viewBox="0 0 32 32" aria-hidden>
      <Path d="M5 22 C 8 10, 20 5, 27 9" stroke="#B8572B" strokeWidth={3} fill="none" strokeLinecap="round" />
      <Path d="M27 9 C 27 18, 18 26, 5 22" stroke="#2D6A87" strokeWidth={3} fill="none" strokeLinecap="round" />
      <Circle cx={5} cy={22} r={2.5} fill={ink} />
      <Circle cx={27} cy={9} r={2.5} fill={ink} />
    </Svg>
  );
}
