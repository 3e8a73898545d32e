/**
 * Sweep chart geometry, pure: the swept input's name and shown unit, the two series
 * (thermal efficiency in %, net specific work) split into runs where the engine refused a
 * value, so a refusal is a gap and never a zero, the refused bands, both panels' frames and
 * domains, and the nearest sample to a pointer.
 */
import { convert, formatNumber, percent, specificWork, type Formatted, type UnitSystem } from '@/components/ui/format';

import { paddedExtent, type Extent } from './scales';
import type {
  DiagramSweep,
  DiagramSweepFigures,
  DiagramSweepPoint,
  Frame,
  SweepCurrent,
  SweepParameter,
} from './types';

export type ParameterAxis = {
  /** Plain name of the swept input. */
  readonly name: string;
  /** Its shown unit ('' for a ratio or a count). */
  readonly unit: string;
  /** API value (K, kPa, fraction, kW…) → shown value. */
  readonly toShown: (value: number) => number;
};

type AxisKind = 'temperature' | 'pressure' | 'elevation' | 'fraction' | 'ratio' | 'count' | 'power';

const parameterAxes: Record<SweepParameter, { name: string; kind: AxisKind }> = {
  'ambient.temperatureK': { name: 'Ambient temperature', kind: 'temperature' },
  'ambient.pressureKPa': { name: 'Ambient pressure', kind: 'pressure' },
  'ambient.elevationM': { name: 'Elevation', kind: 'elevation' },
  'ambient.relativeHumidity': { name: 'Relative humidity', kind: 'fraction' },
  'fuel.hydrogenVolumeFraction': { name: 'Hydrogen in the fuel (by volume)', kind: 'fraction' },
  'fuel.temperatureK': { name: 'Fuel temperature', kind: 'temperature' },
  'compressor.stages': { name: 'Compressor stages', kind: 'count' },
  'compressor.pressureRatio': { name: 'Pressure ratio', kind: 'ratio' },
  'compressor.isentropicEfficiency': { name: 'Compressor isentropic efficiency', kind: 'fraction' },
  'compressor.intercoolTemperatureK': { name: 'Intercooling temperature', kind: 'temperature' },
  'compressor.intercoolerPressureLoss': { name: 'Intercooler pressure loss', kind: 'fraction' },
  'regenerator.effectiveness': { name: 'Regenerator effectiveness', kind: 'fraction' },
  'regenerator.airSidePressureLoss': { name: 'Regenerator air-side pressure loss', kind: 'fraction' },
  'regenerator.gasSidePressureLoss': { name: 'Regenerator gas-side pressure loss', kind: 'fraction' },
  combustorPressureLoss: { name: 'Combustor pressure loss', kind: 'fraction' },
  'turbine.stages': { name: 'Turbine stages', kind: 'count' },
  'turbine.inletTemperatureK': { name: 'Turbine inlet temperature', kind: 'temperature' },
  'turbine.isentropicEfficiency': { name: 'Turbine isentropic efficiency', kind: 'fraction' },
  'turbine.reheatTemperatureK': { name: 'Reheat temperature', kind: 'temperature' },
  'turbine.reheaterPressureLoss': { name: 'Reheater pressure loss', kind: 'fraction' },
  generatorEfficiency: { name: 'Generator efficiency', kind: 'fraction' },
  netPowerKW: { name: 'Required net power', kind: 'power' },
};

/** The swept input's name, shown unit and conversion in the unit system. */
export function parameterAxis(parameter: SweepParameter, system: UnitSystem): ParameterAxis {
  const { name, kind } = parameterAxes[parameter];
  switch (kind) {
    case 'temperature':
      return {
        name,
        unit: convert.temperature(0, system).unit,
        toShown: (v) => convert.temperature(v, system).amount,
      };
    case 'pressure':
      return { name, unit: convert.pressure(0, system).unit, toShown: (v) => convert.pressure(v, system).amount };
    case 'elevation':
      return { name, unit: convert.elevation(0, system).unit, toShown: (v) => convert.elevation(v, system).amount };
    case 'fraction':
      return { name, unit: '%', toShown: (v) => v * 100 };
    // A sweep of plant power reads in MW in both systems, as the rest of the app does.
    case 'power':
      return { name, unit: 'MW', toShown: (v) => v / 1000 };
    case 'ratio':
    case 'count':
      return { name, unit: '', toShown: (v) => v };
  }
}

