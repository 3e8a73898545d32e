import { parse as parseCsv } from 'csv-parse/sync';
import ExcelJS from 'exceljs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { decisionSnapshotSchema } from '@/server/contracts/decision';
import {
  matrixSchema,
  matrixYearFigureDefs,
  matrixYearFigureKeys,
  type Matrix,
  type MatrixYearFigureKey,
} from '@/server/contracts/matrix';
import { siteYearSchema, type CandidateYear, type SiteYear } from '@/server/contracts/site-year';
import { demoSiteYearCsv } from '@/server/ops/demo-site-year';
import { buildMatrix, type MatrixInputs } from '@/server/services/matrix';

import { createTestApp, type TestUser } from '../helpers/api';
import { scoringTeam, type ScoringTeam } from './fixtures/scoring';

/**
 * The site year in the comparison matrix: each candidate's hot and cold days and its year
 * (energy, fuel, CO2, mean heat rate, short hours) as GET site-year gives them, with and
 * without an hourly profile, and the same figures in the CSV and XLSX read back.
 */

/** A figure of one candidate's year as GET site-year gives it (null where it has none). */
const fromYear = (y: CandidateYear | undefined, key: MatrixYearFigureKey): number | null => {
  if (!y || y.error) return null;
  if (key === 'hotDayKW' || key === 'coldDayKW') return y[key];
  return y.annual ? y.annual[key] : null;
};

describe('buildMatrix with a site year', () => {
  const cand = (id: string) => ({
    id,
    name: id,
    colour: '#000000',
    status: 'proposed' as const,
    results: { thermalEfficiency: 0.4 },
  });
  const year = (id: string, over: Partial<CandidateYear> = {}): CandidateYear => ({
    candidateId: id,
    revision: 1,
    ratingCurve: [],
    hotDayKW: 44_000,
    hotDayK: 305.15,
    coldDayKW: 58_000,
    coldDayK: 250.15,
    requiredKW: 50_000,
    annual: {
      energyMWh: 290_000,
      fuelTonnes: 60_000,
      co2Tonnes: 165_000,
      meanHeatRateKJPerKWh: 10_500,
      shortfallHours: 700,
      shortfallProfileHours: 1000,
      firedHours: 6000,
    },
    error: null,
    ...over,
  });
  const base: MatrixInputs = {
    reviewId: 'r',
    reviewName: 'R',
    basisRevision: 1,
    criteria: [],
    candidates: [cand('a'), cand('b'), cand('c'), cand('d')],
    scores: [],
    rounds: [],
  };
  const siteYear: SiteYear = {
    profile: null,
    firedHoursPerYear: 6000,
    candidates: [
      year('b', { hotDayK: 0, coldDayK: 0, hotDayKW: null, coldDayKW: null, annual: null, error: 'refused' }),
      year('a'),
      year('c', { annual: null, hotDayKW: Number.NaN }),
    ],
  };

  it('is the matrix without `year` when no site year is given, and still parses', () => {
    const m = buildMatrix(base);
    expect('year' in m).toBe(false);
    expect(matrixSchema.parse(m)).toEqual(m);
  });

  it("takes each candidate's figures by id; a refused or absent candidate and a missing year are null, never 0", () => {
    const m = buildMatrix({ ...base, siteYear });
    const y = m.year!;
    expect(y.figures.map((f) => f.key)).toEqual([...matrixYearFigureKeys]);
    // The hot and cold days' ambient from the first candidate with a year, not the refused one's 0.
    expect([y.hotDayK, y.coldDayK]).toEqual([305.15, 250.15]);
    const of = (key: MatrixYearFigureKey) => y.figures.find((f) => f.key === key)!.values;
    expect(of('hotDayKW')).toEqual({ a: 44_000, b: null, c: null, d: null });
    expect(of('coldDayKW')).toEqual({ a: 58_000, b: null, c: 58_000, d: null });
    expect(of('energyMWh')).toEqual({ a: 290_000, b: null, c: null, d: null });
    expect(of('shortfallHours')).toEqual({ a: 700, b: null, c: null, d: null });
    for (const f of y.figures)
      expect([f.label, f.unit]).toEqual([matrixYearFigureDefs[f.key].label, matrixYearFigureDefs[f.key].unit]);
    expect(y.rule).toContain('first-order estimate without component maps');
    expect(matrixSchema.parse(m)).toEqual(m);
  });
});

