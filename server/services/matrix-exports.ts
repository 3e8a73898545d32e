import { stringify } from 'csv-stringify/sync';
import ExcelJS from 'exceljs';

import type { Database } from '@/db/client';
import type { CandidateWire } from '@/server/contracts/board';
import { exportCaution, type Matrix } from '@/server/contracts/matrix';
import { ApiError } from '@/server/http/errors';

import { listCandidates } from './candidates';
import { matrixOf } from './matrix';

/**
 * The comparison matrix as CSV and XLSX: the same rows in both, candidates as columns, every
 * number a number (a missing one an empty cell, never 0), the unit in each row's label.
 */

export type Cell = string | number | null;
/** A row of the matrix table: label, unit, weight (%), then one value per candidate. */
export type TableRow = { label: string; unit: string; weight: number | null; values: Cell[]; section?: boolean };

const scoreUnit = 'score 1-5';

/** The matrix as rows, in the order the screen shows them. */
export function matrixTable(matrix: Matrix): TableRow[] {
  const ids = matrix.candidates.map((c) => c.id);
  const rows: TableRow[] = [];
  const section = (label: string) =>
    rows.push({ label, unit: '', weight: null, values: ids.map(() => null), section: true });
  section('Engine figures');
  for (const f of matrix.figures) {
    rows.push({
      label: `${f.label} (${f.unit})`,
      unit: f.unit,
      weight: null,
      values: ids.map((id) => f.values[id] ?? null),
    });
  }
  if (matrix.year) {
    section('Site year (first-order estimate without component maps)');
    for (const f of matrix.year.figures) {
      rows.push({
        label: `${f.label} (${f.unit})`,
        unit: f.unit,
        weight: null,
        values: ids.map((id) => f.values[id] ?? null),
      });
    }
  }
  section('Criteria (scores 1 = worst, 5 = best)');
  matrix.rows.forEach((row, i) => {
    const criterion = matrix.criteria[i]!;
    const weight = row.share * 100;
    const of = (pick: (c: Matrix['rows'][number]['cells'][string]) => number | null) =>
      ids.map((id) => pick(row.cells[id]!));
    rows.push({
      label: `${criterion.name}: mean score (${scoreUnit})`,
      unit: scoreUnit,
      weight,
      values: of((c) => c.mean),
    });
    rows.push({
      label: `${criterion.name}: lowest score (${scoreUnit})`,
      unit: scoreUnit,
      weight: null,
      values: of((c) => c.min),
    });
    rows.push({
      label: `${criterion.name}: highest score (${scoreUnit})`,
      unit: scoreUnit,
      weight: null,
      values: of((c) => c.max),
    });
    rows.push({
      label: `${criterion.name}: people scored (people)`,
      unit: 'people',
      weight: null,
      values: of((c) => c.count),
    });
    if (criterion.measure) {
      rows.push({
        label: `${criterion.name}: pre-score (${scoreUnit})`,
        unit: scoreUnit,
        weight: null,
        values: of((c) => c.preScore),
      });
    }
  });
  section('Outcome');
  rows.push({
    label: `Weighted total (${scoreUnit})`,
    unit: scoreUnit,
    weight: 100,
    values: ids.map((id) => matrix.totals[id]!.total),
  });
  rows.push({
    label: 'Scored criteria',
    unit: '',
    weight: null,
    values: ids.map((id) => {
      const missing = matrix.totals[id]!.missing;
      if (missing.length === 0) return 'complete';
      const names = missing.map((m) => matrix.criteria.find((c) => c.id === m)?.name ?? m);
      return `incomplete: no ${names.join(', ')}`;
    }),
  });
  rows.push({
    label: 'Rank (1 = best; equal totals share a rank)',
    unit: 'rank',
    weight: null,
    values: ids.map((id) => matrix.ranks[id] ?? null),
  });
  for (const r of matrix.rounds) {
    rows.push({
      label: `Preference round ${r.number}${r.status === 'open' ? ' (open)' : ''}: votes (votes)`,
      unit: 'votes',
      weight: null,
      values: ids.map((id) => r.tally[id] ?? 0),
    });
  }
  return rows;
}

const kelvin = (k: number) => `${Number(k.toFixed(2))} K`;

/** The site year's line for the notes on top: what it rests on, or null without a year. */
export function yearNote(matrix: Matrix): string | null {
  const y = matrix.year;
  if (!y) return null;
  const profile = y.profile
    ? `hourly profile ${y.profile.fileName} of ${y.profile.hours} h (${kelvin(y.profile.minK)} to ${kelvin(y.profile.maxK)}), ${y.firedHoursPerYear} fired hours a year`
    : 'no hourly profile: hot and cold days only, the year\u2019s figures are empty';
  const days =
    y.hotDayK !== null && y.coldDayK !== null
      ? `; hot day at ${kelvin(y.hotDayK)}, cold day at ${kelvin(y.coldDayK)}`
      : '';
  return `${y.rule} This matrix: ${profile}${days}.`;
}

function headerOf(matrix: Matrix): string[] {
  return ['Row', 'Unit', 'Weight (%)', ...matrix.candidates.map((c) => c.name)];
}

function noCandidates(): ApiError {
  return new ApiError(
    409,
    'no_candidates',
    'This Review has no candidates yet, so there is no comparison matrix to export. Add a candidate on the board first.',
  );
}

