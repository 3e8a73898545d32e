import { describe, expect, it } from 'vitest';

import { nearestPoint, plotArea, type Point } from '@/components/diagrams/scales';
import {
  describeCycle,
  describeOverlay,
  DOMAIN_PADDING,
  pathRole,
  placeMarkers,
  projectCycle,
  projectPath,
  shownPoints,
  stateQuantities,
  stateSentence,
  toShown,
  tsDomain,
  tsFrame,
  tsLook,
  tsScales,
  tsTicks,
  tsUnits,
} from '@/components/diagrams/ts-geometry';
import type { DiagramCycle, DiagramPathKind } from '@/components/diagrams/types';
import type { UnitSystem } from '@/components/ui/format';
import { expectClose } from '@/tests/helpers/expect-close';

import { fixtures, irrCycle, simpleCycle } from './fixtures';

/**
 * T-s geometry on real engine output (tests/app/diagrams/fixtures.ts): a simple cycle and an
 * intercooled + reheat + regenerative one, at card size on a 360 px phone (the card's inner
 * width, about 300 px) and at detail size.
 */

/** NIST SP 811 (2008), Appendix B, the relations and factors the axes must follow. */
const nist = {
  /** 1 Btu_IT/(lb·°F) = 4.1868 E+03 J/(kg·K), exact (B.8) — from memory; °R has the size of °F. */
  jPerKgKPerBtuPerLbR: 4.1868e3,
  /** t/°F = 1.8 · T/K − 459.67 (B.9, "temperature") — from memory. */
  fahrenheitOf: (kelvin: number) => 1.8 * kelvin - 459.67,
} as const;

const systems: UnitSystem[] = ['si', 'us'];
const cardWidth = 300;
const detailWidth = 720;
const px = { abs: 1e-6 } as const;

function drawing(cycle: DiagramCycle, system: UnitSystem, size: 'small' | 'large', width: number) {
  const domain = tsDomain([cycle], system)!;
  const frame = tsFrame(size, width);
  const scales = tsScales(domain, frame);
  return { domain, frame, scales, ...projectCycle(cycle, scales, system) };
}

/** The points of a `d` string, as numbers. */
function pointsOfD(d: string): Point[] {
  return [...d.matchAll(/[ML](-?[\d.]+),(-?[\d.]+)/g)].map((m) => ({ x: Number(m[1]), y: Number(m[2]) }));
}

