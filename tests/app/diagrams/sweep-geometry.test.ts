import { describe, expect, it } from 'vitest';

import { horizontalScale, plotArea, verticalScale } from '@/components/diagrams/scales';
import {
  describeSweep,
  nearestSample,
  optimumMark,
  parameterAxis,
  parameterDomain,
  parameterTitle,
  quantityDomain,
  quantityOf,
  quantityTitle,
  refusedBands,
  sampleSentence,
  seriesRuns,
  sweepFrames,
} from '@/components/diagrams/sweep-geometry';
import type { DiagramSweep } from '@/components/diagrams/types';
import { expectClose } from '@/tests/helpers/expect-close';

import { inletTemperatureSweep, pressureRatioSweep } from './fixtures';

/**
 * Sweep chart geometry on real sweeps (tests/app/diagrams/fixtures.ts): pressure ratio with
 * every sample feasible, and turbine inlet temperature whose first three samples the engine
 * refuses (below the compressor delivery temperature).
 */

/** NIST SP 811 (2008), Appendix B. */
const nist = {
  /** 1 Btu_IT/lb = 2.326 E+03 J/kg, exact (B.8, B.9 "energy divided by mass") — from memory. */
  jPerKgPerBtuPerLb: 2.326e3,
  /** t/°F = 1.8 · T/K − 459.67 (B.9, "temperature") — from memory. */
  fahrenheitOf: (kelvin: number) => 1.8 * kelvin - 459.67,
} as const;

/** The same sweep with the samples at `refused` taken as the engine answers a refusal. */
function withRefused(sweep: DiagramSweep, refused: number[]): DiagramSweep {
  const error = { field: 'compressor.pressureRatio', message: 'Refused for this test.' };
  return {
    ...sweep,
    points: sweep.points.map((p, i) => (refused.includes(i) ? { value: p.value, figures: null, error } : p)),
  };
}

describe('refused samples are gaps, never zeros', () => {
  it('the real sweep has refused samples, and no run of the line holds one', () => {
    const refused = inletTemperatureSweep.points.flatMap((p, i) => (p.figures ? [] : [i]));
    expect(refused).toEqual([0, 1, 2]);
    const axis = parameterAxis('turbine.inletTemperatureK', 'si');
    for (const quantity of ['efficiency', 'netWork'] as const) {
      const runs = seriesRuns(inletTemperatureSweep.points, quantity, axis, 'si');
      expect(runs.length).toBe(1);
      expect(runs[0].map((p) => p.index)).toEqual([3, 4, 5, 6, 7, 8, 9, 10, 11, 12, 13, 14]);
      expect(runs[0][0].x).toBe(700);
    }
  });

  it('a refusal inside the range breaks the line in two, and each run keeps its real values', () => {
    const sweep = withRefused(pressureRatioSweep, [7, 8]);
    const axis = parameterAxis('compressor.pressureRatio', 'si');
    const runs = seriesRuns(sweep.points, 'efficiency', axis, 'si');
    expect(runs.map((r) => r.map((p) => p.index))).toEqual([
      [0, 1, 2, 3, 4, 5, 6],
      [9, 10, 11, 12, 13, 14, 15, 16, 17, 18, 19],
    ]);
    for (const p of runs.flat()) {
      expect(p.y).toBe(pressureRatioSweep.points[p.index].figures!.thermalEfficiency * 100);
    }
    // Refused values do not pull the efficiency range down to zero.
    const domain = quantityDomain(sweep, 'efficiency', 'si')!;
    const feasible = sweep.points.flatMap((p) => (p.figures ? [p.figures.thermalEfficiency * 100] : []));
    expect(domain[0]).toBeGreaterThan(Math.min(...feasible) - 0.09 * (Math.max(...feasible) - Math.min(...feasible)));
  });

  it('shades each run of refused samples from halfway to its feasible neighbours', () => {
    const axis = parameterAxis('turbine.inletTemperatureK', 'si');
    const bands = refusedBands(inletTemperatureSweep.points, axis);
    expect(bands).toHaveLength(1);
    expect(bands[0].from).toBe(400);
    expect(bands[0].to).toBe(650);
    expect(bands[0].reason).toMatch(/compressor delivery temperature/);

    const inside = refusedBands(
      withRefused(pressureRatioSweep, [7, 8]).points,
      parameterAxis('compressor.pressureRatio', 'si'),
    );
    const v = pressureRatioSweep.points.map((p) => p.value);
    expect(inside).toHaveLength(1);
    expectClose(inside[0].from, (v[6] + v[7]) / 2, { abs: 1e-12 }, 'band start');
    expectClose(inside[0].to, (v[8] + v[9]) / 2, { abs: 1e-12 }, 'band end');
    expect(refusedBands(pressureRatioSweep.points, parameterAxis('compressor.pressureRatio', 'si'))).toEqual([]);
  });

  it('reads a refused sample as not feasible with the engine’s reason', () => {
    const axis = parameterAxis('turbine.inletTemperatureK', 'si');
    expect(sampleSentence(inletTemperatureSweep.points[1], axis, 'si')).toMatch(
      /^Turbine inlet temperature 500\.0 K: not feasible\. The turbine inlet temperature \(500 K\) must be above/,
    );
    expect(sampleSentence(inletTemperatureSweep.points[10], axis, 'si')).toMatch(
      /^Turbine inlet temperature 1,400 K: efficiency [\d.]+ %, net work [\d.]+ kJ\/kg$/,
    );
    expect(describeSweep(inletTemperatureSweep, axis, 'si')).toContain('15 samples; 3 not feasible');
  });
});

