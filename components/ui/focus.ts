import type { Theme } from './themes';

/** What a pressable's style function receives; hovered and focused come from react-native-web. */
export type PressState = { pressed: boolean; hovered?: boolean; focused?: boolean };

/**
 * The keyboard focus outline of every pressable. `inside` draws it within the bounds, for
 * rows and rail entries that sit flush against their neighbours.
 */
export function focusRing(t: Theme, inside = false) {
  return { outlineColor: t.focus, outlineWidth: 2, outlineStyle: 'solid', outlineOffset: inside ? -2 : 2 } as const;
}
