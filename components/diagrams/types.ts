/**
 * The shapes the diagrams draw, declared structurally so the app never imports the engine:
 * a `CycleResult` (server/engine/cycles/types.ts) is a `DiagramCycle`, and a `SweepResult`
 * (server/engine/cycles/sweep.ts, as POST /api/cycles/sweep answers it) is a `DiagramSweep`.
 * SI throughout, with the units in the names, as the API sends them.
 */
import type { SweepParameterName } from '@/server/contracts/cycle';

/** One state point: numbered 1, 2, 3 … in flow order, with a short plain label. */
export type DiagramState = {
  readonly n: number;
  readonly label: string;
  readonly temperatureK: number;
  readonly pressureKPa: number;
  readonly enthalpyKJPerKg: number;
  readonly entropyKJPerKgK: number;
};

export type DiagramPathKind =
  'compression' | 'expansion' | 'heat-addition' | 'heat-rejection' | 'regenerator-heating' | 'regenerator-cooling';

/** One process as the engine traced it: points along the true curve, both ends included. */
export type DiagramPath = {
  readonly kind: DiagramPathKind;
  /** State numbers at its ends (`to` is 1 where the exhaust returns to ambient). */
  readonly from: number;
  readonly to: number;
  readonly temperatureK: readonly number[];
  readonly entropyKJPerKgK: readonly number[];
};

/** What a T-s diagram needs of one evaluated cycle. */
export type DiagramCycle = {
  readonly states: readonly DiagramState[];
  readonly paths: readonly DiagramPath[];
};

/** One candidate on the overlay: its cycle, its name and the colour it keeps everywhere. */
export type OverlayCandidate = {
  readonly id: string;
  readonly name: string;
  /** From `candidateSeries` (components/ui/tokens.ts), in the candidate's order. */
  readonly colour: string;
  readonly cycle: DiagramCycle;
};

export type SweepParameter = SweepParameterName;

/** The figures of one feasible sample that the chart draws (per kg of compressor inlet air). */
export type DiagramSweepFigures = {
  readonly netWorkKJPerKg: number;
  /** A fraction, 0–1. */
  readonly thermalEfficiency: number;
};

export type DiagramSweepPoint = {
  /** The swept input's value in its API unit (K, kPa, fraction…). */
  readonly value: number;
  /** null where the engine refused the value; `error` then says why. */
  readonly figures: DiagramSweepFigures | null;
  readonly error: { readonly field: string; readonly message: string } | null;
};

export type DiagramSweepOptimum = {
  readonly value: number;
  readonly figures: DiagramSweepFigures;
  /** The best sample lies at an end of the range: the true optimum may be outside it. */
  readonly atRangeEnd: boolean;
};

export type DiagramSweep = {
  readonly parameter: SweepParameter;
  readonly from: number;
  readonly to: number;
  readonly points: readonly DiagramSweepPoint[];
  readonly optimumNetWork: DiagramSweepOptimum | null;
  readonly optimumEfficiency: DiagramSweepOptimum | null;
};

/** The candidate's own operating point on a sweep; figures, when given, are its evaluated ones. */
export type SweepCurrent = {
  readonly value: number;
  readonly figures?: DiagramSweepFigures | null;
};

/** The drawing area in px. */
export type Frame = {
  readonly width: number;
  readonly height: number;
  readonly margin: { readonly top: number; readonly right: number; readonly bottom: number; readonly left: number };
};

export type DiagramSize = 'small' | 'large';
