import { StyleSheet, View } from 'react-native';

import { Text } from '@/components/ui/text';
import { useTheme } from '@/components/ui/theme';
import { radius, space } from '@/components/ui/tokens';
import type { CandidateWire } from '@/server/contracts/board';

/**
 * Where the board draws T-s diagrams: the small one on each card and the overlay of every
 * candidate's loop. The diagrams come from components/diagrams; until they are in, each slot
 * is an empty frame of the size the diagram takes, so the cards keep their layout.
 */

export function CardDiagram({ candidate }: { candidate: CandidateWire; colour: string }) {
  return <Slot height={150} label={`T-s diagram of ${candidate.name}`} testID={`card-ts-${candidate.id}`} />;
}

export function OverlayDiagram({ candidates }: { candidates: Array<{ candidate: CandidateWire; colour: string }> }) {
  return (
    <Slot height={360} label={`T-s diagram of ${candidates.length} candidates on one chart`} testID="overlay-ts" />
  );
}

function Slot({ height, label, testID }: { height: number; label: string; testID: string }) {
  const t = useTheme();
  return (
    <View
      style={[styles.slot, { height, borderColor: t.hairline, backgroundColor: t.surfaceSunk }]}
      accessibilityLabel={label}
      testID={testID}
    >
      <Text size="caption" tone="muted" align="center">
        T-s diagram
      </Text>
    </View>
  );
}

const styles = StyleSheet.create({
  slot: {
    borderWidth: 1,
    borderStyle: 'dashed',
    borderRadius: radius.control,
    alignItems: 'center',
    justifyContent: 'center',
    padding: space[1],
  },
});
