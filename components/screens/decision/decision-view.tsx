import type { ReactNode } from 'react';
import { ScrollView, StyleSheet, View } from 'react-native';

import { Badge } from '@/components/ui/badge';
import { Card } from '@/components/ui/card';
import { formatDateTime, formatNumber } from '@/components/ui/format';
import { Heading, Text } from '@/components/ui/text';
import { useTheme } from '@/components/ui/theme';
import { space } from '@/components/ui/tokens';
import type { CandidateWire } from '@/server/contracts/board';
import type { DecisionRevision, DecisionSnapshot } from '@/server/contracts/decision';

function Section({ title, children, testID }: { title: string; children: ReactNode; testID?: string }) {
  return (
    <View style={styles.section} testID={testID}>
      <Text weight="semibold">{title}</Text>
      {children}
    </View>
  );
}

const none = (
  <Text tone="muted" size="small">
    None recorded.
  </Text>
);

/** A revision as it reads once signed (or a draft for those who may not edit it). */
export function DecisionView({ revision, candidates }: { revision: DecisionRevision; candidates: CandidateWire[] }) {
  const t = useTheme();
  const pool = revision.snapshot?.candidates ?? candidates;
  const nameOf = (id: string | null) => pool.find((c) => c.id === id)?.name ?? 'a candidate no longer in the Review';
  const signed = revision.status === 'signed';
  return (
    <Card style={styles.card} testID={`decision-view-${revision.number}`}>
      <View style={styles.head}>
        <Heading level={2}>Revision {revision.number}</Heading>
        <Badge
          label={signed ? 'Signed · read-only' : 'Draft'}
          tone={signed ? 'good' : 'warning'}
          testID="decision-status"
        />
      </View>
      {signed && revision.signedBy && revision.signedAt ? (
        <View style={[styles.signature, { borderColor: t.hairline }]} testID="decision-signature">
          <Text>
            Signed by <Text weight="semibold">{revision.signedBy.name}</Text>
          </Text>
          <Text size="small" tone="soft">
            {formatDateTime(revision.signedAt)}
          </Text>
        </View>
      ) : null}
      <Section title="Chosen candidate">
        <Text weight="semibold" tone={revision.chosenCandidateId ? 'good' : 'muted'} testID="decision-chosen-name">
          {revision.chosenCandidateId ? nameOf(revision.chosenCandidateId) : 'None chosen yet.'}
        </Text>
      </Section>
      <Section title="Rationale">
        <Text testID="decision-rationale-text">{revision.rationale || '—'}</Text>
      </Section>
      <Section title="Assumptions">
        <Text>{revision.assumptions || '—'}</Text>
      </Section>
      <Section title="Rejected alternatives">
        {revision.rejected.length === 0
          ? none
          : revision.rejected.map((r) => (
              <Text key={r.candidateId}>
                <Text weight="medium">{nameOf(r.candidateId)}</Text> — {r.reason}
              </Text>
            ))}
      </Section>
      <Section title="Recorded dissent">
        {revision.dissent.length === 0
          ? none
          : revision.dissent.map((d, i) => (
              <Text key={i}>
                <Text weight="medium">{d.name}</Text>: {d.text}
              </Text>
            ))}
      </Section>
      <Section title="Open actions">
        {revision.actions.length === 0
          ? none
          : revision.actions.map((a, i) => (
              <Text key={i}>
                {a.text} — <Text weight="medium">{a.owner}</Text>, due <Text mono>{a.due}</Text>
              </Text>
            ))}
      </Section>
      {revision.snapshot ? (
        <SnapshotFigures snapshot={revision.snapshot} chosenId={revision.chosenCandidateId} />
      ) : null}
    </Card>
  );
}

