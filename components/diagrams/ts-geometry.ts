/**
 * T-s diagram geometry, pure: the display units of both axes, the domain over every state
 * and path point, frames for a card and for the detail page, projected paths and states,
 * state markers that do not overlap, the readout of a state and the diagram in words.
 * Values arrive in SI (K, kJ/(kg·K)) and are converted only through components/ui/format.
 */
import type { ScaleLinear } from 'd3-scale';

import {
  convert,
  entropy,
  formatNumber,
  pressure,
  specificWork,
  temperature,
  type Formatted,
  type UnitSystem,
} from '@/components/ui/format';

import {
  horizontalScale,
  paddedExtent,
  plotArea,
  polylineD,
  tickCountFor,
  ticksOf,
  verticalScale,
  type Extent,
  type Point,
  type Tick,
} from './scales';
import type { DiagramCycle, DiagramPath, DiagramPathKind, DiagramSize, DiagramState, Frame } from './types';

/** The two axes' quantities in the unit system: entropy on x, temperature on y. */
export function tsUnits(system: UnitSystem): { entropy: string; temperature: string } {
  return { entropy: convert.entropy(0, system).unit, temperature: convert.temperature(0, system).unit };
}

/** A state or path point (SI) in the shown units: x entropy, y temperature. */
export function toShown(temperatureK: number, entropyKJPerKgK: number, system: UnitSystem): Point {
  return {
    x: convert.entropy(entropyKJPerKgK, system).amount,
    y: convert.temperature(temperatureK, system).amount,
  };
}

/** Every point a set of cycles draws, in the shown units. */
export function shownPoints(cycles: readonly DiagramCycle[], system: UnitSystem): Point[] {
  const points: Point[] = [];
  for (const cycle of cycles) {
    for (const s of cycle.states) points.push(toShown(s.temperatureK, s.entropyKJPerKgK, system));
    for (const path of cycle.paths) {
      const n = Math.min(path.temperatureK.length, path.entropyKJPerKgK.length);
      for (let i = 0; i < n; i++) points.push(toShown(path.temperatureK[i], path.entropyKJPerKgK[i], system));
    }
  }
  return points;
}

export type TsDomain = { readonly entropy: Extent; readonly temperature: Extent };

/** Share of each axis's span left free beyond the outermost point on either side. */
export const DOMAIN_PADDING = 0.06;

/**
 * The shown ranges of entropy and temperature that hold every state and path point of the
 * cycles, padded by DOMAIN_PADDING of the span each side. Null when there is nothing to draw.
 */
export function tsDomain(cycles: readonly DiagramCycle[], system: UnitSystem): TsDomain | null {
  const points = shownPoints(cycles, system);
  const s = paddedExtent(
    points.map((p) => p.x),
    DOMAIN_PADDING,
    0.1,
  );
  const t = paddedExtent(
    points.map((p) => p.y),
    DOMAIN_PADDING,
    10,
  );
  return s && t ? { entropy: s, temperature: t } : null;
}

/** Marker and text sizes in px for each size of diagram. */
export const tsLook = {
  small: { markerRadius: 8, markerFont: 10, tickFont: 10, stroke: 2, dot: 2.5 },
  large: { markerRadius: 10, markerFont: 11, tickFont: 11, stroke: 2.5, dot: 3 },
} as const;

/**
 * The frame of a diagram `width` px wide. A card's diagram is 200 px tall (readable at
 * 360 px screens); the detail page's grows with its width, 280–440 px.
 */
export function tsFrame(size: DiagramSize, width: number): Frame {
  if (size === 'small') {
    return { width, height: 200, margin: { top: 20, right: 12, bottom: 36, left: 44 } };
  }
  const height = Math.round(Math.max(280, Math.min(440, width * 0.6)));
  return { width, height, margin: { top: 24, right: 16, bottom: 42, left: 52 } };
}

export type TsScales = { readonly x: ScaleLinear<number, number>; readonly y: ScaleLinear<number, number> };