/** The review's name for a file name: letters, digits and dashes ('review' when none is left). */
export function reviewFileSlug(reviewName: string): string {
  const slug = reviewName
    .normalize('NFKD')
    .replace(/[^A-Za-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, 60);
  return slug || 'review';
}

/** A file name from the review's name: letters, digits and dashes. */
export function exportFileName(reviewName: string, extension: 'csv' | 'xlsx'): string {
  return `${reviewFileSlug(reviewName)}-comparison-matrix.${extension}`;
}

/** The CSV: the caution line and the rules first, then the header and the rows. */
export function matrixCsv(matrix: Matrix): string {
  const records: Cell[][] = [
    [`Comparison matrix: ${matrix.reviewName}`],
    [exportCaution],
    [matrix.rules.preScore],
    [matrix.rules.total],
    ...(yearNote(matrix) ? [[yearNote(matrix)]] : []),
    [`Made ${matrix.madeAt} from design basis revision ${matrix.basisRevision}`],
    headerOf(matrix),
    ...matrixTable(matrix)
      .filter((r) => !r.section)
      .map((r) => [r.label, r.unit, r.weight, ...r.values]),
  ];
  return stringify(records.map((r) => r.map((v) => (v === null ? '' : v))));
}

type StatePoint = {
  n: number;
  label: string;
  temperatureK: number;
  pressureKPa: number;
  enthalpyKJPerKg: number;
  entropyKJPerKgK: number;
  massFlowRatio: number;
};

function statesOf(c: CandidateWire): StatePoint[] {
  const states = c.results?.states;
  return Array.isArray(states) ? (states as StatePoint[]) : [];
}

/** Excel's sheet names: at most 31 characters, none of : \ / ? * [ ], unique in the book. */
function sheetName(name: string, taken: Set<string>): string {
  const base =
    name
      .replace(/[:\\/?*[\]]/g, ' ')
      .trim()
      .slice(0, 28) || 'Candidate';
  let candidate = base;
  for (let n = 2; taken.has(candidate.toLowerCase()); n++) candidate = `${base.slice(0, 26)} ${n}`;
  taken.add(candidate.toLowerCase());
  return candidate;
}

const numberFormat = '0.000';

/**
 * The XLSX: sheet "Matrix" (caution line on top, then the rules and the table) and one sheet
 * per candidate with its state points (T, p, h, s with units in the headers).
 */
export async function matrixXlsx(matrix: Matrix, candidates: CandidateWire[]): Promise<Buffer> {
  const book = new ExcelJS.Workbook();
  book.creator = 'Cyclemoot';
  book.created = new Date(matrix.madeAt);
  const sheet = book.addWorksheet('Matrix');
  const width = 3 + matrix.candidates.length;
  const note = (text: string, bold = false) => {
    const row = sheet.addRow([text]);
    sheet.mergeCells(row.number, 1, row.number, width);
    row.getCell(1).font = { italic: !bold, bold };
    row.getCell(1).alignment = { wrapText: true, vertical: 'top' };
  };
  note(exportCaution);
  note(`Comparison matrix: ${matrix.reviewName}`, true);
  note(matrix.rules.preScore);
  note(matrix.rules.total);
  const year = yearNote(matrix);
  if (year) note(year);
  note(`Made ${matrix.madeAt} from design basis revision ${matrix.basisRevision}`);
  const header = sheet.addRow(headerOf(matrix));
  header.font = { bold: true };
  for (const r of matrixTable(matrix)) {
    const row = sheet.addRow([r.label, r.unit, r.weight, ...r.values]);
    if (r.section) row.font = { bold: true };
    row.eachCell((cell) => {
      if (typeof cell.value === 'number' && !Number.isInteger(cell.value)) cell.numFmt = numberFormat;
    });
  }
  sheet.getColumn(1).width = 48;
  sheet.getColumn(2).width = 12;
  sheet.getColumn(3).width = 12;
  for (let i = 4; i <= width; i++) sheet.getColumn(i).width = 18;
  sheet.views = [{ state: 'frozen', xSplit: 1, ySplit: header.number }];

  const taken = new Set(['matrix']);
  for (const c of candidates) {
    const ws = book.addWorksheet(sheetName(c.name, taken));
    ws.addRow([exportCaution]).getCell(1).font = { italic: true };
    ws.mergeCells(1, 1, 1, 7);
    ws.addRow([`Candidate: ${c.name}, state points (per kg of compressor inlet air)`]).font = { bold: true };
    if (!c.results) {
      ws.addRow([`The engine refused this candidate: ${c.error?.message ?? 'no results'}`]);
      continue;
    }
    ws.addRow([
      'State',
      'Label',
      'T (K)',
      'p (kPa)',
      'h (kJ/kg)',
      's (kJ/(kg·K))',
      'Mass flow (kg per kg of inlet air)',
    ]).font = { bold: true };
    for (const s of statesOf(c)) {
      ws.addRow([s.n, s.label, s.temperatureK, s.pressureKPa, s.enthalpyKJPerKg, s.entropyKJPerKgK, s.massFlowRatio]);
    }
    ws.getColumn(2).width = 28;
    for (const i of [3, 4, 5, 6]) ws.getColumn(i).numFmt = numberFormat;
    for (const i of [1, 3, 4, 5, 6, 7]) ws.getColumn(i).width = i === 7 ? 34 : 14;
  }
  return Buffer.from(await book.xlsx.writeBuffer());
}

/** What the export routes send: the matrix of a review with candidates, else 409. */
export async function matrixExport(
  db: Database,
  reviewId: string,
  viewerId: string,
  kind: 'csv' | 'xlsx',
): Promise<{ fileName: string; body: string | Buffer }> {
  const matrix = await matrixOf(db, reviewId, viewerId);
  if (matrix.candidates.length === 0) throw noCandidates();
  const fileName = exportFileName(matrix.reviewName, kind);
  if (kind === 'csv') return { fileName, body: matrixCsv(matrix) };
  return { fileName, body: await matrixXlsx(matrix, await listCandidates(db, reviewId)) };
}
