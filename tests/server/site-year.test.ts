import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { activity, siteYear } from '@/db/schema';
import { siteYearSchema } from '@/server/contracts/site-year';
import { annualFigures, fixMachine, type CycleInput } from '@/server/engine';
import { demoSiteYear, demoSiteYearCsv, seedDemoSiteYear } from '@/server/ops/demo-site-year';

import { createTeam, createTestApp, signUp, type TestUser } from '../helpers/api';

/**
 * The site year through the real app and database: upload, replace and remove a profile,
 * what GET computes from it (checked against the engine directly), and bad files refused
 * row by row with nothing stored.
 */

const ctx = createTestApp();
let lead: TestUser;
let engineer: TestUser;
let reviewId: string;
let candidateIds: string[];

const url = () => `/api/reviews/${reviewId}/site-year`;

function put(user: TestUser, csv: string | Buffer, name = 'year.csv') {
  return user.agent.put(url()).attach('file', Buffer.isBuffer(csv) ? csv : Buffer.from(csv, 'utf8'), name);
}

/** A year of `rows` lines from a function of the hour; header and columns as given. */
function csvOf(header: string, rows: number, line: (i: number) => string): string {
  const out = [header];
  for (let i = 0; i < rows; i++) out.push(line(i));
  return out.join('\n') + '\n';
}

const steadyYear = (celsius: number) => csvOf('hour,temperature °C,RH %', 8760, (i) => `${i},${celsius},60`);

async function storedRows() {
  return ctx.db.select().from(siteYear).where(eq(siteYear.reviewId, reviewId));
}

async function activityCount() {
  return (await ctx.db.select().from(activity).where(eq(activity.reviewId, reviewId))).length;
}

beforeAll(async () => {
  [lead, engineer] = await Promise.all([signUp(ctx.app, 'Lina Lead'), signUp(ctx.app, 'Emil Engineer')]);
  const teamId = await createTeam(ctx, lead, [{ user: engineer, role: 'engineer' }]);
  reviewId = (await lead.agent.post(`/api/teams/${teamId}/reviews`).send({ name: 'Year review' }).expect(201)).body.id;
  candidateIds = [];
  for (const [name, preset] of [
    ['Simple', 'simple'],
    ['Regenerative', 'regenerative'],
  ] as const)
    candidateIds.push(
      (await engineer.agent.post(`/api/reviews/${reviewId}/candidates`).send({ name, preset }).expect(201)).body.id,
    );
});
afterAll(() => ctx.close());

describe('without a profile', () => {
  it('gives each candidate its rating curve and hot and cold days, no year', async () => {
    const res = await engineer.agent.get(url()).expect(200);
    const body = siteYearSchema.parse(res.body);
    expect(body.profile).toBeNull();
    expect(body.firedHoursPerYear).toBe(6000);
    expect(body.candidates.map((c) => c.candidateId)).toEqual(candidateIds);
    for (const c of body.candidates) {
      expect(c.annual).toBeNull();
      expect(c.ratingCurve.length).toBe(16);
      expect(c.ratingCurve[0].ambientK).toBeCloseTo(243.15, 9);
      expect(c.ratingCurve.at(-1)!.ambientK).toBeCloseTo(318.15, 9);
      // The default basis is ISO (15 °C): the machine gives the required 50 MW there exactly.
      const design = c.ratingCurve.find((p) => p.ambientK === 288.15)!;
      expect(design.netPowerKW).toBeCloseTo(50_000, 6);
      expect(c.hotDayKW!).toBeLessThan(50_000);
      expect(c.coldDayKW!).toBeGreaterThan(50_000);
    }
  });
});