export function tsScales(domain: TsDomain, frame: Frame): TsScales {
  return { x: horizontalScale(domain.entropy, frame), y: verticalScale(domain.temperature, frame) };
}

/** Few ticks on a card (2–3 across, 3–4 up), about one per 70–80 px on the detail page. */
export function tsTicks(scales: TsScales, frame: Frame, size: DiagramSize): { x: Tick[]; y: Tick[] } {
  const area = plotArea(frame);
  const across = area.right - area.left;
  const up = area.bottom - area.top;
  const xCount = size === 'small' ? tickCountFor(across, 110, 2, 3) : tickCountFor(across, 80, 3, 8);
  const yCount = size === 'small' ? tickCountFor(up, 40, 3, 4) : tickCountFor(up, 70, 3, 7);
  return { x: ticksOf(scales.x, xCount), y: ticksOf(scales.y, yCount) };
}

/** How a process is coloured: heat added (copper), heat rejected (glacier), work (loop colour). */
export type PathRole = 'heat-added' | 'heat-rejected' | 'work';

export function pathRole(kind: DiagramPathKind): PathRole {
  switch (kind) {
    case 'heat-addition':
    case 'regenerator-heating':
      return 'heat-added';
    case 'heat-rejection':
    case 'regenerator-cooling':
      return 'heat-rejected';
    case 'compression':
    case 'expansion':
      return 'work';
  }
}

export type ProjectedPath = {
  readonly kind: DiagramPathKind;
  readonly role: PathRole;
  readonly from: number;
  readonly to: number;
  readonly points: Point[];
  readonly d: string;
};

export type ProjectedState = Point & { readonly state: DiagramState };

/** A path's points in px, exactly the engine's points through the scales, and its `d`. */
export function projectPath(path: DiagramPath, scales: TsScales, system: UnitSystem): ProjectedPath {
  const n = Math.min(path.temperatureK.length, path.entropyKJPerKgK.length);
  const points: Point[] = [];
  for (let i = 0; i < n; i++) {
    const shown = toShown(path.temperatureK[i], path.entropyKJPerKgK[i], system);
    points.push({ x: scales.x(shown.x), y: scales.y(shown.y) });
  }
  return { kind: path.kind, role: pathRole(path.kind), from: path.from, to: path.to, points, d: polylineD(points) };
}

export function projectState(state: DiagramState, scales: TsScales, system: UnitSystem): ProjectedState {
  const shown = toShown(state.temperatureK, state.entropyKJPerKgK, system);
  return { x: scales.x(shown.x), y: scales.y(shown.y), state };
}

export function projectCycle(
  cycle: DiagramCycle,
  scales: TsScales,
  system: UnitSystem,
): { paths: ProjectedPath[]; states: ProjectedState[] } {
  return {
    paths: cycle.paths.map((p) => projectPath(p, scales, system)),
    states: cycle.states.map((s) => projectState(s, scales, system)),
  };
}

/**
 * Centres of the numbered state circles: each starts on its state and is pushed off the
 * circles it would overlap (by at least `gap` px), staying inside `bounds`. Deterministic;
 * on the engine's cycles at card size no two circles overlap (tests/app/diagrams).
 */
export function placeMarkers(
  at: readonly Point[],
  radius: number,
  bounds: { left: number; right: number; top: number; bottom: number },
  gap = 1,
): Point[] {
  const placed = at.map((p) => ({ x: p.x, y: p.y }));
  const clearance = 2 * radius + gap;
  const clamp = (p: { x: number; y: number }) => {
    p.x = Math.max(bounds.left + radius, Math.min(bounds.right - radius, p.x));
    p.y = Math.max(bounds.top + radius, Math.min(bounds.bottom - radius, p.y));
  };
  placed.forEach(clamp);
  for (let round = 0; round < 200; round++) {
    let moved = false;
    for (let i = 0; i < placed.length; i++) {
      for (let j = i + 1; j < placed.length; j++) {
        const a = placed[i];
        const b = placed[j];
        let dx = b.x - a.x;
        let dy = b.y - a.y;
        let d = Math.hypot(dx, dy);
        if (d >= clearance - 1e-9) continue;
        if (d < 1e-6) {
          // Coincident: part them along a fixed direction, later state to the lower right.
          dx = Math.SQRT1_2;
          dy = Math.SQRT1_2;
          d = 1;
        }
        const push = (clearance - Math.hypot(b.x - a.x, b.y - a.y)) / 2 + 0.01;
        a.x -= (dx / d) * push;
        a.y -= (dy / d) * push;
        b.x += (dx / d) * push;
        b.y += (dy / d) * push;
        clamp(a);
        clamp(b);
        moved = true;
      }
    }
    if (!moved) break;
  }
  return placed;
}

