import { StyleSheet, View } from 'react-native';

import { usePresence } from '@/components/data/board';
import { Text } from '@/components/ui/text';
import { useTheme } from '@/components/ui/theme';
import { space } from '@/components/ui/tokens';
import { roleLabels } from '@/server/contracts/roles';

/** Who is on the board now, with their role and the candidate each is looking at. */
export function PresenceList({
  reviewId,
  candidates,
  meId,
}: {
  reviewId: string;
  candidates: Array<{ id: string; name: string; colour: string }>;
  meId: string | undefined;
}) {
  const t = useTheme();
  const people = usePresence(reviewId).data ?? [];
  if (people.length === 0)
    return (
      <Text size="small" tone="muted" testID="presence-empty">
        Nobody else is on the board right now.
      </Text>
    );
  return (
    <View style={styles.list} testID="presence-list" accessibilityLabel="Who is here">
      {people.map((p) => {
        const at = candidates.find((c) => c.id === p.candidateId);
        return (
          <View key={p.userId} style={styles.row} testID={`presence-${p.userId}`}>
            <View style={[styles.dot, { backgroundColor: at?.colour ?? t.hairline }]} />
            <Text size="small" style={styles.text}>
              <Text size="small" weight="semibold">
                {p.name}
                {p.userId === meId ? ' (you)' : ''}
              </Text>
              <Text size="small" tone="muted">{` · ${roleLabels[p.role]} · `}</Text>
              <Text size="small" tone="soft" testID={`presence-at-${p.userId}`}>
                {at ? `on ${at.name}` : 'on the board'}
              </Text>
            </Text>
          </View>
        );
      })}
    </View>
  );
}

const styles = StyleSheet.create({
  list: { gap: space.half },
  row: { flexDirection: 'row', alignItems: 'center', gap: space[1], minHeight: 28 },
  dot: { width: 10, height: 10, borderRadius: 5 },
  text: { flex: 1 },
});