describe.each(fixtures)('T-s geometry of the $name cycle', ({ cycle }) => {
  describe.each(systems)('in %s units', (system) => {
    it('has a domain that holds every state and every path point, padded on each side', () => {
      const { domain } = drawing(cycle, system, 'small', cardWidth);
      const points = shownPoints([cycle], system);
      const pathPoints = cycle.paths.reduce((n, p) => n + p.temperatureK.length, 0);
      expect(points.length).toBe(cycle.states.length + pathPoints);
      for (const p of points) {
        expect(p.x).toBeGreaterThan(domain.entropy[0]);
        expect(p.x).toBeLessThan(domain.entropy[1]);
        expect(p.y).toBeGreaterThan(domain.temperature[0]);
        expect(p.y).toBeLessThan(domain.temperature[1]);
      }
      // The padding is DOMAIN_PADDING of the span, no more: the loop fills the plot.
      const xs = points.map((p) => p.x);
      const ys = points.map((p) => p.y);
      const sSpan = Math.max(...xs) - Math.min(...xs);
      const tSpan = Math.max(...ys) - Math.min(...ys);
      expectClose(domain.entropy[0], Math.min(...xs) - DOMAIN_PADDING * sSpan, { rel: 1e-12 }, 's low');
      expectClose(domain.entropy[1], Math.max(...xs) + DOMAIN_PADDING * sSpan, { rel: 1e-12 }, 's high');
      expectClose(domain.temperature[0], Math.min(...ys) - DOMAIN_PADDING * tSpan, { rel: 1e-12 }, 'T low');
      expectClose(domain.temperature[1], Math.max(...ys) + DOMAIN_PADDING * tSpan, { rel: 1e-12 }, 'T high');
    });

    it('joins each path to the states it runs between, through exactly the engine’s points', () => {
      const { paths, states, scales } = drawing(cycle, system, 'large', detailWidth);
      expect(paths.length).toBe(cycle.paths.length);
      const byNumber = new Map(states.map((s) => [s.state.n, s]));
      paths.forEach((path, i) => {
        const from = byNumber.get(path.from)!;
        const to = byNumber.get(path.to)!;
        expect(from, `state ${path.from}`).toBeDefined();
        expect(to, `state ${path.to}`).toBeDefined();
        expectClose(path.points[0].x, from.x, px, `${path.kind} ${path.from}→${path.to} start x`);
        expectClose(path.points[0].y, from.y, px, `${path.kind} ${path.from}→${path.to} start y`);
        expectClose(path.points.at(-1)!.x, to.x, px, `${path.kind} ${path.from}→${path.to} end x`);
        expectClose(path.points.at(-1)!.y, to.y, px, `${path.kind} ${path.from}→${path.to} end y`);
        // The `d` string carries every point of the engine's curve, to 0.01 px, in order.
        const engine = cycle.paths[i];
        const inD = pointsOfD(path.d);
        expect(inD.length).toBe(engine.temperatureK.length);
        inD.forEach((p, j) => {
          const shown = toShown(engine.temperatureK[j], engine.entropyKJPerKgK[j], system);
          expectClose(p.x, scales.x(shown.x), { abs: 0.006 }, `point ${j} x`);
          expectClose(p.y, scales.y(shown.y), { abs: 0.006 }, `point ${j} y`);
        });
      });
    });

    it('draws the loop closed: every state begins one path and ends another', () => {
      const { paths } = drawing(cycle, system, 'small', cardWidth);
      for (const s of cycle.states) {
        expect(paths.filter((p) => p.from === s.n).length, `paths from ${s.n}`).toBe(1);
        expect(paths.filter((p) => p.to === s.n).length, `paths to ${s.n}`).toBe(1);
      }
    });

    it('puts ticks in the shown unit, inside the domain, where those values are drawn', () => {
      for (const [size, width] of [
        ['small', cardWidth],
        ['large', detailWidth],
      ] as const) {
        const { domain, frame, scales } = drawing(cycle, system, size, width);
        const ticks = tsTicks(scales, frame, size);
        expect(ticks.x.length).toBeGreaterThanOrEqual(2);
        expect(ticks.y.length).toBeGreaterThanOrEqual(3);
        for (const t of ticks.x) {
          expect(t.value).toBeGreaterThanOrEqual(domain.entropy[0]);
          expect(t.value).toBeLessThanOrEqual(domain.entropy[1]);
          expect(Number(t.label.replace(/,/g, '').replace('−', '-'))).toBeCloseTo(t.value, 10);
        }
        for (const t of ticks.y) {
          expect(t.value).toBeGreaterThanOrEqual(domain.temperature[0]);
          expect(t.value).toBeLessThanOrEqual(domain.temperature[1]);
          expect(Number(t.label.replace(/,/g, '').replace('−', '-'))).toBeCloseTo(t.value, 10);
        }
        // A tick labelled in °F sits where a state of that temperature in °F is drawn.
        const t = ticks.y[1];
        const kelvin = system === 'si' ? t.value : (t.value + 459.67) / 1.8;
        const state = projectCycle(
          { states: [{ ...cycle.states[0], temperatureK: kelvin }], paths: [] },
          scales,
          system,
        ).states[0];
        expectClose(state.y, t.at, px, `tick ${t.label} position`);
      }
    });

    it('keeps a card readable at 360 px: few ticks, tick labels apart, no state circles overlapping', () => {
      const { frame, scales, states } = drawing(cycle, system, 'small', cardWidth);
      expect(frame.height).toBeGreaterThanOrEqual(160);
      const ticks = tsTicks(scales, frame, 'small');
      expect(ticks.x.length).toBeLessThanOrEqual(4);
      expect(ticks.y.length).toBeLessThanOrEqual(6);
      // Plex Mono at 10 px is 6 px a figure; labels need that much room plus a gap.
      const charWidth = 0.6 * tsLook.small.tickFont;
      for (let i = 1; i < ticks.x.length; i++) {
        const room = ticks.x[i].at - ticks.x[i - 1].at;
        const needed = ((ticks.x[i].label.length + ticks.x[i - 1].label.length) / 2) * charWidth + 8;
        expect(room, `x ticks ${ticks.x[i - 1].label} and ${ticks.x[i].label}`).toBeGreaterThan(needed);
      }
      for (let i = 1; i < ticks.y.length; i++) {
        expect(Math.abs(ticks.y[i].at - ticks.y[i - 1].at)).toBeGreaterThan(tsLook.small.tickFont + 4);
      }
      const r = tsLook.small.markerRadius;
      const area = plotArea(frame);
      const markers = placeMarkers(states, r, area);
      for (let i = 0; i < markers.length; i++) {
        expect(markers[i].x).toBeGreaterThanOrEqual(area.left + r - 1e-9);
        expect(markers[i].x).toBeLessThanOrEqual(area.right - r + 1e-9);
        expect(markers[i].y).toBeGreaterThanOrEqual(area.top + r - 1e-9);
        expect(markers[i].y).toBeLessThanOrEqual(area.bottom - r + 1e-9);
        for (let j = i + 1; j < markers.length; j++) {
          const d = Math.hypot(markers[i].x - markers[j].x, markers[i].y - markers[j].y);
          expect(d, `circles ${i + 1} and ${j + 1}`).toBeGreaterThanOrEqual(2 * r);
        }
        // A circle stays near its state: within two of its own sizes.
        expect(Math.hypot(markers[i].x - states[i].x, markers[i].y - states[i].y)).toBeLessThan(4 * r);
      }
    });

    it('finds the nearest state to a pointer, and none beyond reach', () => {
      const { states } = drawing(cycle, system, 'small', cardWidth);
      states.forEach((s, i) => {
        const found = nearestPoint(states, { x: s.x + 2, y: s.y - 2 }, 28);
        // Only a state within 6 px of this one (the same point to a finger) may win instead.
        const rivals = states.filter((o, j) => j !== i && Math.hypot(o.x - s.x, o.y - s.y) < 6);
        if (rivals.length === 0) expect(found, `near state ${s.state.n}`).toBe(i);
        else expect(found, `near state ${s.state.n}`).not.toBeNull();
      });
      expect(nearestPoint(states, { x: -500, y: -500 }, 28)).toBeNull();
    });
  });
});