/** T, p, h, s of a state in the unit system, each with its unit, in reading order. */
export function stateQuantities(state: DiagramState, system: UnitSystem): { symbol: string; shown: Formatted }[] {
  return [
    { symbol: 'T', shown: temperature(state.temperatureK, system) },
    { symbol: 'p', shown: pressure(state.pressureKPa, system) },
    { symbol: 'h', shown: specificWork(state.enthalpyKJPerKg, system) },
    { symbol: 's', shown: entropy(state.entropyKJPerKgK, system) },
  ];
}

/** One line for screen readers and the readout: "State 3, combustor exit: T 1500 K, p …". */
export function stateSentence(state: DiagramState, system: UnitSystem): string {
  const parts = stateQuantities(state, system).map(({ symbol, shown }) => `${symbol} ${shown.value} ${shown.unit}`);
  return `State ${state.n}, ${state.label}: ${parts.join(', ')}`;
}

function rangeOf(values: number[]): [number, number] {
  return [Math.min(...values), Math.max(...values)];
}

/**
 * The diagram in words: "T-s diagram of Simple: 4 states, T from 288.1 K to 1500 K, s from
 * 6.865 to 7.996 kJ/(kg·K)".
 */
export function describeCycle(name: string, cycle: DiagramCycle, system: UnitSystem): string {
  if (cycle.states.length === 0) return `T-s diagram of ${name}: no states`;
  const units = tsUnits(system);
  const [tLow, tHigh] = rangeOf(cycle.states.map((s) => convert.temperature(s.temperatureK, system).amount));
  const [sLow, sHigh] = rangeOf(cycle.states.map((s) => convert.entropy(s.entropyKJPerKgK, system).amount));
  const count = cycle.states.length;
  return (
    `T-s diagram of ${name}: ${count} ${count === 1 ? 'state' : 'states'}, ` +
    `T from ${formatNumber(tLow)} ${units.temperature} to ${formatNumber(tHigh)} ${units.temperature}, ` +
    `s from ${formatNumber(sLow)} to ${formatNumber(sHigh)} ${units.entropy}`
  );
}

/** The overlay in words: "T-s diagrams of 3 candidates: Simple, Regenerative, IRR; T from … to …". */
export function describeOverlay(
  candidates: readonly { readonly name: string; readonly cycle: DiagramCycle }[],
  system: UnitSystem,
): string {
  const states = candidates.flatMap((c) => c.cycle.states);
  const count = candidates.length;
  const head = `T-s diagrams of ${count} ${count === 1 ? 'candidate' : 'candidates'}`;
  if (states.length === 0) return count === 0 ? `${head}` : `${head}: ${candidates.map((c) => c.name).join(', ')}`;
  const units = tsUnits(system);
  const [tLow, tHigh] = rangeOf(states.map((s) => convert.temperature(s.temperatureK, system).amount));
  const [sLow, sHigh] = rangeOf(states.map((s) => convert.entropy(s.entropyKJPerKgK, system).amount));
  return (
    `${head}: ${candidates.map((c) => c.name).join(', ')}; ` +
    `T from ${formatNumber(tLow)} ${units.temperature} to ${formatNumber(tHigh)} ${units.temperature}, ` +
    `s from ${formatNumber(sLow)} to ${formatNumber(sHigh)} ${units.entropy}`
  );
}
