import { StyleSheet } from 'react-native';

import { contentMaxWidth, hairlineWidth, radius, space, touchTarget } from './tokens';

/** A few layout atoms shared by many screens; colours come from the theme, not from here. */
export const atoms = StyleSheet.create({
  flex1: { flex: 1 },
  row: { flexDirection: 'row', alignItems: 'center' },
  rowWrap: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center' },
  between: { justifyContent: 'space-between' },
  center: { alignItems: 'center', justifyContent: 'center' },
  gapHalf: { gap: space.half },
  gap1: { gap: space[1] },
  gap2: { gap: space[2] },
  gap3: { gap: space[3] },
  pad2: { padding: space[2] },
  pad3: { padding: space[3] },
  padH2: { paddingHorizontal: space[2] },
  column: { width: '100%', maxWidth: contentMaxWidth, alignSelf: 'center' },
  card: { borderRadius: radius.card, borderWidth: hairlineWidth, padding: space[2] },
  target: { minHeight: touchTarget, minWidth: touchTarget },
  hairlineTop: { borderTopWidth: hairlineWidth },
  hairlineBottom: { borderBottomWidth: hairlineWidth },
});
