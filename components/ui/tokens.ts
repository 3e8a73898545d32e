/**
 * Design tokens: the raw values of our look (LOOK-AND-NAMES.md). Nothing here knows
 * about React; atoms and the theme are built from these.
 */

import { candidateColours } from '@/server/contracts/board';

export const palette = {
  paper: '#F6F3EC',
  paperRaised: '#FBF9F4',
  paperSunk: '#EEE9DF',
  graphite: '#1E2327',
  graphiteSoft: '#4A5258',
  graphiteMuted: '#6B7278',
  hairline: '#D9D3C7',
  night: '#15191C',
  nightRaised: '#1D2226',
  nightSunk: '#101315',
  nightText: '#E9E4DA',
  nightTextSoft: '#BDB7AC',
  nightTextMuted: '#908A80',
  nightHairline: '#343A3F',
  copper: '#B8572B',
  glacier: '#2D6A87',
  moss: '#4F7A35',
  amber: '#C98F12',
  brick: '#A8322D',
  white: '#FFFFFF',
} as const;

/** Okabe–Ito colour-blind-safe series, in order; a candidate keeps its colour everywhere. */
export const candidateSeries = candidateColours;

/** The 8 px grid: space(1) = 8 px. Half steps exist for hairline-tight spots only. */
export const space = {
  half: 4,
  1: 8,
  2: 16,
  3: 24,
  4: 32,
  5: 40,
  6: 48,
  8: 64,
} as const;

export const radius = { card: 12, control: 8, pill: 999 } as const;

export const hairlineWidth = 1;

/** Minimum size of anything a finger or pointer presses. */
export const touchTarget = 44;

/** At this width and wider the app shows a side rail instead of a bottom bar. */
export const wideBreakpoint = 1024;

/** Reading width of the content column on wide screens. */
export const contentMaxWidth = 880;

export const fontFamily = {
  sans: 'IBMPlexSans_400Regular',
  sansMedium: 'IBMPlexSans_500Medium',
  sansSemiBold: 'IBMPlexSans_600SemiBold',
  mono: 'IBMPlexMono_400Regular',
  monoMedium: 'IBMPlexMono_500Medium',
} as const;

/** Type scale in px with line heights on the 8 px grid (or its half step). */
export const typeScale = {
  caption: { fontSize: 12, lineHeight: 16 },
  small: { fontSize: 14, lineHeight: 20 },
  body: { fontSize: 16, lineHeight: 24 },
  title: { fontSize: 20, lineHeight: 28 },
  heading: { fontSize: 24, lineHeight: 32 },
  display: { fontSize: 32, lineHeight: 40 },
} as const;
export type TypeSize = keyof typeof typeScale;