describe('units of both axes', () => {
  it('shows a temperature in K or °F (NIST SP 811 B.9) and a ratio bare', () => {
    const si = parameterAxis('turbine.inletTemperatureK', 'si');
    const us = parameterAxis('turbine.inletTemperatureK', 'us');
    expect(parameterTitle(si)).toBe('Turbine inlet temperature, K');
    expect(parameterTitle(us)).toBe('Turbine inlet temperature, °F');
    expect(si.toShown(1500)).toBe(1500);
    expectClose(us.toShown(1500), nist.fahrenheitOf(1500), { abs: 1e-9 }, '1500 K in °F');
    expect(parameterTitle(parameterAxis('compressor.pressureRatio', 'us'))).toBe('Pressure ratio');
    expect(parameterAxis('regenerator.effectiveness', 'si').toShown(0.85)).toBeCloseTo(85, 12);
    expect(parameterAxis('regenerator.effectiveness', 'si').unit).toBe('%');
    expect(parameterAxis('netPowerKW', 'us')).toMatchObject({ unit: 'MW' });
  });

  it('shows efficiency in % and net work in kJ/kg or Btu/lb (NIST SP 811 B.8)', () => {
    const figures = pressureRatioSweep.points[5].figures!;
    expect(quantityOf('efficiency', figures, 'us')).toBe(figures.thermalEfficiency * 100);
    expect(quantityOf('netWork', figures, 'si')).toBe(figures.netWorkKJPerKg);
    expectClose(
      quantityOf('netWork', figures, 'us'),
      (figures.netWorkKJPerKg * 1e3) / nist.jPerKgPerBtuPerLb,
      { rel: 1e-6 },
      'net work in Btu/lb',
    );
    expect(quantityTitle('efficiency', 'us')).toBe('Thermal efficiency, %');
    expect(quantityTitle('netWork', 'si')).toBe('Net specific work, kJ/kg');
    expect(quantityTitle('netWork', 'us')).toBe('Net specific work, Btu/lb');
  });

  it('converts the x domain and the optimum into the shown unit', () => {
    const us = parameterAxis('turbine.inletTemperatureK', 'us');
    const domain = parameterDomain(inletTemperatureSweep, us, { value: 1600 });
    expectClose(domain[0], nist.fahrenheitOf(400), { abs: 1e-9 }, 'from');
    expectClose(domain[1], nist.fahrenheitOf(1800), { abs: 1e-9 }, 'to');
    const mark = optimumMark(inletTemperatureSweep, 'efficiency', us, 'us')!;
    expectClose(mark.x, nist.fahrenheitOf(inletTemperatureSweep.optimumEfficiency!.value), { abs: 1e-9 }, 'optimum');
  });
});