/** "Turbine inlet temperature, K"; "Pressure ratio". */
export function parameterTitle(axis: ParameterAxis): string {
  return axis.unit ? `${axis.name}, ${axis.unit}` : axis.name;
}

export type Quantity = 'efficiency' | 'netWork';

/** The shown value of one figure: thermal efficiency in %, net specific work in kJ/kg or Btu/lb. */
export function quantityOf(quantity: Quantity, figures: DiagramSweepFigures, system: UnitSystem): number {
  return quantity === 'efficiency'
    ? figures.thermalEfficiency * 100
    : convert.specificWork(figures.netWorkKJPerKg, system).amount;
}

export function quantityUnit(quantity: Quantity, system: UnitSystem): string {
  return quantity === 'efficiency' ? '%' : convert.specificWork(0, system).unit;
}

export function quantityTitle(quantity: Quantity, system: UnitSystem): string {
  return quantity === 'efficiency'
    ? 'Thermal efficiency, %'
    : `Net specific work, ${convert.specificWork(0, system).unit}`;
}

/** One sample in shown units: x the swept value, y the figure. */
export type SeriesPoint = { readonly x: number; readonly y: number; readonly index: number };

/**
 * The samples of one figure as runs of consecutive feasible samples. A refused sample (no
 * figures) or a figure that is not finite ends a run: the line breaks there.
 */
export function seriesRuns(
  points: readonly DiagramSweepPoint[],
  quantity: Quantity,
  axis: ParameterAxis,
  system: UnitSystem,
): SeriesPoint[][] {
  const runs: SeriesPoint[][] = [];
  let run: SeriesPoint[] = [];
  points.forEach((p, index) => {
    const y = p.figures ? quantityOf(quantity, p.figures, system) : NaN;
    if (Number.isFinite(y)) {
      run.push({ x: axis.toShown(p.value), y, index });
    } else if (run.length > 0) {
      runs.push(run);
      run = [];
    }
  });
  if (run.length > 0) runs.push(run);
  return runs;
}

/**
 * Shown ranges of the swept input where the engine refused every value: each run of refused
 * samples, reaching halfway to the feasible neighbours (or the end of the range). `reason`
 * is the engine's message for the first refused sample of the run.
 */
export function refusedBands(
  points: readonly DiagramSweepPoint[],
  axis: ParameterAxis,
): { from: number; to: number; reason: string }[] {
  const bands: { from: number; to: number; reason: string }[] = [];
  const x = points.map((p) => axis.toShown(p.value));
  let i = 0;
  while (i < points.length) {
    if (points[i].figures) {
      i++;
      continue;
    }
    const start = i;
    while (i < points.length && !points[i].figures) i++;
    const end = i - 1;
    const from = start === 0 ? x[0] : (x[start - 1] + x[start]) / 2;
    const to = end === points.length - 1 ? x[end] : (x[end] + x[end + 1]) / 2;
    bands.push({ from, to, reason: points[start].error?.message ?? 'The engine refused this value.' });
  }
  return bands;
}

/** The shown range of the swept input: the sweep's own from–to, and the current point. */
export function parameterDomain(sweep: DiagramSweep, axis: ParameterAxis, current?: SweepCurrent | null): Extent {
  const values = [axis.toShown(sweep.from), axis.toShown(sweep.to)];
  if (current && Number.isFinite(current.value)) values.push(axis.toShown(current.value));
  const extent = paddedExtent(values, 0, 1)!;
  return extent;
}

/** The range of one figure over feasible samples, the optimum and the current point, padded 8 %. */
export function quantityDomain(
  sweep: DiagramSweep,
  quantity: Quantity,
  system: UnitSystem,
  current?: SweepCurrent | null,
): Extent | null {
  const values: number[] = [];
  for (const p of sweep.points) if (p.figures) values.push(quantityOf(quantity, p.figures, system));
  const optimum = quantity === 'efficiency' ? sweep.optimumEfficiency : sweep.optimumNetWork;
  if (optimum) values.push(quantityOf(quantity, optimum.figures, system));
  if (current?.figures) values.push(quantityOf(quantity, current.figures, system));
  return paddedExtent(values, 0.08, 1);
}

