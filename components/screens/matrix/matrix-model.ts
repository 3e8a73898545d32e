import * as format from '@/components/ui/format';
import type { Formatted, UnitSystem } from '@/components/ui/format';
import type { Matrix, MatrixFigureKey, MatrixYearFigureKey } from '@/server/contracts/matrix';

import { energy, hours } from '../site-year/site-year-format';

/**
 * The comparison matrix as the screen lays it out: one row model per line (figure,
 * criterion, total, rank, round), each cell with its text, unit and the number it sorts by.
 */

export type CellModel = {
  value: string;
  unit: string;
  /** A second, quieter line: spread and count, pre-score, "incomplete". */
  note?: string;
  /** Shown as missing (muted), never as zero. */
  missing?: boolean;
  flag?: 'incomplete' | 'tie';
  sortValue: number | null;
};

export type RowModel = {
  key: string;
  label: string;
  /** Beside the label: the weight, the unit. */
  sub?: string;
  kind: 'figure' | 'year' | 'criterion' | 'total' | 'rank' | 'round';
  /** The first row of a titled group carries the group's title (the table draws a band above it). */
  group?: { title: string; caption: string };
  /** Sorting by this row puts the highest first, unless lower is better (rank, heat rate…). */
  lowerFirst?: boolean;
  cells: Record<string, CellModel>;
};

const n3 = (v: number) => format.formatNumber(v, 3);
const score = (v: number) => v.toFixed(2);

/** A figure in the reader's units (the matrix carries SI, efficiency in per cent). */
export function showFigure(key: MatrixFigureKey, value: number, system: UnitSystem): Formatted {
  switch (key) {
    case 'thermalEfficiency':
      return { value: n3(value), unit: '%' };
    case 'netWorkKJPerKg':
      return format.specificWork(value, system);
    case 'heatRateKJPerKWh':
      return format.heatRate(value, system);
    case 'co2KgPerMWh':
      return { value: n3(value), unit: 'kg/MWh' };
    case 'airMassFlowKgPerS':
    case 'fuelMassFlowKgPerS':
      return format.massFlow(value, system);
    case 'exhaustTemperatureK':
      return format.temperature(value, system);
    case 'backWorkRatio':
      return { value: n3(value), unit: 'of turbine work' };
  }
}

/** A site-year figure in the reader's units (the matrix carries SI: kW, MWh, t, kJ/kWh, h). */
export function showYearFigure(key: MatrixYearFigureKey, value: number, system: UnitSystem): Formatted {
  switch (key) {
    case 'hotDayKW':
    case 'coldDayKW':
      return format.power(value, system);
    case 'energyMWh':
      return energy(value);
    case 'fuelTonnes':
    case 'co2Tonnes':
      return format.tonnes(value, system);
    case 'meanHeatRateKJPerKWh':
      return format.heatRate(value, system);
    case 'shortfallHours':
      return hours(value);
  }
}

/** Sorting by these puts the lowest first: less fuel, CO2 and heat rate, fewer short hours. */
const yearLowerIsBetter: Partial<Record<MatrixYearFigureKey, boolean>> = {
  fuelTonnes: true,
  co2Tonnes: true,
  meanHeatRateKJPerKWh: true,
  shortfallHours: true,
};

const annualKeys = new Set<MatrixYearFigureKey>([
  'energyMWh',
  'fuelTonnes',
  'co2Tonnes',
  'meanHeatRateKJPerKWh',
  'shortfallHours',
]);

/** The caption of the Site year group: what the figures rest on. */
export function yearCaption(year: NonNullable<Matrix['year']>): string {
  const basis = year.profile
    ? `${format.count(year.profile.hours, 'hour', 'hours')} of profile, ${year.firedHoursPerYear} fired h a year`
    : 'no hourly profile: hot and cold days only';
  return `First-order estimate without component maps · ${basis}`;
}

function yearRows(m: Matrix, system: UnitSystem): RowModel[] {
  const year = m.year;
  if (!year) return [];
  const day = (k: number | null) => {
    if (k === null) return [];
    const a = format.siteTemperature(k, system);
    return [`at ${a.value} ${a.unit}`];
  };
  return year.figures.map((f, i) => {
    const unitShown = Object.values(f.values).find((v): v is number => v !== null);
    const unit = unitShown !== undefined ? [showYearFigure(f.key, unitShown, system).unit] : [];
    const at = f.key === 'hotDayKW' ? day(year.hotDayK) : f.key === 'coldDayKW' ? day(year.coldDayK) : [];
    const why = annualKeys.has(f.key) && !year.profile ? 'no site profile' : 'no result';
    return {
      key: `year-${f.key}`,
      label: f.label,
      sub: [...at, ...unit].join(' · ') || undefined,
      kind: 'year' as const,
      lowerFirst: yearLowerIsBetter[f.key],
      group: i === 0 ? { title: 'Site year', caption: yearCaption(year) } : undefined,
      cells: Object.fromEntries(
        m.candidates.map((c) => {
          const v = f.values[c.id] ?? null;
          if (v === null) return [c.id, { value: '—', unit: '', note: why, missing: true, sortValue: null }];
          return [c.id, { ...showYearFigure(f.key, v, system), sortValue: v }];
        }),
      ),
    };
  });
}

