import { StyleSheet, View } from 'react-native';

import { SiteYearLine } from '@/components/screens/site-year/site-year-line';
import { Badge } from '@/components/ui/badge';
import { Button } from '@/components/ui/button';
import { focusRing, type PressState } from '@/components/ui/focus';
import { count } from '@/components/ui/format';
import { PressableLink } from '@/components/ui/pressable-link';
import { Heading, Quantity, Text } from '@/components/ui/text';
import { useTheme } from '@/components/ui/theme';
import { radius, space } from '@/components/ui/tokens';
import { useUnitSystem } from '@/components/ui/unit-system';
import {
  presetLabels,
  statusLabels,
  type CandidateStatus,
  type CandidateWire,
  type Round,
} from '@/server/contracts/board';

import { CardDiagram } from './diagram-slots';
import { bestRule, figures, figureValue, isBest, warningsOf, type FigureKey } from './figures';

const statusTone: Record<CandidateStatus, 'neutral' | 'good' | 'cold'> = {
  proposed: 'cold',
  shortlisted: 'good',
  'set-aside': 'neutral',
  chosen: 'good',
};

export function candidateHref(reviewId: string, candidateId: string) {
  return `/reviews/${encodeURIComponent(reviewId)}/candidates/${encodeURIComponent(candidateId)}`;
}

/** The vote line of a card for the current round. */
export function tallyText(round: Round | null, candidateId: string): string {
  if (!round) return 'No preference round yet';
  if (!round.tally) return `Round ${round.number}: blind until closed`;
  const n = round.tally[candidateId] ?? 0;
  return `Round ${round.number}: ${count(n, 'vote', 'votes')}${round.status === 'open' ? ' so far' : ''}`;
}

/**
 * One candidate on the board: its colour on the edge, name, preset and status, the key
 * figures with units (the best of each across the board marked), warnings or the engine's
 * error, a small T-s diagram, the round's votes, the comments, and Gather the room.
 */
