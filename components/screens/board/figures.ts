import * as format from '@/components/ui/format';
import type { Formatted, UnitSystem } from '@/components/ui/format';
import type { CandidateWire } from '@/server/contracts/board';

/**
 * The key figures a card shows, read from a candidate's engine results (the wire carries
 * them as a plain object: each is checked to be a finite number before it is shown).
 */

export type FigureKey =
  | 'thermalEfficiency'
  | 'netWorkKJPerKg'
  | 'airMassFlowKgPerS'
  | 'heatRateKJPerKWh'
  | 'exhaustTemperatureK'
  | 'fuelMassFlowKgPerS'
  | 'co2KgPerMWh';

export type Figure = {
  key: FigureKey;
  label: string;
  /** Which end is best across the candidates; absent when neither end is better by itself. */
  best?: 'highest' | 'lowest';
  show: (value: number, system: UnitSystem) => Formatted;
};

export const figures: Figure[] = [
  { key: 'thermalEfficiency', label: 'Thermal efficiency', best: 'highest', show: (v) => format.percent(v) },
  { key: 'netWorkKJPerKg', label: 'Net specific work', best: 'highest', show: format.specificWork },
  { key: 'airMassFlowKgPerS', label: 'Air flow for the required power', show: format.massFlow },
  { key: 'heatRateKJPerKWh', label: 'Heat rate', best: 'lowest', show: format.heatRate },
  { key: 'exhaustTemperatureK', label: 'Exhaust temperature', show: format.temperature },
  { key: 'fuelMassFlowKgPerS', label: 'Fuel flow', best: 'lowest', show: format.massFlow },
  // Carbon dioxide per electrical MWh reads in kg/MWh in both unit systems.
  {
    key: 'co2KgPerMWh',
    label: 'CO2 per MWh',
    best: 'lowest',
    show: (v) => ({ value: format.formatNumber(v, 3), unit: 'kg/MWh' }),
  },
];

export function figureValue(candidate: CandidateWire, key: FigureKey): number | null {
  const v = candidate.results?.[key];
  return typeof v === 'number' && Number.isFinite(v) ? v : null;
}

/**
 * The best value of each figure across the candidates that have one: highest efficiency and
 * specific work, lowest heat rate, fuel flow and CO2. Only marked when at least two
 * candidates can be compared.
 */
export function bestValues(candidates: CandidateWire[]): Partial<Record<FigureKey, number>> {
  const best: Partial<Record<FigureKey, number>> = {};
  for (const f of figures) {
    if (!f.best) continue;
    const values = candidates.map((c) => figureValue(c, f.key)).filter((v): v is number => v !== null);
    if (values.length < 2) continue;
    best[f.key] = f.best === 'highest' ? Math.max(...values) : Math.min(...values);
  }
  return best;
}

/** True when `value` is the best one (equal within rounding noise, so ties are all marked). */
export function isBest(value: number | null, best: number | undefined): boolean {
  if (value === null || best === undefined) return false;
  return Math.abs(value - best) <= 1e-9 * Math.max(1, Math.abs(best));
}

export function bestRule(f: Figure): string {
  return f.best === 'highest' ? 'best on the board: the highest' : 'best on the board: the lowest';
}

export type Warning = { message: string; field?: string };

export function warningsOf(candidate: CandidateWire): Warning[] {
  const list = candidate.results?.warnings;
  if (!Array.isArray(list)) return [];
  return list.flatMap((w): Warning[] => {
    if (!w || typeof w !== 'object') return [];
    const { message, field } = w as { message?: unknown; field?: unknown };
    return typeof message === 'string' ? [{ message, field: typeof field === 'string' ? field : undefined }] : [];
  });
}
