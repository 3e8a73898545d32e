import { useRouter } from 'expo-router';
import { useState } from 'react';
import { Modal, Pressable, StyleSheet, View } from 'react-native';

import { useCurrentTeam } from '@/components/state/current-team';
import { focusRing, type PressState } from '@/components/ui/focus';
import { ChevronIcon, PlusIcon } from '@/components/ui/icons';
import { useIsWide } from '@/components/ui/layout';
import { Text } from '@/components/ui/text';
import { useTheme } from '@/components/ui/theme';
import { radius, space, touchTarget } from '@/components/ui/tokens';
import { roleLabels } from '@/server/contracts/roles';

/** Shows the current Team; opens a list to switch Teams or start a new one. */
export function TeamSwitcher() {
  const t = useTheme();
  const wide = useIsWide();
  const router = useRouter();
  const { team, teams, selectTeam } = useCurrentTeam();
  const [open, setOpen] = useState(false);

  return (
    <>
      <Pressable
        accessibilityRole="button"
        accessibilityLabel={team ? `Current team: ${team.name}. Switch team` : 'Choose a team'}
        aria-expanded={open}
        aria-haspopup="dialog"
        testID="team-switcher"
        onPress={() => setOpen(true)}
        style={({ focused, hovered }: PressState) => [
          styles.trigger,
          { borderColor: t.hairline, backgroundColor: hovered ? t.surfaceSunk : t.surfaceRaised },
          focused && focusRing(t),
        ]}
      >
        <View style={styles.triggerText}>
          <Text size="caption" tone="muted">
            Team
          </Text>
          <Text weight="semibold" numberOfLines={1} testID="current-team-name">
            {team?.name ?? 'No team yet'}
          </Text>
        </View>
        <ChevronIcon colour={t.textSoft} />
      </Pressable>

      <Modal visible={open} transparent animationType="fade" onRequestClose={() => setOpen(false)}>
        <Pressable
          accessibilityLabel="Close team list"
          style={[styles.backdrop, { backgroundColor: 'rgba(21,25,28,0.32)' }]}
          onPress={() => setOpen(false)}
        >
          <Pressable
            // A plain container: presses inside the panel must not close it.
            onPress={() => {}}
            accessible={false}
            style={[
              styles.panel,
              wide ? styles.panelWide : styles.panelPhone,
              { backgroundColor: t.surfaceRaised, borderColor: t.hairline },
            ]}
          >
            <Text size="small" tone="muted" style={styles.panelTitle}>
              Switch team
            </Text>
            <View role="radiogroup" accessibilityLabel="Teams">
              {teams.map((item) => {
                const selected = item.id === team?.id;
                return (
                  <Pressable
                    key={item.id}
                    role="radio"
                    aria-checked={selected}
                    accessibilityLabel={`${item.name}, ${roleLabels[item.role]}`}
                    testID={`team-option-${item.slug}`}
                    onPress={() => {
                      selectTeam(item.id);
                      setOpen(false);
                      router.navigate('/');
                    }}
                    style={({ hovered, focused }: PressState) => [
                      styles.option,
                      (selected || hovered) && { backgroundColor: t.surfaceSunk },
                      focused && focusRing(t, true),
                    ]}
                  >
                    <View
                      style={[styles.dot, { borderColor: t.text, backgroundColor: selected ? t.text : 'transparent' }]}
                    />
                    <Text weight={selected ? 'semibold' : 'regular'} numberOfLines={1} style={{ flex: 1 }}>
                      {item.name}
                    </Text>
                    <Text size="small" tone="muted">
                      {roleLabels[item.role]}
                    </Text>
                  </Pressable>
                );
              })}
            </View>
            <Pressable
              accessibilityRole="link"
              accessibilityLabel="Start a new team"
              testID="team-option-new"
              onPress={() => {
                setOpen(false);
                router.navigate('/teams/new');
              }}
              style={({ hovered, focused }: PressState) => [
                styles.option,
                styles.newTeam,
                { borderTopColor: t.hairline },
                hovered && { backgroundColor: t.surfaceSunk },
                focused && focusRing(t, true),
              ]}
            >
              <PlusIcon colour={t.text} />
              <Text weight="medium">New team</Text>
            </Pressable>
          </Pressable>
        </Pressable>
      </Modal>
    </>
  );
}

const styles = StyleSheet.create({
  trigger: {
    flexDirection: 'row',
    alignItems: 'center',
    gap: space[1],
    minHeight: touchTarget,
    borderWidth: 1,
    borderRadius: radius.control,
    paddingHorizontal: space[1] + space.half,
    paddingVertical: space.half,
    flexShrink: 1,
  },
  triggerText: { flexShrink: 1, minWidth: 0 },
  backdrop: { flex: 1 },
  panel: { position: 'absolute', borderWidth: 1, borderRadius: radius.card, padding: space[1], gap: space.half },
  panelPhone: { top: space[8], left: space[2], right: space[2] },
  panelWide: { top: space[8] + space[4], left: space[2], width: 320 },
  panelTitle: { paddingHorizontal: space[1], paddingVertical: space.half },
  option: {
    flexDirection: 'row',
    alignItems: 'center',
    gap: space[1] + space.half,
    minHeight: touchTarget,
    paddingHorizontal: space[1],
    borderRadius: radius.control,
  },
  dot: { width: 10, height: 10, borderRadius: 5, borderWidth: 1.5 },
  newTeam: { borderTopWidth: 1, borderRadius: 0, marginTop: space.half },
});