export function CandidateCard({
  reviewId,
  candidate,
  colour,
  best,
  round,
  commentCount,
  selected,
  gatheredHere,
  canGather,
  onGather,
  onDiscuss,
}: {
  reviewId: string;
  candidate: CandidateWire;
  colour: string;
  best: Partial<Record<FigureKey, number>>;
  round: Round | null;
  commentCount: number;
  selected: boolean;
  /** The room is gathered at this candidate. */
  gatheredHere: boolean;
  canGather: boolean;
  onGather: () => void;
  onDiscuss: () => void;
}) {
  const t = useTheme();
  const { system } = useUnitSystem();
  const warnings = warningsOf(candidate);
  const id = candidate.id;
  return (
    <View
      style={[
        styles.card,
        {
          borderColor: selected || gatheredHere ? t.text : t.hairline,
          borderLeftColor: colour,
          backgroundColor: t.surfaceRaised,
        },
      ]}
      testID={`candidate-card-${id}`}
      accessibilityLabel={`Candidate ${candidate.name}`}
    >
      <PressableLink
        href={candidateHref(reviewId, id)}
        accessibilityLabel={`Open ${candidate.name}`}
        testID={`candidate-open-${id}`}
        style={({ focused, hovered }: PressState) => [
          styles.open,
          hovered && { backgroundColor: t.surfaceSunk },
          focused && focusRing(t, true),
        ]}
      >
        <View style={styles.head}>
          <View style={[styles.swatch, { backgroundColor: colour }]} />
          <View style={styles.title}>
            <Heading level={3} numberOfLines={2} testID="candidate-name">
              {candidate.name}
            </Heading>
            <Text size="small" tone="soft" numberOfLines={1}>
              {candidate.preset ? presetLabels[candidate.preset] : 'Own configuration'} · revision {candidate.revision}
            </Text>
          </View>
          <Badge label={statusLabels[candidate.status]} tone={statusTone[candidate.status]} testID={`status-${id}`} />
        </View>

        {candidate.results === null ? (
          <View style={[styles.note, { borderLeftColor: t.danger }]} role="alert" testID={`candidate-error-${id}`}>
            <Text size="small" weight="semibold" tone="danger">
              No results: the engine refused this combination
            </Text>
            <Text size="small" tone="danger">
              {candidate.error ? `${candidate.error.message} (${candidate.error.field})` : 'Open it to mend the input.'}
            </Text>
          </View>
        ) : (
          <View style={styles.figures}>
            {figures.map((f) => {
              const value = figureValue(candidate, f.key);
              const shown = value === null ? { value: '—', unit: '' } : f.show(value, system);
              const top = isBest(value, best[f.key]);
              return (
                <View
                  key={f.key}
                  style={styles.figure}
                  accessible
                  accessibilityLabel={`${f.label}: ${value === null ? 'not available' : `${shown.value} ${shown.unit}`}${top ? `, ${bestRule(f)}` : ''}`}
                  testID={`figure-${f.key}-${id}`}
                >
                  <Text size="caption" tone="muted" numberOfLines={2}>
                    {f.label}
                  </Text>
                  <View style={styles.valueRow}>
                    <Quantity value={shown.value} unit={shown.unit} size="small" testID={`value-${f.key}-${id}`} />
                    {top ? (
                      <View style={[styles.best, { borderColor: t.good }]} testID={`best-${f.key}-${id}`}>
                        <Text size="caption" weight="semibold" tone="good">
                          {f.best === 'highest' ? '▲ best' : '▼ best'}
                        </Text>
                      </View>
                    ) : null}
                  </View>
                </View>
              );
            })}
          </View>
        )}

        {warnings.length > 0 ? (
          <View style={[styles.note, { borderLeftColor: t.warning }]} testID={`candidate-warnings-${id}`}>
            {warnings.map((w, i) => (
              <Text key={i} size="small" tone="warning">
                {w.message}
              </Text>
            ))}
          </View>
        ) : null}

        {candidate.results ? <CardDiagram candidate={candidate} colour={colour} /> : null}
      </PressableLink>
      {candidate.results ? (
        <View style={styles.yearLine}>
          <SiteYearLine reviewId={reviewId} candidateId={id} />
        </View>
      ) : null}

      <View style={[styles.foot, { borderTopColor: t.hairline }]}>
        <Text size="small" tone="soft" style={styles.tally} testID={`tally-${id}`}>
          {tallyText(round, id)}
        </Text>
        <Button
          label={count(commentCount, 'comment', 'comments')}
          accessibilityLabel={`Comments on ${candidate.name}: ${commentCount}`}
          variant={selected ? 'secondary' : 'quiet'}
          small
          onPress={onDiscuss}
          testID={`candidate-comments-${id}`}
        />
        {canGather ? (
          <Button
            label={gatheredHere ? 'Room gathered here' : 'Gather the room'}
            accessibilityLabel={`Gather the room at ${candidate.name}`}
            variant="secondary"
            small
            disabled={gatheredHere}
            onPress={onGather}
            testID={`gather-${id}`}
          />
        ) : null}
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  card: { borderWidth: 1, borderLeftWidth: 6, borderRadius: radius.card, overflow: 'hidden' },
  open: { padding: space[2], gap: space[1] + space.half },
  head: { flexDirection: 'row', alignItems: 'flex-start', gap: space[1] },
  swatch: { width: 12, height: 12, borderRadius: 6, marginTop: 6 },
  title: { flex: 1, minWidth: 0 },
  figures: { flexDirection: 'row', flexWrap: 'wrap', rowGap: space[1] },
  figure: { width: '50%', paddingRight: space[1] },
  valueRow: { flexDirection: 'row', alignItems: 'center', gap: space.half, flexWrap: 'wrap' },
  best: { borderWidth: 1, borderRadius: radius.pill, paddingHorizontal: space.half },
  note: { borderLeftWidth: 3, paddingLeft: space[1], gap: 2 },
  foot: {
    flexDirection: 'row',
    alignItems: 'center',
    flexWrap: 'wrap',
    gap: space.half,
    borderTopWidth: 1,
    paddingHorizontal: space[1],
    paddingVertical: space.half,
  },
  tally: { flex: 1, minWidth: 140, paddingLeft: space.half },
  yearLine: { paddingHorizontal: space[2], paddingBottom: space[1] },
});
