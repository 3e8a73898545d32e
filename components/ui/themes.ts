import { palette } from './tokens';

/** The colours a screen may use, by role rather than by hue. */
export type Theme = {
  name: 'light' | 'dark';
  surface: string;
  surfaceRaised: string;
  surfaceSunk: string;
  text: string;
  textSoft: string;
  textMuted: string;
  hairline: string;
  accent: string;
  onAccent: string;
  heat: string;
  cold: string;
  good: string;
  warning: string;
  danger: string;
  focus: string;
};

export const lightTheme: Theme = {
  name: 'light',
  surface: palette.paper,
  surfaceRaised: palette.paperRaised,
  surfaceSunk: palette.paperSunk,
  text: palette.graphite,
  textSoft: palette.graphiteSoft,
  textMuted: palette.graphiteMuted,
  hairline: palette.hairline,
  accent: palette.graphite,
  onAccent: palette.paper,
  heat: palette.copper,
  cold: palette.glacier,
  good: palette.moss,
  warning: palette.amber,
  danger: palette.brick,
  focus: palette.glacier,
};

export const darkTheme: Theme = {
  name: 'dark',
  surface: palette.night,
  surfaceRaised: palette.nightRaised,
  surfaceSunk: palette.nightSunk,
  text: palette.nightText,
  textSoft: palette.nightTextSoft,
  textMuted: palette.nightTextMuted,
  hairline: palette.nightHairline,
  accent: palette.nightText,
  onAccent: palette.night,
  heat: '#D9774A',
  cold: '#5B9BBB',
  good: '#7BA65F',
  warning: '#DDA93A',
  danger: '#D0625C',
  focus: '#5B9BBB',
};