/** The figures the signature rests on: engine figures with units, weighted totals and ranks, as signed. */
function SnapshotFigures({ snapshot, chosenId }: { snapshot: DecisionSnapshot; chosenId: string | null }) {
  const t = useTheme();
  const { matrix } = snapshot;
  const keys = ['thermalEfficiency', 'netWorkKJPerKg', 'heatRateKJPerKWh', 'co2KgPerMWh'] as const;
  const figures = matrix.figures.filter((f) => (keys as readonly string[]).includes(f.key));
  return (
    <Section title="As signed" testID="decision-snapshot">
      <Text size="small" tone="muted">
        The board as it stood at {formatDateTime(snapshot.takenAt)} (design basis revision{' '}
        {snapshot.designBasis.revision}
        ); later edits do not change these figures.
      </Text>
      <ScrollView horizontal contentContainerStyle={styles.tableScroll}>
        <View>
          <View style={[styles.tr, { borderBottomColor: t.hairline }]}>
            <Text size="small" weight="semibold" style={styles.th}>
              Candidate
            </Text>
            {figures.map((f) => (
              <Text key={f.key} size="small" weight="semibold" style={styles.td}>
                {f.label}, {f.unit}
              </Text>
            ))}
            <Text size="small" weight="semibold" style={styles.td}>
              Weighted total (1–5)
            </Text>
            <Text size="small" weight="semibold" style={styles.tdNarrow}>
              Rank
            </Text>
          </View>
          {matrix.candidates.map((c) => {
            const total = matrix.totals[c.id];
            const rank = matrix.ranks[c.id];
            return (
              <View key={c.id} style={[styles.tr, { borderBottomColor: t.hairline }]} testID={`snapshot-row-${c.id}`}>
                <View style={[styles.th, styles.nameCell]}>
                  <View style={[styles.swatch, { backgroundColor: c.colour }]} />
                  <Text size="small" weight={c.id === chosenId ? 'semibold' : 'regular'}>
                    {c.name}
                    {c.id === chosenId ? ' (chosen)' : ''}
                  </Text>
                </View>
                {figures.map((f) => {
                  const v = f.values[c.id];
                  return (
                    <Text key={f.key} size="small" mono style={styles.td}>
                      {typeof v === 'number' ? formatNumber(v) : '—'}
                    </Text>
                  );
                })}
                <Text size="small" mono style={styles.td}>
                  {total && total.total !== null
                    ? `${formatNumber(total.total, 3)}${total.incomplete ? ' (incomplete)' : ''}`
                    : 'no total'}
                </Text>
                <Text size="small" mono style={styles.tdNarrow}>
                  {typeof rank === 'number' ? rank : '—'}
                </Text>
              </View>
            );
          })}
        </View>
      </ScrollView>
      <Text size="small" tone="muted">
        {snapshot.scores.length} scores from {matrix.scorers} {matrix.scorers === 1 ? 'person' : 'people'};{' '}
        {snapshot.rounds.filter((r) => r.status === 'closed').length} closed preference rounds.
      </Text>
      <HowSure snapshot={snapshot} />
    </Section>
  );
}

/** How sure the signed ranking was: the robustness run it rested on, if one had finished. */
function HowSure({ snapshot }: { snapshot: DecisionSnapshot }) {
  const run = snapshot.robustness;
  if (!run?.firstPlace)
    return (
      <Text size="small" tone="muted" testID="decision-how-sure">
        No robustness check had finished when this was signed.
      </Text>
    );
  const names = new Map(snapshot.candidates.map((c) => [c.id, c.name]));
  const order = Object.entries(run.firstPlace).sort((a, b) => b[1] - a[1]);
  return (
    <View style={styles.section} testID="decision-how-sure">
      <Text weight="semibold">How sure, as signed</Text>
      {order.map(([id, p]) => (
        <Text key={id} size="small">
          {names.get(id) ?? 'A removed candidate'} ranks first in{' '}
          <Text size="small" weight="semibold">
            {Math.round(p * 100)} %
          </Text>{' '}
          of {run.samples?.toLocaleString('en')} draws
        </Text>
      ))}
      <Text size="caption" tone="muted">
        Seed {run.seed}
        {run.stale ? '; the board had changed since the run' : ''}.
      </Text>
    </View>
  );
}

const styles = StyleSheet.create({
  card: { gap: space[2] },
  head: { flexDirection: 'row', alignItems: 'center', gap: space[1], flexWrap: 'wrap' },
  signature: { borderWidth: 1, borderRadius: 8, padding: space[1] + space.half, gap: 2 },
  section: { gap: space.half },
  tableScroll: { paddingBottom: space.half },
  tr: { flexDirection: 'row', borderBottomWidth: 1, paddingVertical: space.half, alignItems: 'center' },
  th: { width: 170, paddingRight: space[1] },
  nameCell: { flexDirection: 'row', alignItems: 'center', gap: space.half },
  swatch: { width: 10, height: 10, borderRadius: 5 },
  td: { width: 120, textAlign: 'right', paddingHorizontal: space.half },
  tdNarrow: { width: 56, textAlign: 'right', paddingHorizontal: space.half },
});