const lowerIsBetter: Partial<Record<MatrixFigureKey, boolean>> = {
  heatRateKJPerKWh: true,
  co2KgPerMWh: true,
  fuelMassFlowKgPerS: true,
};

/** Every row of the matrix, in screen order. */
export function rowsOf(m: Matrix, system: UnitSystem): RowModel[] {
  const rows: RowModel[] = [];
  for (const f of m.figures) {
    const unitShown = Object.values(f.values).find((v): v is number => v !== null);
    rows.push({
      key: `figure-${f.key}`,
      label: f.label,
      sub: unitShown !== undefined ? showFigure(f.key, unitShown, system).unit : undefined,
      kind: 'figure',
      lowerFirst: lowerIsBetter[f.key],
      cells: Object.fromEntries(
        m.candidates.map((c) => {
          const v = f.values[c.id] ?? null;
          if (v === null) return [c.id, { value: 'no result', unit: '', missing: true, sortValue: null }];
          const shown = showFigure(f.key, v, system);
          return [c.id, { ...shown, sortValue: v }];
        }),
      ),
    });
  }
  rows.push(...yearRows(m, system));
  m.rows.forEach((row, i) => {
    const criterion = m.criteria[i]!;
    rows.push({
      key: `criterion-${criterion.id}`,
      label: criterion.name,
      sub: `weight ${n3(row.share * 100)} %${criterion.measure ? ' · pre-scored' : ''}`,
      kind: 'criterion',
      cells: Object.fromEntries(
        m.candidates.map((c) => {
          const cell = row.cells[c.id]!;
          const pre = cell.preScore !== null ? `pre ${score(cell.preScore)}` : '';
          if (cell.value === null) {
            return [c.id, { value: 'not scored', unit: '', missing: true, note: pre || undefined, sortValue: null }];
          }
          const spread =
            cell.count > 0
              ? `${score(cell.min!)}–${score(cell.max!)} · ${format.count(cell.count, 'person', 'people')}`
              : 'pre-score only';
          const overrides = cell.overrides > 0 ? `${cell.overrides} own` : '';
          return [
            c.id,
            {
              value: score(cell.value),
              unit: '/ 5',
              note: [spread, pre, overrides].filter(Boolean).join(' · '),
              sortValue: cell.value,
            },
          ];
        }),
      ),
    });
  });
  rows.push({
    key: 'total',
    label: 'Weighted total',
    sub: 'over scored criteria',
    kind: 'total',
    cells: Object.fromEntries(
      m.candidates.map((c) => {
        const t = m.totals[c.id]!;
        if (t.total === null) return [c.id, { value: 'not scored', unit: '', missing: true, sortValue: null }];
        return [
          c.id,
          {
            value: score(t.total),
            unit: '/ 5',
            flag: t.incomplete ? 'incomplete' : undefined,
            note: t.incomplete
              ? `incomplete: ${format.count(t.missing.length, 'criterion', 'criteria')} missing`
              : undefined,
            sortValue: t.total,
          },
        ];
      }),
    ),
  });
  const rankCounts = new Map<number, number>();
  for (const r of Object.values(m.ranks)) if (r !== null) rankCounts.set(r, (rankCounts.get(r) ?? 0) + 1);
  rows.push({
    key: 'rank',
    label: 'Rank',
    sub: '1 = best',
    kind: 'rank',
    lowerFirst: true,
    cells: Object.fromEntries(
      m.candidates.map((c) => {
        const r = m.ranks[c.id] ?? null;
        if (r === null) return [c.id, { value: 'no rank', unit: '', missing: true, sortValue: null }];
        const tied = (rankCounts.get(r) ?? 0) > 1;
        return [
          c.id,
          {
            value: tied ? `=${r}` : String(r),
            unit: '',
            flag: tied ? 'tie' : undefined,
            note: tied ? 'tied' : undefined,
            sortValue: r,
          },
        ];
      }),
    ),
  });
  for (const round of m.rounds) {
    rows.push({
      key: `round-${round.number}`,
      label: `Preference round ${round.number}`,
      sub: `${round.status === 'open' ? 'open' : 'closed'} · ${format.count(round.voters, 'voter', 'voters')}`,
      kind: 'round',
      cells: Object.fromEntries(
        m.candidates.map((c) => {
          const v = round.tally[c.id] ?? 0;
          return [c.id, { value: String(v), unit: v === 1 ? 'vote' : 'votes', sortValue: v }];
        }),
      ),
    });
  }
  return rows;
}

export type Sort = { rowKey: string; reversed: boolean } | null;

/** Candidate ids in the order of `sort` (best first by the row, missing last); board order without one. */
export function sortCandidates(m: Matrix, rows: RowModel[], sort: Sort): string[] {
  const ids = m.candidates.map((c) => c.id);
  if (!sort) return ids;
  const row = rows.find((r) => r.key === sort.rowKey);
  if (!row) return ids;
  const direction = (row.lowerFirst ? 1 : -1) * (sort.reversed ? -1 : 1);
  return [...ids].sort((a, b) => {
    const va = row.cells[a]?.sortValue ?? null;
    const vb = row.cells[b]?.sortValue ?? null;
    if (va === null && vb === null) return ids.indexOf(a) - ids.indexOf(b);
    if (va === null) return 1;
    if (vb === null) return -1;
    return (va - vb) * direction || ids.indexOf(a) - ids.indexOf(b);
  });
}
