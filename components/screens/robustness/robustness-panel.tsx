import { useMemo, useState } from 'react';
import { StyleSheet, View } from 'react-native';

import {
  useCancelRunMutation,
  useRobustnessLiveUpdates,
  useRobustnessQuery,
  useStartRunMutation,
} from '@/components/data/robustness';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { Choice, Field } from '@/components/ui/field';
import * as format from '@/components/ui/format';
import { useMessage } from '@/components/ui/message';
import { ErrorState, LoadingState } from '@/components/ui/states';
import { Heading, Text } from '@/components/ui/text';
import { useTheme } from '@/components/ui/theme';
import { space } from '@/components/ui/tokens';
import { useUnitSystem } from '@/components/ui/unit-system';
import {
  defaultSamples,
  defaultUncertainty,
  startRunInput,
  type Band,
  type Robustness,
  type Uncertainty,
} from '@/server/contracts/robustness';
import { roleAllows } from '@/server/contracts/roles';

type Named = { id: string; name: string; colour: string };

/** The uncertainty fields of the run form: label, unit and the key. */
const ranges: Array<{ key: keyof Uncertainty; label: string; unit: string }> = [
  { key: 'compressorEfficiency', label: 'Compressor isentropic efficiency ±', unit: '(absolute, e.g. 0.01)' },
  { key: 'turbineEfficiency', label: 'Turbine isentropic efficiency ±', unit: '(absolute)' },
  { key: 'regeneratorEffectiveness', label: 'Regenerator effectiveness ±', unit: '(absolute)' },
  { key: 'pressureLossFraction', label: 'Pressure losses ±', unit: '(fraction of each, 0.2 = 20 %)' },
  { key: 'turbineInletK', label: 'Turbine inlet temperature ±', unit: 'K' },
  { key: 'ambientK', label: 'Ambient ± without a profile', unit: 'K' },
  { key: 'weightFactor', label: 'Criterion weights ×(1 ±)', unit: '(0.2 = ×0.8–1.2)' },
];

/** The uncertainty as the form holds it: each number as the text of its field, the two choices as they are. */
type UncertaintyText = Record<keyof Uncertainty, string | boolean>;
const asText = (u: Uncertainty): UncertaintyText =>
  Object.fromEntries(Object.entries(u).map(([k, v]) => [k, typeof v === 'boolean' ? v : String(v)])) as UncertaintyText;

const pct = (p: number) => `${(p * 100).toFixed(p > 0 && p < 0.01 ? 1 : 0)} %`;

/**
 * How sure the ranking is: start a seeded Monte Carlo run (Lead, Engineer, Owner), watch it
 * progress, cancel it (Lead, Owner), read which candidate ranks first how often, the spread of
 * ranks and the 5–95 % bands of efficiency, specific work and annual fuel.
 */
export function RobustnessPanel({
  reviewId,
  candidates,
  myRole,
}: {
  reviewId: string;
  candidates: Named[];
  myRole: string;
}) {
  useRobustnessLiveUpdates(reviewId);
  const run = useRobustnessQuery(reviewId);
  if (run.error) return <ErrorState error={run.error} onRetry={() => void run.refetch()} />;
  if (!run.data) return <LoadingState label="Loading the robustness check…" />;
  return <Body reviewId={reviewId} run={run.data} candidates={candidates} myRole={myRole} />;
}

