import type { FlowState } from '../processes/flow-state';
import type { GasModel } from '../properties/gas-model';
import { STANDARD_PRESSURE_KPA } from '../properties/nasa-species';
import * as propertyPolynomial from '../properties/property-polynomial';
import type { StateRecord } from './state-records';
import type { PathKind, ProcessPath } from './types';

// The points are evaluated on the gases' property polynomials directly (one call per point
// instead of a method that calls the polynomial through an imported binding, which once
// transpiled is a getter call per point). Local copies of the bindings for the same reason.
const entropyOf = propertyPolynomial.standardEntropyOf;
const P0_KPA = STANDARD_PRESSURE_KPA;

/**
 * Path of a non-ideal compression or expansion, drawn as the process of constant
 * polytropic efficiency through both end states. For an ideal gas on that path
 * ds = (1 − η_p) cp dT / T (compression; 1 − 1/η_p for expansion), hence
 *   s(T) = s_a + c [s°(T) − s°(T_a)],   c = (s_b − s_a) / [s°(T_b) − s°(T_a)],
 * which passes exactly through a and b with cp varying along it. Temperatures evenly spaced.
 */
export function polytropicPath(
  gas: GasModel,
  a: FlowState,
  b: FlowState,
  points: number,
  kind: PathKind,
  from: number,
  to: number,
): ProcessPath {
  const temperatureK: number[] = new Array(points);
  const entropyKJPerKgK: number[] = new Array(points);
  const p = gas.polynomial;
  const s0a = entropyOf(p, a.temperatureK);
  const span = entropyOf(p, b.temperatureK) - s0a;
  const c = span !== 0 ? (b.entropyKJPerKgK - a.entropyKJPerKgK) / span : 0;
  const last = points - 1;
  for (let j = 0; j <= last; j++) {
    const t = a.temperatureK + ((b.temperatureK - a.temperatureK) * j) / last;
    temperatureK[j] = t;
    entropyKJPerKgK[j] = a.entropyKJPerKgK + c * (entropyOf(p, t) - s0a);
  }
  entropyKJPerKgK[last] = b.entropyKJPerKgK;
  return { kind, from, to, temperatureK, entropyKJPerKgK };
}

/**
 * Path of heating or cooling: the isobar of the outlet gas, with the pressure falling
 * linearly with temperature from inlet to outlet where the part has a pressure loss.
 * Where the composition changes on the way (a burner, or the exhaust returning to the
 * ambient air), the isobar is shifted at the start by the entropy the composition change
 * carries, easing that shift to zero at the outlet: a drawing aid. Both ends are the exact
 * states.
 */
export function isobarPath(
  outletGas: GasModel,
  a: FlowState,
  b: FlowState,
  points: number,
  kind: PathKind,
  from: number,
  to: number,
  compositionChanges: boolean,
): ProcessPath {
  const temperatureK: number[] = new Array(points);
  const entropyKJPerKgK: number[] = new Array(points);
  const poly = outletGas.polynomial;
  const r = outletGas.gasConstantKJPerKgK;
  const pressureTerm = -r * Math.log(a.pressureKPa / P0_KPA);
  // For one gas the inlet lies on the isobar already: no shift, and no s° evaluation for it.
  const shift = compositionChanges ? a.entropyKJPerKgK - (entropyOf(poly, a.temperatureK) + pressureTerm) : 0;
  // s = s°(T) − R ln(p/p0) with p linear in the fraction: where the part keeps its pressure
  // the pressure term is one constant, which saves a logarithm per point.
  const lossless = withoutLoss(a, b);
  const last = points - 1;
  for (let j = 0; j <= last; j++) {
    const fraction = j / last;
    const t = a.temperatureK + (b.temperatureK - a.temperatureK) * fraction;
    const p = a.pressureKPa + (b.pressureKPa - a.pressureKPa) * fraction;
    temperatureK[j] = t;
    entropyKJPerKgK[j] =
      entropyOf(poly, t) + (lossless ? pressureTerm : -r * Math.log(p / P0_KPA)) + (1 - fraction) * shift;
  }
  entropyKJPerKgK[0] = a.entropyKJPerKgK;
  entropyKJPerKgK[last] = b.entropyKJPerKgK;
  return { kind, from, to, temperatureK, entropyKJPerKgK };
}

/** True when a part keeps its pressure (to round-off: the exhaust pressure is ambient divided
 * and multiplied by the same loss factor). */
function withoutLoss(a: FlowState, b: FlowState): boolean {
  return Math.abs(b.pressureKPa - a.pressureKPa) <= 1e-12 * a.pressureKPa;
}

/** Drawing resolution of a path's inner points: 0.01 K and 0.01 J/(kg·K). */
const drawnTemperatureK = 100;
const drawnEntropyKJPerKgK = 100_000;

/**
 * A path's inner points rounded to what a drawing can show; its two ends stay the exact
 * states. Even the largest diagram spans ~1,000 px over ~1,500 K and ~2 kJ/(kg·K), so a
 * pixel is above 1 K and 0.002 kJ/(kg·K): the rounding moves no point by a pixel, and a
 * number then travels in 6–8 characters instead of 17 (the board's live news is mostly
 * paths). Rounding keeps the order of the points.
 */
function forDrawing(path: ProcessPath): ProcessPath {
  const { temperatureK: t, entropyKJPerKgK: s } = path;
  for (let j = 1; j < t.length - 1; j++) {
    t[j] = Math.round(t[j] * drawnTemperatureK) / drawnTemperatureK;
    s[j] = Math.round(s[j] * drawnEntropyKJPerKgK) / drawnEntropyKJPerKgK;
  }
  return path;
}

/**
 * The T-s paths of a cycle: one per process between successive states (both ends included,
 * `pointsPerProcess` clamped to 2–200), plus the exhaust returning to the ambient state.
 * Inner points are kept to drawing resolution (forDrawing).
 */
export function cyclePaths(records: readonly StateRecord[], pointsPerProcess: number): ProcessPath[] {
  const points = Math.max(2, Math.min(200, Math.round(pointsPerProcess)));
  const paths: ProcessPath[] = [];
  for (let i = 1; i < records.length; i++) {
    const a = records[i - 1];
    const b = records[i];
    const kind = b.process!;
    paths.push(
      forDrawing(
        kind === 'compression' || kind === 'expansion'
          ? polytropicPath(b.gas, a.state, b.state, points, kind, i, i + 1)
          : isobarPath(b.gas, a.state, b.state, points, kind, i, i + 1, b.burnt),
      ),
    );
  }
  // The exhaust returns to the ambient state outside the plant: heat rejection at ambient pressure.
  const exhaust = records[records.length - 1];
  const first = records[0];
  paths.push(
    forDrawing(
      isobarPath(
        first.gas,
        exhaust.state,
        first.state,
        points,
        'heat-rejection',
        records.length,
        1,
        exhaust.gas !== first.gas,
      ),
    ),
  );
  return paths;
}
