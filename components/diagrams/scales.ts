/**
 * Shared pure pieces of every diagram: padded extents, d3 linear scales onto a frame, ticks
 * with their labels, polyline `d` strings and nearest-point hit-testing. No React here.
 */
import { scaleLinear, type ScaleLinear } from 'd3-scale';

import type { Frame } from './types';

export type Extent = readonly [number, number];
export type Point = { readonly x: number; readonly y: number };
export type Tick = { readonly value: number; readonly label: string; readonly at: number };

/**
 * The smallest interval holding every finite value, widened by `padding` of its span on each
 * side (a single value gets `flat` either side, so a flat line still has a height).
 * Null when there is no finite value.
 */
export function paddedExtent(values: Iterable<number>, padding: number, flat = 1): Extent | null {
  let min = Infinity;
  let max = -Infinity;
  for (const v of values) {
    if (!Number.isFinite(v)) continue;
    if (v < min) min = v;
    if (v > max) max = v;
  }
  if (min > max) return null;
  const span = max - min;
  const pad = span > 0 ? span * padding : flat;
  return [min - pad, max + pad];
}

/** Left, right, top and bottom of a frame's plot area. */
export function plotArea(frame: Frame) {
  const { width, height, margin } = frame;
  return {
    left: margin.left,
    right: Math.max(margin.left + 1, width - margin.right),
    top: margin.top,
    bottom: Math.max(margin.top + 1, height - margin.bottom),
  };
}

/** x grows rightwards over the plot area. */
export function horizontalScale(domain: Extent, frame: Frame): ScaleLinear<number, number> {
  const area = plotArea(frame);
  return scaleLinear().domain(domain).range([area.left, area.right]);
}

/** y grows upwards: the domain's low end at the bottom of the plot area. */
export function verticalScale(domain: Extent, frame: Frame): ScaleLinear<number, number> {
  const area = plotArea(frame);
  return scaleLinear().domain(domain).range([area.bottom, area.top]);
}

/**
 * About `count` round ticks inside the scale's domain, each with its label (d3's precision
 * for that step, grouped thousands) and its position in px. Never fewer than two: where the
 * round step for `count` leaves one tick inside the domain, the next finer step is taken.
 */
export function ticksOf(scale: ScaleLinear<number, number>, count: number): Tick[] {
  let asked = count;
  let values = scale.ticks(asked);
  while (values.length < 2 && asked < count + 10) {
    asked++;
    values = scale.ticks(asked);
  }
  const format = scale.tickFormat(asked);
  return values.map((value) => ({ value, label: format(value), at: scale(value) }));
}

/** About one tick per `spacing` px of axis length, at least `min` and at most `max`. */
export function tickCountFor(lengthPx: number, spacing: number, min = 2, max = 10): number {
  return Math.max(min, Math.min(max, Math.floor(lengthPx / spacing)));
}

/** A polyline through the points, to two decimals of a pixel. Empty for no points. */
export function polylineD(points: readonly Point[]): string {
  return points.map((p, i) => `${i === 0 ? 'M' : 'L'}${round2(p.x)},${round2(p.y)}`).join('');
}

function round2(v: number): string {
  return (Math.round(v * 100) / 100).toString();
}

/**
 * Index of the point nearest to `at` (Euclidean, px), or null when none lies within
 * `maxDistance`. Ties go to the first in order.
 */
export function nearestPoint(points: readonly Point[], at: Point, maxDistance = Infinity): number | null {
  let best: number | null = null;
  let bestDistance = Infinity;
  points.forEach((p, i) => {
    const d = Math.hypot(p.x - at.x, p.y - at.y);
    if (d <= maxDistance && d < bestDistance) {
      best = i;
      bestDistance = d;
    }
  });
  return best;
}