function Body({
  reviewId,
  run,
  candidates,
  myRole,
}: {
  reviewId: string;
  run: Robustness;
  candidates: Named[];
  myRole: string;
}) {
  const t = useTheme();
  const canRun = roleAllows(myRole, { robustness: ['run'] });
  const canCancel = roleAllows(myRole, { robustness: ['cancel'] });
  const cancel = useCancelRunMutation(reviewId);
  const message = useMessage();
  const going = run.status === 'running' || run.status === 'cancelling';
  return (
    <Card style={styles.gap} testID="robustness-panel">
      <Heading level={2}>How sure is the ranking</Heading>
      <Text size="small" tone="soft">
        {run.method}
      </Text>
      {going ? (
        <View style={styles.gap} testID="robustness-running">
          <Text size="small" weight="semibold" aria-live="polite" testID="robustness-progress-text">
            {run.status === 'cancelling' ? 'Cancelling… ' : 'Running: '}
            {run.done.toLocaleString('en')} of {(run.samples ?? 0).toLocaleString('en')} draws
          </Text>
          <View
            style={[styles.track, { backgroundColor: t.surfaceSunk }]}
            role="progressbar"
            aria-valuemin={0}
            aria-valuemax={run.samples ?? 0}
            aria-valuenow={run.done}
            testID="robustness-progress"
          >
            <View
              style={[
                styles.fill,
                { backgroundColor: t.cold, width: `${(100 * run.done) / Math.max(1, run.samples ?? 1)}%` },
              ]}
            />
          </View>
          {canCancel && run.runId ? (
            <Button
              label="Cancel the run"
              variant="secondary"
              small
              busy={cancel.isPending}
              onPress={() => cancel.mutate(run.runId!, { onError: message.showError })}
              testID="robustness-cancel"
            />
          ) : null}
        </View>
      ) : null}
      {run.status === 'cancelled' ? (
        <Text size="small" tone="muted" testID="robustness-cancelled">
          The last run was cancelled after {run.done.toLocaleString('en')} draws.
        </Text>
      ) : null}
      {run.status === 'failed' ? (
        <Text size="small" tone="danger" role="alert">
          {run.message ?? 'The last run failed.'}
        </Text>
      ) : null}
      {run.firstPlace ? <Result run={run} candidates={candidates} /> : null}
      {canRun && !going ? <StartForm reviewId={reviewId} last={run} /> : null}
      {!canRun && run.status === 'none' ? (
        <Text size="small" tone="muted">
          No run yet. The Lead or an Engineer starts one.
        </Text>
      ) : null}
    </Card>
  );
}

function Result({ run, candidates }: { run: Robustness; candidates: Named[] }) {
  const t = useTheme();
  const { system } = useUnitSystem();
  const order = useMemo(
    () =>
      [...candidates]
        .filter((c) => run.firstPlace![c.id] !== undefined)
        .sort((a, b) => run.firstPlace![b.id]! - run.firstPlace![a.id]!),
    [candidates, run.firstPlace],
  );
  const n = order.length;
  const band = (b: Band | null, show: (v: number) => format.Formatted) => {
    if (!b) return '—';
    const lo = show(b.p5);
    const hi = show(b.p95);
    return `${lo.value}–${hi.value} ${hi.unit}`;
  };
  return (
    <View style={styles.gap} testID="robustness-result">
      {run.stale ? (
        <Text size="small" tone="warning" role="status" testID="robustness-stale">
          Out of date: a candidate, the design basis, a score or the site year changed since this run. Run it again.
        </Text>
      ) : null}
      <Text size="caption" tone="muted">
        {run.samples?.toLocaleString('en')} draws, seed {run.seed}
        {run.startedBy ? ` · started by ${run.startedBy.name}` : ''}
        {run.finishedAt ? ` · ${format.formatAgo(run.finishedAt)}` : ''}
      </Text>
      {order.map((c) => {
        const p = run.firstPlace![c.id]!;
        const ranks = run.ranks?.[c.id] ?? [];
        const b = run.bands?.[c.id];
        return (
          <View key={c.id} style={[styles.row, { borderColor: t.hairline }]} testID={`robustness-${c.id}`}>
            <View style={styles.nameRow}>
              <View style={[styles.dot, { backgroundColor: c.colour }]} />
              <Text weight="semibold" style={styles.grow}>
                {c.name}
              </Text>
            </View>
            <Text size="small" testID={`robustness-first-${c.id}`}>
              ranks first in <Text weight="semibold">{pct(p)}</Text> of {run.samples?.toLocaleString('en')} draws
            </Text>
            <View
              style={styles.ranks}
              accessibilityLabel={`Ranks: ${ranks.map((q, i) => `${i + 1}: ${pct(q)}`).join(', ')}`}
            >
              {ranks.map((q, i) => (
                <View
                  key={i}
                  style={[
                    styles.rankPart,
                    { flexGrow: q, backgroundColor: c.colour, opacity: 1 - (0.75 * i) / Math.max(1, n - 1) },
                  ]}
                />
              ))}
            </View>
            <Text size="caption" tone="muted">
              Rank 1 → {n}: {ranks.map((q) => pct(q)).join(' · ')}
            </Text>
            {b ? (
              <View style={styles.bands}>
                <Text size="small" tone="soft">
                  5–95 %: efficiency{' '}
                  <Text size="small" mono>
                    {band(b.thermalEfficiency, (v) => format.percent(v))}
                  </Text>
                  {' · '}net work{' '}
                  <Text size="small" mono>
                    {band(b.netWorkKJPerKg, (v) => format.specificWork(v, system))}
                  </Text>
                  {' · '}fuel a year{' '}
                  <Text size="small" mono>
                    {band(b.annualFuelTonnes, (v) => format.tonnes(v, system))}
                  </Text>
                </Text>
              </View>
            ) : null}
            {run.refused?.[c.id] ? (
              <Text size="caption" tone="warning">
                The engine refused {run.refused[c.id]} drawn combinations of this candidate (ranked last there).
              </Text>
            ) : null}
          </View>
        );
      })}
    </View>
  );
}

