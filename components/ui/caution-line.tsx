import { StyleSheet, View } from 'react-native';

import { Text } from './text';
import { useTheme } from './theme';
import { space } from './tokens';

export const cautionText =
  'Concept-stage estimates; detailed design and acceptance follow the applicable codes, the machine maker\u2019s data and licensed engineering practice.';

/** The quiet, always-present line on results, exports and the decision record. */
export function CautionLine() {
  const t = useTheme();
  return (
    <View style={[styles.line, { borderTopColor: t.hairline }]} testID="caution-line" role="note">
      <Text size="caption" tone="muted">
        {cautionText}
      </Text>
    </View>
  );
}

const styles = StyleSheet.create({
  line: { borderTopWidth: 1, paddingTop: space[1], paddingBottom: space[1] },
});
