import type { FlowState } from '../processes/flow-state';
import type { GasModel } from '../properties/gas-model';
import type { PathKind, StatePoint } from './types';

/** One state in flow order, with the gas there and how the flow got to it. */
export interface StateRecord {
  readonly label: string;
  readonly state: FlowState;
  readonly gas: GasModel;
  /** kg of gas per kg of compressor inlet air. */
  readonly mass: number;
  /** The process from the previous state to this one (none for the first). */
  readonly process: PathKind | null;
  /** True when the composition changed on the way in (a burner). */
  readonly burnt: boolean;
}

function numbered(label: string, i: number, count: number): string {
  return count > 1 ? `${label} ${i}` : label;
}

// Stage labels of each part by stage count, filled on first use: building the strings would
// cost more than the rest of a small evaluation, and one list per part keeps each lookup a
// plain array read (a lookup by part name would be a generic property lookup).
export const COMPRESSOR_LABELS: (readonly string[])[] = [];
export const INTERCOOLER_LABELS: (readonly string[])[] = [];
export const TURBINE_LABELS: (readonly string[])[] = [];
export const REHEATER_LABELS: (readonly string[])[] = [];

/** Labels "turbine 1 exit", … for `count` stages (index 1…count), made once per part and count. */
export function stageLabels(
  byCount: (readonly string[])[],
  name: string,
  count: number,
  suffix: string,
): readonly string[] {
  let labels = byCount[count];
  if (!labels) {
    const made = [''];
    for (let i = 1; i <= count; i++) made.push(numbered(name, i, count) + suffix);
    labels = byCount[count] = made;
  }
  return labels;
}

/** The states of the result, numbered from 1 in flow order. */
export function statePoints(records: readonly StateRecord[]): StatePoint[] {
  return records.map((record, i) => ({
    n: i + 1,
    label: record.label,
    temperatureK: record.state.temperatureK,
    pressureKPa: record.state.pressureKPa,
    enthalpyKJPerKg: record.state.enthalpyKJPerKg,
    entropyKJPerKgK: record.state.entropyKJPerKgK,
    massFlowRatio: record.mass,
  }));
}