describe('optima and the current point', () => {
  it('marks each figure’s optimum where the engine found it, and says when it is at the range end', () => {
    const axis = parameterAxis('compressor.pressureRatio', 'si');
    const efficiency = optimumMark(pressureRatioSweep, 'efficiency', axis, 'si')!;
    const work = optimumMark(pressureRatioSweep, 'netWork', axis, 'si')!;
    expect(efficiency.x).toBe(pressureRatioSweep.optimumEfficiency!.value);
    expect(efficiency.y).toBe(pressureRatioSweep.optimumEfficiency!.figures.thermalEfficiency * 100);
    expect(work.x).toBe(pressureRatioSweep.optimumNetWork!.value);
    // Net work peaks at a lower pressure ratio than efficiency (common practice for a simple cycle).
    expect(work.x).toBeLessThan(efficiency.x);
    expect(efficiency.atRangeEnd).toBe(false);
    // No feasible sample beats the refined optimum.
    for (const p of pressureRatioSweep.points) {
      expect(p.figures!.thermalEfficiency * 100).toBeLessThanOrEqual(efficiency.y + 1e-9);
      expect(p.figures!.netWorkKJPerKg).toBeLessThanOrEqual(work.y + 1e-9);
    }
    const hot = optimumMark(
      inletTemperatureSweep,
      'efficiency',
      parameterAxis('turbine.inletTemperatureK', 'si'),
      'si',
    )!;
    expect(hot.atRangeEnd).toBe(true);
    expect(hot.label).toMatch(/\(end of range\)$/);
  });

  it('keeps the optimum and the current point inside both domains', () => {
    const axis = parameterAxis('compressor.pressureRatio', 'si');
    const current = { value: 30, figures: { thermalEfficiency: 0.47, netWorkKJPerKg: 200 } };
    const beyond = parameterDomain(pressureRatioSweep, axis, { value: 95 });
    expect(beyond).toEqual([2, 95]);
    const x = parameterDomain(pressureRatioSweep, axis, current);
    expect(x[0]).toBe(2);
    expect(x[1]).toBe(80);
    for (const quantity of ['efficiency', 'netWork'] as const) {
      const y = quantityDomain(pressureRatioSweep, quantity, 'si', current)!;
      const mark = optimumMark(pressureRatioSweep, quantity, axis, 'si')!;
      expect(mark.y).toBeLessThan(y[1]);
      expect(quantityOf(quantity, current.figures, 'si')).toBeLessThanOrEqual(y[1]);
      expect(quantityOf(quantity, current.figures, 'si')).toBeGreaterThanOrEqual(y[0]);
      for (const p of pressureRatioSweep.points) {
        const v = quantityOf(quantity, p.figures!, 'si');
        expect(v).toBeGreaterThan(y[0]);
        expect(v).toBeLessThan(y[1]);
      }
    }
  });
});

describe('panels and hit-testing', () => {
  it('stacks two panels of the same height that do not overlap, readable at 360 px', () => {
    for (const width of [328, 720, 1200]) {
      const frames = sweepFrames(width);
      const upper = plotArea(frames.efficiency);
      const lower = plotArea(frames.netWork);
      expect(upper.bottom - upper.top).toBe(lower.bottom - lower.top);
      expect(upper.bottom - upper.top).toBeGreaterThanOrEqual(98);
      // The lower panel's title sits in the 30 px between the panels.
      expect(lower.top - upper.bottom).toBeGreaterThanOrEqual(24);
      expect(lower.bottom).toBeLessThanOrEqual(frames.height - 40);
      expect(upper.left).toBe(lower.left);
      expect(upper.right).toBe(lower.right);
      // One x scale serves both.
      const x = horizontalScale([2, 40], frames.efficiency);
      expect(x(2)).toBe(horizontalScale([2, 40], frames.netWork)(2));
      const yUpper = verticalScale([0, 1], frames.efficiency);
      const yLower = verticalScale([0, 1], frames.netWork);
      expect(yUpper(0)).toBe(upper.bottom);
      expect(yLower(1)).toBe(lower.top);
    }
  });

  it('finds the sample nearest to the pointer, refused ones included', () => {
    const axis = parameterAxis('turbine.inletTemperatureK', 'si');
    expect(nearestSample(inletTemperatureSweep.points, axis, 560)).toBe(2);
    expect(nearestSample(inletTemperatureSweep.points, axis, 640)).toBe(2);
    expect(nearestSample(inletTemperatureSweep.points, axis, 660)).toBe(3);
    expect(nearestSample(inletTemperatureSweep.points, axis, 5000)).toBe(14);
    expect(nearestSample([], axis, 500)).toBeNull();
  });
});
