import { describe, expect, it } from 'vitest';

import { rowsOf, showFigure, showYearFigure, sortCandidates } from '@/components/screens/matrix/matrix-model';
import type { CandidateYear } from '@/server/contracts/site-year';
import { buildMatrix } from '@/server/services/matrix';

const cand = (id: string, results: Record<string, number> | null) => ({
  id,
  name: id,
  colour: '#000000',
  status: 'proposed' as const,
  results,
});

const matrix = buildMatrix({
  reviewId: 'r',
  reviewName: 'R',
  basisRevision: 1,
  criteria: [{ id: 'complexity', name: 'Complexity', weight: 1, measure: null }],
  candidates: [
    cand('a', { thermalEfficiency: 0.4, exhaustTemperatureK: 800 }),
    cand('b', null),
    cand('c', { thermalEfficiency: 0.45, exhaustTemperatureK: 700 }),
  ],
  scores: [
    { userId: 'u', candidateId: 'a', criterionId: 'complexity', score: 3 },
    { userId: 'u', candidateId: 'c', criterionId: 'complexity', score: 3 },
  ],
  rounds: [],
});

describe('the matrix on screen', () => {
  it('shows figures in the reader’s units', () => {
    expect(showFigure('exhaustTemperatureK', 800, 'si')).toEqual({ value: '800.0', unit: 'K' });
    expect(showFigure('exhaustTemperatureK', 800, 'us').unit).toBe('°F');
    expect(showFigure('netWorkKJPerKg', 400, 'us').unit).toBe('Btu/lb');
    expect(showFigure('thermalEfficiency', 41.6, 'us')).toEqual({ value: '41.6', unit: '%' });
  });

  it('shows a missing score and a refused candidate as such, and a tie as =n', () => {
    const rows = rowsOf(matrix, 'si');
    const complexity = rows.find((r) => r.key === 'criterion-complexity')!;
    expect(complexity.cells.b).toMatchObject({ value: 'not scored', missing: true, sortValue: null });
    expect(rows.find((r) => r.key === 'figure-thermalEfficiency')!.cells.b).toMatchObject({ value: 'no result' });
    const rank = rows.find((r) => r.key === 'rank')!;
    expect([rank.cells.a!.value, rank.cells.c!.value, rank.cells.b!.value]).toEqual(['=1', '=1', 'no rank']);
  });

  it('sorts by a row, best first, missing last; reversed keeps missing last', () => {
    const rows = rowsOf(matrix, 'si');
    const by = (rowKey: string, reversed = false) => sortCandidates(matrix, rows, { rowKey, reversed });
    expect(by('figure-thermalEfficiency')).toEqual(['c', 'a', 'b']);
    expect(by('figure-thermalEfficiency', true)).toEqual(['a', 'c', 'b']);
    expect(by('rank')).toEqual(['a', 'c', 'b']);
    expect(sortCandidates(matrix, rows, null)).toEqual(['a', 'b', 'c']);
  });
});