function StartForm({ reviewId, last }: { reviewId: string; last: Robustness }) {
  const start = useStartRunMutation(reviewId);
  const message = useMessage();
  const [samples, setSamples] = useState(String(last.samples ?? defaultSamples));
  const [seed, setSeed] = useState(String(last.seed ?? 1));
  const [open, setOpen] = useState(false);
  const [u, setU] = useState(() => asText(last.uncertainty ?? defaultUncertainty));
  const body = {
    samples: Number(samples),
    seed: Number(seed),
    uncertainty: Object.fromEntries(Object.entries(u).map(([k, v]) => [k, typeof v === 'boolean' ? v : Number(v)])),
  };
  const check = startRunInput.safeParse(body);
  const errorAt = (field: string) =>
    check.success ? null : (check.error.issues.find((i) => i.path.join('.') === field)?.message ?? null);
  return (
    <View style={styles.gap} testID="robustness-form">
      <View style={styles.pair}>
        <View style={styles.grow}>
          <Field
            label="Draws"
            value={samples}
            onChangeText={setSamples}
            inputMode="numeric"
            error={samples.trim() === '' ? 'Draws: enter a number.' : errorAt('samples')}
            hint="1–20 000; 2000 is common practice"
            testID="robustness-samples"
          />
        </View>
        <View style={styles.grow}>
          <Field
            label="Seed"
            value={seed}
            onChangeText={setSeed}
            inputMode="numeric"
            error={seed.trim() === '' ? 'Seed: enter a number.' : errorAt('seed')}
            hint="the same seed repeats a run exactly"
            testID="robustness-seed"
          />
        </View>
      </View>
      <Button
        label={open ? 'Hide the uncertainty' : 'Uncertainty (common-practice defaults)'}
        variant="quiet"
        small
        onPress={() => setOpen((o) => !o)}
        testID="robustness-uncertainty-toggle"
      />
      {open ? (
        <View style={styles.gap} testID="robustness-uncertainty">
          {ranges.map((r) => (
            <Field
              key={r.key}
              label={`${r.label} ${r.unit}`}
              value={String(u[r.key])}
              onChangeText={(v) => setU((old) => ({ ...old, [r.key]: v }))}
              inputMode="decimal"
              error={errorAt(`uncertainty.${r.key}`)}
              testID={`robustness-u-${r.key}`}
            />
          ))}
          <Choice
            label="Ambient"
            value={u.ambientFromProfile ? 'profile' : 'range'}
            onChange={(v) => setU((old) => ({ ...old, ambientFromProfile: v === 'profile' }))}
            options={[
              { value: 'profile', label: 'An hour of the site year' },
              { value: 'range', label: '± around the basis ambient' },
            ]}
            testID="robustness-u-ambient"
          />
          <Choice
            label="Scores"
            value={u.scoreSpread ? 'spread' : 'mean'}
            onChange={(v) => setU((old) => ({ ...old, scoreSpread: v === 'spread' }))}
            options={[
              { value: 'spread', label: 'Drawn from the team’s marks' },
              { value: 'mean', label: 'The mean in every draw' },
            ]}
            testID="robustness-u-scores"
          />
          <Button
            label="Back to the defaults"
            variant="quiet"
            small
            onPress={() => setU(asText(defaultUncertainty))}
            testID="robustness-u-defaults"
          />
        </View>
      ) : null}
      <Button
        label="Run the robustness check"
        busy={start.isPending}
        disabled={!check.success}
        onPress={() => check.success && start.mutate(check.data, { onError: message.showError })}
        testID="robustness-start"
      />
    </View>
  );
}

const styles = StyleSheet.create({
  gap: { gap: space[1] },
  grow: { flex: 1, minWidth: 140 },
  pair: { flexDirection: 'row', gap: space[2], flexWrap: 'wrap' },
  track: { height: 10, borderRadius: 5, overflow: 'hidden' },
  fill: { height: 10 },
  row: { borderTopWidth: 1, paddingTop: space[1], gap: space.half },
  nameRow: { flexDirection: 'row', alignItems: 'center', gap: space[1] },
  dot: { width: 10, height: 10, borderRadius: 5 },
  ranks: { flexDirection: 'row', height: 8, borderRadius: 4, overflow: 'hidden' },
  rankPart: { flexBasis: 0, height: 8 },
  bands: { flexDirection: 'row', flexWrap: 'wrap' },
});