describe('upload', () => {
  it('stores the demo year, answers its summary, tells the room and writes Activity', async () => {
    const before = await activityCount();
    ctx.sent.length = 0;
    const res = await put(lead, demoSiteYearCsv(), 'kestrel.csv').expect(200);
    const year = demoSiteYear();
    expect(res.body).toMatchObject({
      hours: 8760,
      rows: 8760,
      hasPressure: false,
      fileName: 'kestrel.csv',
      uploadedBy: { id: lead.id, name: 'Lina Lead' },
    });
    // The CSV carries °C to 0.01 K.
    expect(res.body.minK).toBeCloseTo(Math.min(...year.temperatureK), 6);
    expect(res.body.maxK).toBeCloseTo(Math.max(...year.temperatureK), 6);
    const mean = year.temperatureK.reduce((a, b) => a + b, 0) / 8760;
    expect(res.body.meanK).toBeCloseTo(mean, 6);
    expect(await activityCount()).toBe(before + 1);
    const news = ctx.sent.filter((s) => s.event === 'site-year:updated');
    expect(news).toEqual([{ reviewId, event: 'site-year:updated', payload: { reviewId, profile: res.body } }]);
  });

  it("GET gives each candidate's year, equal to the engine's own over the stored hours", async () => {
    const body = siteYearSchema.parse((await engineer.agent.get(url()).expect(200)).body);
    expect(body.profile?.hours).toBe(8760);
    const board = (await engineer.agent.get(`/api/reviews/${reviewId}/board`).expect(200)).body;
    const year = demoSiteYear();
    for (const c of body.candidates) {
      const input = board.candidates.find((b: { id: string }) => b.id === c.candidateId).input as CycleInput;
      const direct = annualFigures(
        fixMachine(input),
        { temperatureK: year.temperatureK, relativeHumidity: year.relativeHumidity },
        { firedHoursPerYear: 6000, direct: true },
      );
      expect(c.annual).not.toBeNull();
      expect(Math.abs(c.annual!.energyMWh / direct.energyMWh - 1)).toBeLessThan(1e-4);
      expect(Math.abs(c.annual!.fuelTonnes / direct.fuelTonnes - 1)).toBeLessThan(1e-4);
      expect(c.annual!.firedHours).toBe(6000);
      // Hot and cold days are the profile's own extremes.
      expect(c.hotDayK).toBeCloseTo(Math.max(...year.temperatureK), 6);
      expect(c.coldDayK).toBeCloseTo(Math.min(...year.temperatureK), 6);
    }
  });

  it('replacing recomputes: a year steadily colder than the basis has no shortfall, a warmer one all', async () => {
    await put(lead, steadyYear(5)).expect(200);
    let body = siteYearSchema.parse((await lead.agent.get(url()).expect(200)).body);
    expect((await storedRows()).length).toBe(1);
    for (const c of body.candidates) {
      expect(c.annual!.shortfallHours).toBe(0);
      expect(c.annual!.energyMWh).toBeCloseTo((50_000 * 6000) / 1000, 3);
    }
    await put(lead, steadyYear(25)).expect(200);
    body = siteYearSchema.parse((await lead.agent.get(url()).expect(200)).body);
    for (const c of body.candidates) {
      expect(c.annual!.shortfallHours).toBeCloseTo(6000, 6);
      expect(c.annual!.shortfallProfileHours).toBe(8760);
      expect(c.annual!.energyMWh).toBeLessThan((50_000 * 6000) / 1000);
    }
  });

  it('follows the fired hours of the basis', async () => {
    const board = (await lead.agent.get(`/api/reviews/${reviewId}/board`).expect(200)).body;
    const { revision: _r, updatedAt: _u, ...basis } = board.designBasis;
    await lead.agent
      .put(`/api/reviews/${reviewId}/design-basis`)
      .send({ ...basis, firedHoursPerYear: 500 })
      .expect(200);
    await put(lead, steadyYear(5)).expect(200);
    const body = siteYearSchema.parse((await lead.agent.get(url()).expect(200)).body);
    expect(body.firedHoursPerYear).toBe(500);
    for (const c of body.candidates) expect(c.annual!.energyMWh).toBeCloseTo((50_000 * 500) / 1000, 3);
    const refused = await lead.agent
      .put(`/api/reviews/${reviewId}/design-basis`)
      .send({ ...basis, firedHoursPerYear: 9000 })
      .expect(422);
    expect(refused.body.error.field).toBe('firedHoursPerYear');
  });

  it('reads kelvin, fractions, a pressure column, dates and rows that stand for several hours', async () => {
    // 365 daily rows of 24 hours, kelvin and fractions by their values, pressure in hPa by name.
    const csv = csvOf('date,dry bulb,relative humidity,pressure hPa,hours', 365, (d) => {
      const day = new Date(Date.UTC(2025, 0, 1 + d)).toISOString().slice(0, 10);
      return `${day} 00:00,${(270 + 10 * Math.sin(d / 58)).toFixed(2)},0.7,${(980 + (d % 7)).toFixed(1)},24`;
    });
    const res = await put(lead, csv).expect(200);
    expect(res.body).toMatchObject({ hours: 8760, rows: 365, hasPressure: true });
    expect(res.body.minK).toBeGreaterThan(259);
    expect(res.body.maxK).toBeLessThan(281);
    const [row] = await storedRows();
    expect(row.columns.pressureKPa![0]).toBeCloseTo(98, 9);
    expect(row.columns.relativeHumidity[0]).toBe(0.7);
    expect(row.columns.weightHours![0]).toBe(24);
    const body = siteYearSchema.parse((await lead.agent.get(url()).expect(200)).body);
    expect(body.candidates[0].annual).not.toBeNull();
  });
});

