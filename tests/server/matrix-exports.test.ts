import { parse as parseCsv } from 'csv-parse/sync';
import ExcelJS from 'exceljs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import type { CandidateWire } from '@/server/contracts/board';
import { exportCaution, matrixFigureDefs, matrixFigureKeys, type Matrix } from '@/server/contracts/matrix';

import { createTestApp, type TestUser } from '../helpers/api';
import { discussionTeam } from './fixtures/discussion';
import { scoringTeam, type ScoringTeam } from './fixtures/scoring';

const ctx = createTestApp();
let t: ScoringTeam;
let board: CandidateWire[];
let matrix: Matrix;

function binary(res: any, done: (error: Error | null, body: Buffer) => void) {
  const chunks: Buffer[] = [];
  res.on('data', (c: Buffer) => chunks.push(c));
  res.on('end', () => done(null, Buffer.concat(chunks)));
}
const download = (who: TestUser, path: string) => who.agent.get(path).buffer(true).parse(binary);

beforeAll(async () => {
  t = await scoringTeam(ctx, 'Oona', ['simple', 'regenerative', 'reheat']);
  const [a, b] = t.candidates;
  await t.engineer.agent
    .put(`/api/reviews/${t.reviewId}/scores`)
    .send({
      scores: [
        { candidateId: a, criterionId: 'complexity', score: 5 },
        { candidateId: b, criterionId: 'complexity', score: 3 },
        { candidateId: a, criterionId: 'efficiency', score: 2, reason: 'part-load matters here' },
      ],
    })
    .expect(200);
  board = (await t.lead.agent.get(`/api/reviews/${t.reviewId}/board`).expect(200)).body.candidates;
  matrix = (await t.lead.agent.get(`/api/reviews/${t.reviewId}/matrix`).expect(200)).body;
});
afterAll(() => ctx.close());

/** The engine's value of a figure as the export writes it (efficiency in per cent). */
const engineFigure = (c: CandidateWire, key: (typeof matrixFigureKeys)[number]) =>
  (c.results![key] as number) * matrixFigureDefs[key].scale;

describe('the comparison matrix as CSV', () => {
  it('is an attachment named after the review, with the caution line and every engine figure', async () => {
    const res = await download(t.reviewer, `/api/reviews/${t.reviewId}/matrix.csv`);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^text\/csv/);
    expect(res.headers['content-disposition']).toMatch(/^attachment; filename="?Oona-review-comparison-matrix\.csv"?$/);
    const records = parseCsv(res.body as Buffer, { bom: true, relax_column_count: true }) as string[][];
    expect(records[1]![0]).toBe(exportCaution);
    const headerAt = records.findIndex((r) => r[0] === 'Row');
    expect(records[headerAt]).toEqual(['Row', 'Unit', 'Weight (%)', ...board.map((c) => c.name)]);
    const rowOf = (label: string) => records.find((r) => r[0] === label)!;
    for (const key of matrixFigureKeys) {
      const def = matrixFigureDefs[key];
      const row = rowOf(`${def.label} (${def.unit})`);
      expect(row[1]).toBe(def.unit);
      board.forEach((c, i) => {
        const written = Number(row[3 + i]);
        // Written in full (shortest round-trip), so it reads back as the same double.
        expect(written, `${key} of ${c.name}`).toBe(engineFigure(c, key));
      });
    }
    // Scores: the mean with its spread; a missing mark is an empty cell, never 0.
    const mean = rowOf('Complexity: mean score (score 1-5)');
    expect(mean.slice(3)).toEqual(['5', '3', '']);
    expect(Number(mean[2])).toBeCloseTo(15, 10);
    expect(rowOf('Complexity: people scored (people)').slice(3)).toEqual(['1', '1', '0']);
    const pre = rowOf('Efficiency: pre-score (score 1-5)').slice(3).map(Number);
    board.forEach((c, i) => expect(pre[i]).toBe(matrix.rows[0]!.cells[c.id]!.preScore));
    expect(rowOf('Scored criteria')[5]).toMatch(/^incomplete: no Complexity, Maintainability, First-cost class$/);
    const ranks = rowOf('Rank (1 = best; equal totals share a rank)').slice(3).map(Number);
    expect(ranks).toEqual(board.map((c) => matrix.ranks[c.id]));
  });
});

