import { useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { useSweepQuery, type CycleResultWire } from '@/components/data/board';
import { SweepChart, type SweepParameter } from '@/components/diagrams';
import { Badge } from '@/components/ui/badge';
import { Card } from '@/components/ui/card';
import { Choice, Field } from '@/components/ui/field';
import * as f from '@/components/ui/format';
import { ErrorState, LoadingState } from '@/components/ui/states';
import { Heading, Quantity, Text } from '@/components/ui/text';
import { useTheme } from '@/components/ui/theme';
import { space } from '@/components/ui/tokens';

import { inputText, readInput, unitOf } from './quantities';

type Figure = { key: string; label: string; show: (r: CycleResultWire, s: f.UnitSystem) => f.Formatted | null };

const figures: Figure[] = [
  { key: 'thermalEfficiency', label: 'Thermal efficiency', show: (r) => f.percent(r.thermalEfficiency) },
  { key: 'netWork', label: 'Net specific work', show: (r, s) => f.specificWork(r.netWorkKJPerKg, s) },
  {
    key: 'heatRate',
    label: 'Heat rate',
    show: (r, s) => (r.heatRateKJPerKWh === null ? null : f.heatRate(r.heatRateKJPerKWh, s)),
  },
  {
    key: 'airFlow',
    label: 'Air flow for the required power',
    show: (r, s) => (r.airMassFlowKgPerS === null ? null : f.massFlow(r.airMassFlowKgPerS, s)),
  },
  {
    key: 'fuelFlow',
    label: 'Fuel flow',
    show: (r, s) => (r.fuelMassFlowKgPerS === null ? null : f.massFlow(r.fuelMassFlowKgPerS, s)),
  },
  { key: 'exhaust', label: 'Exhaust temperature', show: (r, s) => f.temperature(r.exhaustTemperatureK, s) },
  {
    key: 'co2',
    label: 'CO2 per MWh',
    show: (r) => (r.co2KgPerMWh === null ? null : { value: f.formatNumber(r.co2KgPerMWh), unit: 'kg/MWh' }),
  },
  { key: 'backWork', label: 'Back-work ratio', show: (r) => f.percent(r.backWorkRatio) },
];

/** Key figures of the saved results, with the preview of the unsaved values beside them. */
export function FigureTable({
  saved,
  preview,
  previewPending,
  system,
}: {
  saved: CycleResultWire | null;
  preview: CycleResultWire | null;
  previewPending: boolean;
  system: f.UnitSystem;
}) {
  const t = useTheme();
  const cell = (r: CycleResultWire | null, fig: Figure, which: string) => {
    const v = r ? fig.show(r, system) : null;
    return (
      <View style={styles.cell}>
        {v ? (
          <Quantity value={v.value} unit={v.unit} size="small" testID={`figure-${fig.key}-${which}`} />
        ) : (
          <Text size="small" tone="muted" testID={`figure-${fig.key}-${which}`}>
            —
          </Text>
        )}
      </View>
    );
  };
  const showPreview = preview !== null || previewPending;
  return (
    <Card style={styles.gap} testID="figure-table">
      <View style={styles.row}>
        <Heading level={2}>Results</Heading>
        {showPreview ? (
          <Badge
            label={previewPending ? 'Preview: computing…' : 'Preview — not saved'}
            tone="warning"
            testID="preview-badge"
          />
        ) : null}
      </View>
      <View style={[styles.tr, { borderBottomColor: t.hairline }]}>
        <Text size="caption" tone="muted" style={styles.label}>
          Figure
        </Text>
        <Text size="caption" tone="muted" style={styles.cell}>
          Saved
        </Text>
        {showPreview ? (
          <Text size="caption" tone="warning" style={styles.cell}>
            Preview (not saved)
          </Text>
        ) : null}
      </View>
      {figures.map((fig) => (
        <View key={fig.key} style={[styles.tr, { borderBottomColor: t.hairline }]}>
          <Text size="small" style={styles.label}>
            {fig.label}
          </Text>
          {cell(saved, fig, 'saved')}
          {showPreview ? cell(preview, fig, 'preview') : null}
        </View>
      ))}
    </Card>
  );
}

/** The state points in flow order: n, label, T, p, h, s with units. */
export function StateTable({ result, system }: { result: CycleResultWire; system: f.UnitSystem }) {
  const t = useTheme();
  const first = result.states[0];
  const unit = (x: f.Formatted | undefined) => x?.unit ?? '';
  const heads = [
    'n',
    'State',
    `T (${unit(first && f.temperature(first.temperatureK, system))})`,
    `p (${unit(first && f.pressure(first.pressureKPa, system))})`,
    `h (${unit(first && f.specificWork(first.enthalpyKJPerKg, system))})`,
    `s (${unit(first && f.entropy(first.entropyKJPerKgK, system))})`,
  ];
  return (
    <Card style={styles.gap} testID="state-table">
      <Heading level={2}>State points</Heading>
      <View style={[styles.tr, { borderBottomColor: t.hairline }]}>
        {heads.map((h, i) => (
          <Text key={h} size="caption" tone="muted" style={i === 1 ? styles.stateLabel : styles.num}>
            {h}
          </Text>
        ))}
      </View>
      {result.states.map((s) => (
        <View key={s.n} style={[styles.tr, { borderBottomColor: t.hairline }]} testID={`state-${s.n}`}>
          <Text size="small" mono style={styles.num}>
            {s.n}
          </Text>
          <Text size="small" style={styles.stateLabel}>
            {s.label}
          </Text>
          <Text size="small" mono style={styles.num} testID={`state-${s.n}-T`}>
            {f.temperature(s.temperatureK, system).value}
          </Text>
          <Text size="small" mono style={styles.num}>
            {f.pressure(s.pressureKPa, system).value}
          </Text>
          <Text size="small" mono style={styles.num}>
            {f.specificWork(s.enthalpyKJPerKg, system).value}
          </Text>
          <Text size="small" mono style={styles.num}>
            {f.entropy(s.entropyKJPerKgK, system).value}
          </Text>
        </View>
      ))}
    </Card>
  );
}

export function Warnings({ result }: { result: CycleResultWire }) {
  const t = useTheme();
  if (result.warnings.length === 0) return null;
  return (
    <View style={[styles.warnings, { borderColor: t.warning }]} testID="candidate-warnings">
      <Text weight="semibold" tone="warning">
        Warnings
      </Text>
      {result.warnings.map((w, i) => (
        <Text key={`${w.code}-${i}`} size="small">
          {w.message}
        </Text>
      ))}
    </View>
  );
}

const sweepKinds = {
  'compressor.pressureRatio': { label: 'Pressure ratio', kind: 'ratio' },
  'turbine.inletTemperatureK': { label: 'Turbine inlet temperature', kind: 'temperature' },
} as const;
type SweepKey = keyof typeof sweepKinds;

function defaultRange(parameter: SweepKey, input: Record<string, unknown>): [number, number] {
  if (parameter === 'compressor.pressureRatio') {
    const pr = Number((input.compressor as Record<string, unknown> | undefined)?.pressureRatio ?? 10);
    return [2, Math.max(30, Math.round(pr * 2))];
  }
  const tit = Number((input.turbine as Record<string, unknown> | undefined)?.inletTemperatureK ?? 1400);
  return [Math.max(800, Math.round(tit - 400)), Math.min(2000, Math.round(tit + 300))];
}

/** Efficiency and net work over a range of one input, from the saved candidate; optima and the current point marked. */
export function SweepPanel({
  input,
  colour,
  system,
}: {
  input: Record<string, unknown>;
  colour: string;
  system: f.UnitSystem;
}) {
  const [parameter, setParameter] = useState<SweepKey>('compressor.pressureRatio');
  const kind = sweepKinds[parameter].kind;
  const [range, setRange] = useState(() => {
    const [a, b] = defaultRange('compressor.pressureRatio', input);
    return { from: inputText('ratio', a, system), to: inputText('ratio', b, system) };
  });
  const choose = (p: SweepKey) => {
    const [a, b] = defaultRange(p, input);
    setParameter(p);
    setRange({ from: inputText(sweepKinds[p].kind, a, system), to: inputText(sweepKinds[p].kind, b, system) });
  };
  const from = readInput(kind, range.from, system);
  const to = readInput(kind, range.to, system);
  const ok = typeof from === 'number' && typeof to === 'number' && to > from;
  const sweep = useSweepQuery(ok ? { base: input, parameter, from, to, points: 25 } : null);
  const [section, key] = parameter.split('.') as [string, string];
  const current = Number((input[section] as Record<string, unknown> | undefined)?.[key]);
  const unit = unitOf(kind, system);
  const withUnit = (label: string) => (unit === '–' ? label : `${label} (${unit})`);
  return (
    <Card style={styles.gap} testID="sweep-panel">
      <Heading level={2}>Sweep</Heading>
      <Choice
        label="Vary"
        options={[
          { value: 'compressor.pressureRatio', label: 'Pressure ratio' },
          { value: 'turbine.inletTemperatureK', label: 'Turbine inlet temperature' },
        ]}
        value={parameter}
        onChange={choose}
        testID="sweep-parameter"
      />
      <View style={styles.rangeRow}>
        <View style={styles.rangeField}>
          <Field
            label={withUnit('From')}
            value={range.from}
            onChangeText={(v) => setRange((r) => ({ ...r, from: v }))}
            inputMode="decimal"
            testID="sweep-from"
          />
        </View>
        <View style={styles.rangeField}>
          <Field
            label={withUnit('To')}
            value={range.to}
            onChangeText={(v) => setRange((r) => ({ ...r, to: v }))}
            error={!ok ? 'Give two numbers, the end above the start.' : null}
            inputMode="decimal"
            testID="sweep-to"
          />
        </View>
      </View>
      {sweep.error ? (
        <ErrorState error={sweep.error} testID="sweep-error" />
      ) : !sweep.data ? (
        ok ? (
          <LoadingState label="Sweeping…" />
        ) : null
      ) : (
        <SweepChart
          sweep={{ ...sweep.data, parameter: sweep.data.parameter as SweepParameter }}
          current={Number.isFinite(current) ? { value: current } : null}
          currentLabel="This candidate"
          colour={colour}
          unitSystem={system}
          testID="sweep-chart"
        />
      )}
    </Card>
  );
}

const styles = StyleSheet.create({
  gap: { gap: space[1] },
  row: { flexDirection: 'row', alignItems: 'center', gap: space[1], flexWrap: 'wrap' },
  tr: {
    flexDirection: 'row',
    alignItems: 'center',
    borderBottomWidth: 1,
    paddingVertical: space.half,
    gap: space.half,
  },
  label: { flex: 2 },
  cell: { flex: 1.2 },
  num: { flex: 1, textAlign: 'right' },
  stateLabel: { flex: 2.2 },
  warnings: { borderLeftWidth: 3, paddingLeft: space[2], gap: space.half },
  rangeRow: { flexDirection: 'row', gap: space[1], flexWrap: 'wrap' },
  rangeField: { flex: 1, minWidth: 140 },
});