describe('the site year on the matrix screen', () => {
  const year = (id: string, hotDayKW: number | null, fuelTonnes: number | null): CandidateYear => ({
    candidateId: id,
    revision: 1,
    ratingCurve: [],
    hotDayKW,
    hotDayK: 303.15,
    coldDayKW: hotDayKW === null ? null : hotDayKW * 1.2,
    coldDayK: 253.15,
    requiredKW: 50_000,
    annual:
      fuelTonnes === null
        ? null
        : {
            energyMWh: 280_000,
            fuelTonnes,
            co2Tonnes: fuelTonnes * 2.75,
            meanHeatRateKJPerKWh: 10_000,
            shortfallHours: 12,
            shortfallProfileHours: 20,
            firedHours: 6000,
          },
    error: hotDayKW === null ? 'refused' : null,
  });
  const withYear = (profile: boolean) =>
    buildMatrix({
      reviewId: 'r',
      reviewName: 'R',
      basisRevision: 1,
      criteria: [],
      candidates: [cand('a', { thermalEfficiency: 0.4 }), cand('b', null), cand('c', { thermalEfficiency: 0.45 })],
      scores: [],
      rounds: [],
      siteYear: {
        profile: profile
          ? {
              hours: 8760,
              rows: 8760,
              minK: 253.15,
              maxK: 303.15,
              meanK: 280,
              hasPressure: false,
              fileName: 'y.csv',
              uploadedBy: null,
              updatedAt: '2026-12-03T00:00:00.000Z',
            }
          : null,
        firedHoursPerYear: 6000,
        candidates: [
          year('a', 45_000, profile ? 60_000 : null),
          year('b', null, null),
          year('c', 47_000, profile ? 55_000 : null),
        ],
      },
    });

  it('puts the year figures under a Site year group, in units, with the caption', () => {
    const rows = rowsOf(withYear(true), 'si');
    const year = rows.filter((r) => r.kind === 'year');
    expect(year.map((r) => r.key)).toEqual([
      'year-hotDayKW',
      'year-coldDayKW',
      'year-energyMWh',
      'year-fuelTonnes',
      'year-co2Tonnes',
      'year-meanHeatRateKJPerKWh',
      'year-shortfallHours',
    ]);
    expect(year[0]!.group?.title).toBe('Site year');
    expect(year[0]!.group?.caption).toContain('First-order estimate without component maps');
    expect(year.slice(1).every((r) => r.group === undefined)).toBe(true);
    // After the engine figures, before the criteria and the total.
    const at = (key: string) => rows.findIndex((r) => r.key === key);
    expect(at('year-hotDayKW')).toBeGreaterThan(at('figure-backWorkRatio'));
    expect(at('year-shortfallHours')).toBeLessThan(at('total'));
    expect(year[0]!.sub).toBe('at 30.0 °C · MW');
    expect(year[0]!.cells.a).toMatchObject({ value: '45.00', unit: 'MW', sortValue: 45_000 });
    expect(year.find((r) => r.key === 'year-fuelTonnes')!.cells.c).toMatchObject({ value: '55,000', unit: 't' });
    expect(year.find((r) => r.key === 'year-shortfallHours')!.cells.a).toMatchObject({ value: '12', unit: 'h' });
    // A refused candidate: a dash, never 0.
    for (const r of year) expect(r.cells.b).toMatchObject({ value: '—', missing: true, sortValue: null });
  });

  it('shows US customary units where the reader asks for them', () => {
    expect(showYearFigure('meanHeatRateKJPerKWh', 10_000, 'us').unit).toBe('Btu/kWh');
    expect(showYearFigure('hotDayKW', 500, 'us').unit).toBe('hp');
    expect(showYearFigure('fuelTonnes', 1000, 'us')).toEqual({ value: '1,102', unit: 'short tons' });
    const rows = rowsOf(withYear(true), 'us');
    expect(rows.find((r) => r.key === 'year-hotDayKW')!.sub).toBe('at 86.0 °F · MW');
  });

  it('without a profile shows the hot and cold days and a dash for the year, saying why', () => {
    const rows = rowsOf(withYear(false), 'si');
    expect(rows.find((r) => r.key === 'year-hotDayKW')!.cells.a!.missing).toBeUndefined();
    const energy = rows.find((r) => r.key === 'year-energyMWh')!;
    expect(energy.cells.a).toMatchObject({ value: '—', note: 'no site profile', sortValue: null });
    expect(energy.sub).toBeUndefined();
    expect(rows.find((r) => r.key === 'year-hotDayKW')!.group?.caption).toContain('no hourly profile');
  });

  it('sorts by a year row: most capacity first, least fuel first, missing last', () => {
    const m = withYear(true);
    const rows = rowsOf(m, 'si');
    expect(sortCandidates(m, rows, { rowKey: 'year-hotDayKW', reversed: false })).toEqual(['c', 'a', 'b']);
    expect(sortCandidates(m, rows, { rowKey: 'year-fuelTonnes', reversed: false })).toEqual(['c', 'a', 'b']);
    expect(sortCandidates(m, rows, { rowKey: 'year-fuelTonnes', reversed: true })).toEqual(['a', 'c', 'b']);
  });
});