describe('the comparison matrix as XLSX', () => {
  let book: ExcelJS.Workbook;
  beforeAll(async () => {
    const res = await download(t.observer, `/api/reviews/${t.reviewId}/matrix.xlsx`);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('application/vnd.openxmlformats-officedocument.spreadsheetml.sheet');
    expect(res.headers['content-disposition']).toMatch(
      /^attachment; filename="?Oona-review-comparison-matrix\.xlsx"?$/,
    );
    book = new ExcelJS.Workbook();
    await book.xlsx.load(res.body as unknown as Parameters<typeof book.xlsx.load>[0]);
  });

  it('has the sheet Matrix with the caution line on top and every figure stored as a number', () => {
    const sheet = book.getWorksheet('Matrix')!;
    expect(book.worksheets[0]!.name).toBe('Matrix');
    expect(sheet.getCell('A1').value).toBe(exportCaution);
    const rows: ExcelJS.Row[] = [];
    sheet.eachRow((r) => rows.push(r));
    const rowOf = (label: string) => rows.find((r) => r.getCell(1).value === label)!;
    const header = rowOf('Row');
    expect(board.map((_, i) => header.getCell(4 + i).value)).toEqual(board.map((c) => c.name));
    for (const key of matrixFigureKeys) {
      const def = matrixFigureDefs[key];
      const row = rowOf(`${def.label} (${def.unit})`);
      board.forEach((c, i) => {
        const v = row.getCell(4 + i).value;
        expect(typeof v, `${key} of ${c.name} is a number`).toBe('number');
        expect(v, `${key} of ${c.name}`).toBe(engineFigure(c, key));
      });
    }
    const total = rowOf('Weighted total (score 1-5)');
    board.forEach((c, i) => expect(total.getCell(4 + i).value).toBe(matrix.totals[c.id]!.total));
    // The missing Complexity mark of the third candidate is an empty cell.
    expect(rowOf('Complexity: mean score (score 1-5)').getCell(6).value).toBeNull();
  });

  it('has one sheet per candidate with its state points, T, p, h and s with units', () => {
    expect(book.worksheets.map((w) => w.name)).toEqual(['Matrix', ...board.map((c) => c.name.slice(0, 28))]);
    board.forEach((c, i) => {
      const ws = book.worksheets[i + 1]!;
      expect(ws.getCell('A1').value).toBe(exportCaution);
      const header = ws.getRow(3).values as unknown[];
      expect(header.slice(1, 7)).toEqual(['State', 'Label', 'T (K)', 'p (kPa)', 'h (kJ/kg)', 's (kJ/(kg·K))']);
      const states = c.results!.states as Array<Record<string, number | string>>;
      expect(states.length).toBeGreaterThanOrEqual(4);
      states.forEach((s, k) => {
        const row = ws.getRow(4 + k);
        expect(row.getCell(1).value).toBe(s.n);
        expect(row.getCell(2).value).toBe(s.label);
        expect(row.getCell(3).value).toBe(s.temperatureK);
        expect(row.getCell(4).value).toBe(s.pressureKPa);
        expect(row.getCell(5).value).toBe(s.enthalpyKJPerKg);
        expect(row.getCell(6).value).toBe(s.entropyKJPerKgK);
        expect(row.getCell(7).value).toBe(s.massFlowRatio);
      });
    });
  });
});

describe('an export of a review without candidates', () => {
  it('is refused with 409 and a clear message, for CSV and XLSX alike', async () => {
    const empty = await discussionTeam(ctx, 'Pim', 0);
    for (const ext of ['csv', 'xlsx']) {
      const res = await empty.lead.agent.get(`/api/reviews/${empty.reviewId}/matrix.${ext}`);
      expect(res.status).toBe(409);
      expect(res.body.error.code).toBe('no_candidates');
      expect(res.body.error.message).toMatch(/no candidates yet/);
    }
    // The matrix itself still reads (empty), so the screen can say so.
    const m = await empty.lead.agent.get(`/api/reviews/${empty.reviewId}/matrix`).expect(200);
    expect(m.body.candidates).toEqual([]);
  });
});