describe('bad files', () => {
  async function refused(csv: string, status = 422) {
    const before = await storedRows();
    const log = await activityCount();
    const res = await put(lead, csv).expect(status);
    expect(await storedRows()).toEqual(before);
    expect(await activityCount()).toBe(log);
    return res.body.error;
  }

  it('lists every bad row (the first 20) with its line and column, and stores nothing', async () => {
    const csv = csvOf('hour,temperature °C,RH %', 8760, (i) => {
      if (i === 3) return `3,-75,50`; // line 5: too cold
      if (i === 10) return `10,12,140`; // line 12: humidity above 100 %
      if (i === 20) return `19,12,50`; // line 22: the hour of line 21 again
      if (i === 30) return `30,warm,50`; // line 32: not a number
      return `${i},5,60`;
    });
    const error = await refused(csv);
    expect(error.code).toBe('invalid_profile');
    expect(error.field).toBe('file');
    expect(error.rowErrors).toEqual([
      { row: 5, column: 'temperature °C', message: expect.stringMatching(/outside −60 °C to \+60 °C/) },
      { row: 12, column: 'RH %', message: expect.stringMatching(/outside 0–100 %/) },
      { row: 22, column: 'hour', message: 'The same hour as row 21.' },
      { row: 32, column: 'temperature °C', message: 'Temperature must be a number.' },
    ]);
    expect(error.fieldErrors.file[0]).toMatch(/^Row 5, temperature °C:/);
    expect(error.message).toMatch(/4 errors/);
  });

  it('lists at most 20 and says how many more', async () => {
    const csv = csvOf('hour,temperature °C,RH %', 8760, (i) => `${i},${i < 50 ? 99 : 5},60`);
    const error = await refused(csv);
    expect(error.rowErrors.length).toBe(20);
    expect(error.errorCount).toBe(50);
    expect(error.message).toMatch(/50 errors \(30 more not listed\)/);
  });

  it('refuses a missing column, naming it', async () => {
    const noHumidity = csvOf('hour,temperature °C', 8760, (i) => `${i},5`);
    const e1 = await refused(noHumidity);
    expect(e1.rowErrors).toEqual([{ row: 1, column: 'relative humidity', message: expect.any(String) }]);
    const noTime = csvOf('temperature °C,RH %', 8760, () => `5,60`);
    const e2 = await refused(noTime);
    expect(e2.rowErrors[0].column).toBe('time');
  });

  it('refuses a year of the wrong length, hours above 60 °C in kelvin and an empty file', async () => {
    const short = await refused(csvOf('hour,temperature °C,RH %', 100, (i) => `${i},5,60`));
    expect(short.message).toMatch(/100 rows; it needs one per hour, 8760 or 8784/);
    const weights = await refused(csvOf('hour,temperature K,RH %,hours', 10, (i) => `${i},280,60,24`));
    expect(weights.message).toMatch(/adds up to 240 h/);
    const hot = await refused(csvOf('hour,temperature K,RH %', 8760, (i) => `${i},${i === 7 ? 340 : 280},60`));
    expect(hot.rowErrors).toEqual([{ row: 9, column: 'temperature K', message: expect.stringMatching(/340 K/) }]);
    const empty = await refused('');
    expect(empty.code).toBe('invalid_profile');
  });

  it('accepts a leap year of 8784 hours', async () => {
    const res = await put(
      lead,
      csvOf('hour,temperature °C,RH %', 8784, (i) => `${i + 1},2,80`),
    ).expect(200);
    expect(res.body.hours).toBe(8784);
  });
});

describe('remove', () => {
  it('DELETE removes the profile (GET then has no year), tells the room, and a second DELETE is 404', async () => {
    ctx.sent.length = 0;
    await lead.agent.delete(url()).expect(204);
    expect(await storedRows()).toEqual([]);
    expect(ctx.sent.filter((s) => s.event === 'site-year:updated')).toEqual([
      { reviewId, event: 'site-year:updated', payload: { reviewId, profile: null } },
    ]);
    const body = siteYearSchema.parse((await lead.agent.get(url()).expect(200)).body);
    expect(body.profile).toBeNull();
    for (const c of body.candidates) expect(c.annual).toBeNull();
    await lead.agent.delete(url()).expect(404);
  });
});

describe('the demo', () => {
  it('seedDemoSiteYear stores the invented Kestrel Fell year through the same reader', async () => {
    const summary = await seedDemoSiteYear(ctx.db, reviewId, lead.id);
    expect(summary.hours).toBe(8760);
    // A cold inland site: mean near +2 °C, winters below −20 °C, summers near +30 °C.
    expect(summary.meanK - 273.15).toBeGreaterThan(0);
    expect(summary.meanK - 273.15).toBeLessThan(4);
    expect(summary.minK - 273.15).toBeLessThan(-20);
    expect(summary.maxK - 273.15).toBeGreaterThan(25);
    // The same every time: deterministic.
    expect(demoSiteYearCsv()).toBe(demoSiteYearCsv());
  });
});