describe('the site year in the matrix on a real server', () => {
  const ctx = createTestApp();
  let t: ScoringTeam;
  let refusedId: string;
  const matrixNow = async (who: TestUser = t.observer) =>
    matrixSchema.parse((await who.agent.get(`/api/reviews/${t.reviewId}/matrix`).expect(200)).body);
  const siteYearNow = async () =>
    siteYearSchema.parse((await t.observer.agent.get(`/api/reviews/${t.reviewId}/site-year`).expect(200)).body);

  function binary(res: any, done: (error: Error | null, body: Buffer) => void) {
    const chunks: Buffer[] = [];
    res.on('data', (c: Buffer) => chunks.push(c));
    res.on('end', () => done(null, Buffer.concat(chunks)));
  }
  const download = async (ext: 'csv' | 'xlsx') => {
    const res = await t.reviewer.agent
      .get(`/api/reviews/${t.reviewId}/matrix.${ext}`)
      .buffer(true)
      .parse(binary)
      .expect(200);
    return res.body as Buffer;
  };
  const label = (key: MatrixYearFigureKey) => `${matrixYearFigureDefs[key].label} (${matrixYearFigureDefs[key].unit})`;

  /** Every year figure of the matrix equals GET site-year's, candidate by candidate. */
  function expectSameFigures(m: Matrix, year: SiteYear) {
    expect(m.year, 'the matrix has its year').toBeDefined();
    const ids = [...t.candidates, refusedId];
    expect(m.candidates.map((c) => c.id)).toEqual(ids);
    for (const key of matrixYearFigureKeys) {
      const row = m.year!.figures.find((f) => f.key === key)!;
      expect(row.unit).toBe(matrixYearFigureDefs[key].unit);
      for (const id of ids) {
        const y = year.candidates.find((c) => c.candidateId === id);
        expect(row.values[id], `${key} of ${id}`).toBe(fromYear(y, key));
      }
    }
  }

  /** The year's rows of an export, read back as label → values per candidate. */
  function csvYear(body: Buffer) {
    const records = parseCsv(body, { bom: true, relax_column_count: true }) as string[][];
    return (key: MatrixYearFigureKey) => {
      const row = records.find((r) => r[0] === label(key));
      expect(row, `CSV row ${label(key)}`).toBeDefined();
      expect(row![1]).toBe(matrixYearFigureDefs[key].unit);
      return row!.slice(3).map((v) => (v === '' ? null : Number(v)));
    };
  }
  async function xlsxYear(body: Buffer) {
    const book = new ExcelJS.Workbook();
    await book.xlsx.load(body as unknown as Parameters<typeof book.xlsx.load>[0]);
    const rows: ExcelJS.Row[] = [];
    book.getWorksheet('Matrix')!.eachRow((r) => rows.push(r));
    return (key: MatrixYearFigureKey) => {
      const row = rows.find((r) => r.getCell(1).value === label(key));
      expect(row, `XLSX row ${label(key)}`).toBeDefined();
      return [...t.candidates, refusedId].map((_, i) => {
        const v = row!.getCell(4 + i).value;
        if (v !== null) expect(typeof v, `${key} is stored as a number`).toBe('number');
        return v as number | null;
      });
    };
  }
  function expectExportFigures(read: (key: MatrixYearFigureKey) => (number | null)[], year: SiteYear) {
    for (const key of matrixYearFigureKeys) {
      const expected = [...t.candidates, refusedId].map((id) =>
        fromYear(
          year.candidates.find((c) => c.candidateId === id),
          key,
        ),
      );
      // Written in full (shortest round-trip), so each reads back as the same double.
      expect(read(key), key).toEqual(expected);
    }
  }

  beforeAll(async () => {
    t = await scoringTeam(ctx, 'Ysolde', ['simple', 'regenerative', 'reheat']);
    const added = await t.lead.agent
      .post(`/api/reviews/${t.reviewId}/candidates`)
      .send({ name: 'Ysolde too cool', preset: 'simple' })
      .expect(201);
    refusedId = added.body.id;
    const refused = await t.lead.agent
      .patch(`/api/reviews/${t.reviewId}/candidates/${refusedId}`)
      .send({ parameters: { turbine: { inletTemperatureK: 650 } } })
      .expect(200);
    expect(refused.body.error).not.toBeNull();
  });
  afterAll(() => ctx.close());

  describe('without a profile', () => {
    it('has the hot and cold days of GET site-year and no year figures (null, not 0)', async () => {
      const [m, year] = await Promise.all([matrixNow(), siteYearNow()]);
      expect(year.profile).toBeNull();
      expect(m.year!.profile).toBeNull();
      expect(m.year!.firedHoursPerYear).toBe(year.firedHoursPerYear);
      expect(m.year!.hotDayK).toBeCloseTo(318.15, 9);
      expect(m.year!.coldDayK).toBeCloseTo(243.15, 9);
      expectSameFigures(m, year);
      const hot = m.year!.figures.find((f) => f.key === 'hotDayKW')!;
      for (const id of t.candidates) expect(hot.values[id]).toBeGreaterThan(0);
      expect(hot.values[refusedId]).toBeNull();
      expect(Object.values(m.year!.figures.find((f) => f.key === 'energyMWh')!.values)).toEqual([
        null,
        null,
        null,
        null,
      ]);
    });

    it('writes them in the CSV and the XLSX, empty where missing', async () => {
      const year = await siteYearNow();
      const [csv, xlsx] = await Promise.all([download('csv'), download('xlsx')]);
      expectExportFigures(csvYear(csv), year);
      expectExportFigures(await xlsxYear(xlsx), year);
      expect(csv.toString('utf8')).toContain('no hourly profile');
    });
  });

  describe('with a profile', () => {
    beforeAll(async () => {
      await t.lead.agent
        .put(`/api/reviews/${t.reviewId}/site-year`)
        .attach('file', Buffer.from(demoSiteYearCsv(), 'utf8'), 'inland.csv')
        .expect(200);
    });

    it("has each candidate's year as GET site-year gives it", async () => {
      const [m, year] = await Promise.all([matrixNow(t.reviewer), siteYearNow()]);
      expect(m.year!.profile).toEqual(year.profile);
      expect(m.year!.profile!.hours).toBe(8760);
      expect(m.year!.hotDayK).toBeCloseTo(year.profile!.maxK, 9);
      expect(m.year!.coldDayK).toBeCloseTo(year.profile!.minK, 9);
      expectSameFigures(m, year);
      const energy = m.year!.figures.find((f) => f.key === 'energyMWh')!;
      for (const id of t.candidates) expect(energy.values[id]).toBeGreaterThan(0);
      expect(energy.values[refusedId]).toBeNull();
    });

    it('writes the same figures in the CSV and the XLSX, numbers as numbers', async () => {
      const year = await siteYearNow();
      const [csv, xlsx] = await Promise.all([download('csv'), download('xlsx')]);
      expectExportFigures(csvYear(csv), year);
      expectExportFigures(await xlsxYear(xlsx), year);
      const text = csv.toString('utf8');
      expect(text).toContain('first-order estimate without component maps');
      expect(text).toContain('inland.csv of 8760 h');
    });

    it('follows the fired hours of the design basis', async () => {
      const board = (await t.lead.agent.get(`/api/reviews/${t.reviewId}/board`).expect(200)).body;
      const { revision: _r, updatedAt: _u, ...core } = board.designBasis;
      await t.lead.agent
        .put(`/api/reviews/${t.reviewId}/design-basis`)
        .send({ ...core, firedHoursPerYear: 500 })
        .expect(200);
      const [m, year] = await Promise.all([matrixNow(), siteYearNow()]);
      expect(year.firedHoursPerYear).toBe(500);
      expect(m.year!.firedHoursPerYear).toBe(500);
      expectSameFigures(m, year);
    });
  });

  it('a matrix kept before the site year existed (no `year`) still parses in a signed snapshot', async () => {
    const { year: _y, ...older } = await matrixNow();
    expect(matrixSchema.safeParse(older).success).toBe(true);
    const snapshot = decisionSnapshotSchema.shape.matrix.safeParse(older);
    expect(snapshot.success).toBe(true);
  });
});