describe('nearest state', () => {
  const points = [
    { x: 10, y: 10 },
    { x: 50, y: 10 },
    { x: 50, y: 60 },
  ];
  it('picks the closer of two states either side of the midpoint', () => {
    expect(nearestPoint(points, { x: 29, y: 10 })).toBe(0);
    expect(nearestPoint(points, { x: 31, y: 10 })).toBe(1);
    expect(nearestPoint(points, { x: 50, y: 40 })).toBe(2);
  });
  it('answers null beyond the reach and for no states', () => {
    expect(nearestPoint(points, { x: 100, y: 100 }, 20)).toBeNull();
    expect(nearestPoint([], { x: 0, y: 0 })).toBeNull();
  });
  it('counts a state exactly at the reach', () => {
    expect(nearestPoint(points, { x: 10, y: 30 }, 20)).toBe(0);
  });
});

describe('state circles', () => {
  it('parts circles of states that coincide, and leaves lone circles on their states', () => {
    const bounds = { left: 0, right: 300, top: 0, bottom: 200 };
    const placed = placeMarkers(
      [
        { x: 100, y: 100 },
        { x: 100, y: 100 },
        { x: 104, y: 98 },
        { x: 250, y: 40 },
      ],
      8,
      bounds,
    );
    for (let i = 0; i < 3; i++) {
      for (let j = i + 1; j < 3; j++) {
        expect(Math.hypot(placed[i].x - placed[j].x, placed[i].y - placed[j].y)).toBeGreaterThanOrEqual(16);
      }
    }
    expect(placed[3]).toEqual({ x: 250, y: 40 });
  });
});

