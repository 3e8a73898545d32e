import { useWindowDimensions } from 'react-native';

import { wideBreakpoint } from './tokens';

/** True at 1024 px and wider: side rail, roomier padding. */
export function useIsWide(): boolean {
  return useWindowDimensions().width >= wideBreakpoint;
}
