import { convert, formatNumber, type UnitSystem } from '@/components/ui/format';

/**
 * How a form shows and reads one SI quantity. The conversions are those of
 * components/ui/format.ts (each is linear, so the way back is found from two points of the
 * way there); percent shows a fraction × 100.
 */
export type QuantityKind = 'temperature' | 'percent' | 'fraction' | 'ratio' | 'count' | 'pressure' | 'elevation';

const linear: Partial<Record<QuantityKind, (si: number, system: UnitSystem) => { amount: number; unit: string }>> = {
  temperature: convert.temperature,
  pressure: convert.pressure,
  elevation: convert.elevation,
};

/** The unit a quantity of `kind` is typed in. */
export function unitOf(kind: QuantityKind, system: UnitSystem): string {
  const to = linear[kind];
  if (to) return to(1, system).unit;
  if (kind === 'percent') return '%';
  return kind === 'count' ? 'stages' : '–';
}

/** SI → the number shown in the field. */
export function toShown(kind: QuantityKind, si: number, system: UnitSystem): number {
  const to = linear[kind];
  if (to) return to(si, system).amount;
  return kind === 'percent' ? si * 100 : si;
}

/** The number typed → SI. */
export function fromShown(kind: QuantityKind, shown: number, system: UnitSystem): number {
  const to = linear[kind];
  if (to) {
    const zero = to(0, system).amount;
    const slope = to(1, system).amount - zero;
    return (shown - zero) / slope;
  }
  return kind === 'percent' ? shown / 100 : shown;
}

/** A value for an input: enough digits to come back within rounding, no trailing zeros. */
export function inputText(kind: QuantityKind, si: number | undefined | null, system: UnitSystem): string {
  if (si === undefined || si === null || !Number.isFinite(si)) return '';
  const shown = toShown(kind, si, system);
  const digits = kind === 'fraction' ? 4 : 2;
  return String(Number(shown.toFixed(digits)));
}

const numeric = /^[-+−]?(\d+([.,]\d*)?|[.,]\d+)([eE][-+]?\d+)?$/;

/**
 * What a typed text means in SI: blank → undefined (the schema says "required" when it is),
 * a number → converted, anything else → the text itself (the schema says "must be a number").
 */
export function readInput(kind: QuantityKind, text: string, system: UnitSystem): number | string | undefined {
  const t = text.trim();
  if (t === '') return undefined;
  if (!numeric.test(t)) return t;
  const n = Number(t.replace('−', '-').replace(',', '.'));
  return Number.isFinite(n) ? fromShown(kind, n, system) : t;
}

/** "1500–1700 K" in the user's units, from SI ends. */
export function rangeText(kind: QuantityKind, lo: number, hi: number, system: UnitSystem): string {
  const a = formatNumber(toShown(kind, lo, system), 3);
  const b = formatNumber(toShown(kind, hi, system), 3);
  const unit = unitOf(kind, system);
  return `${a}–${b}${unit === '–' ? '' : unit === '%' ? ' %' : ` ${unit}`}`;
}