/** The optimum of each figure in shown units, with the words of its marker. */
export function optimumMark(
  sweep: DiagramSweep,
  quantity: Quantity,
  axis: ParameterAxis,
  system: UnitSystem,
): { x: number; y: number; label: string; atRangeEnd: boolean } | null {
  const optimum = quantity === 'efficiency' ? sweep.optimumEfficiency : sweep.optimumNetWork;
  if (!optimum) return null;
  const x = axis.toShown(optimum.value);
  const y = quantityOf(quantity, optimum.figures, system);
  const where = `${formatNumber(x, 3)}${axis.unit ? ` ${axis.unit}` : ''}`;
  const figure = figureText(quantity, optimum.figures, system);
  const label = `Highest ${quantity === 'efficiency' ? 'efficiency' : 'net work'} ${figure} at ${where}${
    optimum.atRangeEnd ? ' (end of range)' : ''
  }`;
  return { x, y, label, atRangeEnd: optimum.atRangeEnd };
}

/** One figure as shown: 41.1 %, 374.7 kJ/kg (or Btu/lb). */
export function figureShown(quantity: Quantity, figures: DiagramSweepFigures, system: UnitSystem): Formatted {
  return quantity === 'efficiency' ? percent(figures.thermalEfficiency) : specificWork(figures.netWorkKJPerKg, system);
}

/** "41.1 %", "374.7 kJ/kg" */
export function figureText(quantity: Quantity, figures: DiagramSweepFigures, system: UnitSystem): string {
  const shown = figureShown(quantity, figures, system);
  return `${shown.value} ${shown.unit}`;
}

/** Where a sample lies: "Turbine inlet temperature 1200 K", "Pressure ratio 20.00". */
export function sampleTitle(point: DiagramSweepPoint, axis: ParameterAxis): string {
  return `${axis.name} ${formatNumber(axis.toShown(point.value))}${axis.unit ? ` ${axis.unit}` : ''}`;
}

/** The readout of one sample: where it lies, then both figures or the engine's reason for refusing it. */
export function sampleSentence(point: DiagramSweepPoint, axis: ParameterAxis, system: UnitSystem): string {
  const at = sampleTitle(point, axis);
  if (!point.figures) return `${at}: not feasible. ${point.error?.message ?? ''}`.trim();
  return `${at}: efficiency ${figureText('efficiency', point.figures, system)}, net work ${figureText(
    'netWork',
    point.figures,
    system,
  )}`;
}

/** The chart in words, for screen readers. */
export function describeSweep(sweep: DiagramSweep, axis: ParameterAxis, system: UnitSystem): string {
  const refused = sweep.points.filter((p) => !p.figures).length;
  const unit = axis.unit ? ` ${axis.unit}` : '';
  const parts = [
    `Sweep of ${axis.name.toLowerCase()} from ${formatNumber(axis.toShown(sweep.from))} to ${formatNumber(
      axis.toShown(sweep.to),
    )}${unit}, ${sweep.points.length} samples`,
  ];
  if (refused > 0) parts.push(`${refused} not feasible`);
  for (const quantity of ['efficiency', 'netWork'] as const) {
    const mark = optimumMark(sweep, quantity, axis, system);
    if (mark) parts.push(mark.label.charAt(0).toLowerCase() + mark.label.slice(1));
  }
  return parts.join('; ');
}

/**
 * Two stacked panels in one drawing, sharing the x axis: efficiency above, net work below,
 * the swept input's ticks under the lower one. Both frames are in the drawing's coordinates
 * (the lower one's top margin holds the upper panel); each panel is 120–220 px tall by width.
 */
export function sweepFrames(width: number): { efficiency: Frame; netWork: Frame; height: number } {
  const panel = Math.round(Math.max(120, Math.min(220, width * 0.38)));
  const side = { right: 16, left: 48 };
  const height = 2 * panel + 56;
  return {
    height,
    efficiency: { width, height, margin: { ...side, top: 22, bottom: height - panel } },
    netWork: { width, height, margin: { ...side, top: panel + 30, bottom: 48 } },
  };
}

/** Index of the sample whose swept value lies nearest to the shown x, or null for none. */
export function nearestSample(points: readonly DiagramSweepPoint[], axis: ParameterAxis, x: number): number | null {
  let best: number | null = null;
  let bestDistance = Infinity;
  points.forEach((p, i) => {
    const d = Math.abs(axis.toShown(p.value) - x);
    if (d < bestDistance) {
      best = i;
      bestDistance = d;
    }
  });
  return best;
}