describe('axes in SI and US customary against NIST SP 811', () => {
  it('names entropy in kJ/(kg·K) or Btu/(lb·°R) and temperature in K or °F', () => {
    expect(tsUnits('si')).toEqual({ entropy: 'kJ/(kg·K)', temperature: 'K' });
    expect(tsUnits('us')).toEqual({ entropy: 'Btu/(lb·°R)', temperature: '°F' });
  });

  it('places every state at its value in the shown unit', () => {
    for (const s of irrCycle.states) {
      const si = toShown(s.temperatureK, s.entropyKJPerKgK, 'si');
      expect(si).toEqual({ x: s.entropyKJPerKgK, y: s.temperatureK });
      const us = toShown(s.temperatureK, s.entropyKJPerKgK, 'us');
      expectClose(us.x, (s.entropyKJPerKgK * 1e3) / nist.jPerKgKPerBtuPerLbR, { rel: 1e-6 }, `s of ${s.n}`);
      expectClose(us.y, nist.fahrenheitOf(s.temperatureK), { abs: 1e-9 }, `T of ${s.n}`);
    }
  });

  it('converts the domain too: the US domain is the SI domain through the same factors', () => {
    const si = tsDomain([simpleCycle], 'si')!;
    const us = tsDomain([simpleCycle], 'us')!;
    expectClose(us.entropy[0], (si.entropy[0] * 1e3) / nist.jPerKgKPerBtuPerLbR, { rel: 1e-6 }, 's low');
    expectClose(us.entropy[1], (si.entropy[1] * 1e3) / nist.jPerKgKPerBtuPerLbR, { rel: 1e-6 }, 's high');
    expectClose(us.temperature[0], nist.fahrenheitOf(si.temperature[0]), { abs: 1e-9 }, 'T low');
    expectClose(us.temperature[1], nist.fahrenheitOf(si.temperature[1]), { abs: 1e-9 }, 'T high');
  });

  it('reads T, p, h, s with their units in both systems', () => {
    const s3 = simpleCycle.states[2];
    expect(stateQuantities(s3, 'si').map((q) => `${q.symbol} ${q.shown.unit}`)).toEqual([
      'T K',
      'p kPa',
      'h kJ/kg',
      's kJ/(kg·K)',
    ]);
    expect(stateQuantities(s3, 'us').map((q) => `${q.symbol} ${q.shown.unit}`)).toEqual([
      'T °F',
      'p psia',
      'h Btu/lb',
      's Btu/(lb·°R)',
    ]);
    expect(stateSentence(s3, 'si')).toBe(
      `State 3, combustor exit: T 1,500 K, p ${stateQuantities(s3, 'si')[1].shown.value} kPa, h ${
        stateQuantities(s3, 'si')[2].shown.value
      } kJ/kg, s ${stateQuantities(s3, 'si')[3].shown.value} kJ/(kg·K)`,
    );
  });
});

describe('colours by process', () => {
  it('heat added copper, heat rejected glacier, compression and expansion in the loop colour', () => {
    const expected: Record<DiagramPathKind, string> = {
      'heat-addition': 'heat-added',
      'regenerator-heating': 'heat-added',
      'heat-rejection': 'heat-rejected',
      'regenerator-cooling': 'heat-rejected',
      compression: 'work',
      expansion: 'work',
    };
    for (const [kind, role] of Object.entries(expected)) expect(pathRole(kind as DiagramPathKind)).toBe(role);
    const kinds = new Set(irrCycle.paths.map((p) => p.kind));
    expect(kinds.size).toBe(6);
  });
});

describe('the diagram in words', () => {
  it('names the candidate, the number of states and both ranges with units', () => {
    expect(describeCycle('Simple', simpleCycle, 'si')).toMatch(
      /^T-s diagram of Simple: 4 states, T from 288\.2 K to 1,500 K, s from 6\.865 to 7\.996 kJ\/\(kg·K\)$/,
    );
    expect(describeCycle('IRR', irrCycle, 'us')).toMatch(
      /^T-s diagram of IRR: 10 states, T from 59\.00 °F to 2,24\d °F, s from [\d.]+ to [\d.]+ Btu\/\(lb·°R\)$/,
    );
    expect(
      describeOverlay(
        [
          { name: 'Simple', cycle: simpleCycle },
          { name: 'IRR', cycle: irrCycle },
        ],
        'si',
      ),
    ).toMatch(/^T-s diagrams of 2 candidates: Simple, IRR; T from 288\.2 K to 1,500 K/);
  });

  it('projects a lone path without its states (the overlay uses the same projection)', () => {
    const { scales } = drawing(simpleCycle, 'si', 'small', cardWidth);
    const p = projectPath(simpleCycle.paths[0], scales, 'si');
    expect(p.role).toBe('work');
    expect(p.d.startsWith('M')).toBe(true);
  });
});
