import { describe, expect, it } from 'vitest';

import { rowsOf, showFigure, sortCandidates } from '@/components/screens/matrix/matrix-model';
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
