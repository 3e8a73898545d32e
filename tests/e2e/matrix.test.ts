import { mkdirSync, readFileSync } from 'node:fs';
import path from 'node:path';

import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import type { Criterion } from '@/server/contracts/board';
import type { Matrix } from '@/server/contracts/matrix';
import { repoRoot } from '@/server/ops/paths';
import { createTeam, createTestApp, signUp, type TestUser } from '@/tests/helpers/api';
import { byTestId, requireWebBundle, signedInPage, type Browser } from '@/tests/helpers/browser';
import { startTestServer } from '@/tests/helpers/test-server';

/**
 * The comparison matrix in two browsers: an Engineer on a phone scores a candidate in the
 * Score sheet (validation as typed, an override needing its reason); the Lead's wide matrix
 * shows the new mean live, sorts by a row, re-ranks when a weight changes, and both download
 * the CSV.
 */

const screenshotDir = path.join(repoRoot, 'artifacts', 'screenshots');
type Server = Awaited<ReturnType<typeof startTestServer>>;
let server: Server;
let ctx: ReturnType<typeof createTestApp>;
let lead: TestUser;
let engineer: TestUser;
let reviewId: string;
const ids: string[] = [];
const browsers: Browser[] = [];

const shot = (page: Page, name: string) => page.screenshot({ path: path.join(screenshotDir, `matrix-${name}.png`) });

const signedIn = (user: TestUser, size: { width: number; height: number }) =>
  signedInPage(server.baseURL, user.cookie, size, browsers, 10_000);

/** Candidate ids in the order the matrix shows their columns. */
const columnOrder = (page: Page) =>
  page.$$eval('[data-testid^="matrix-head-"]', (els) =>
    els.map((e) => e.getAttribute('data-testid')!.replace('matrix-head-', '')),
  );

const matrixNow = async (): Promise<Matrix> =>
  (await lead.agent.get(`/api/reviews/${reviewId}/matrix`).expect(200)).body;

beforeAll(async () => {
  requireWebBundle();
  mkdirSync(screenshotDir, { recursive: true });
  server = await startTestServer();
  ctx = createTestApp();
  const owner = await signUp(server.baseURL, 'Odile Owner');
  lead = await signUp(server.baseURL, 'Lena Lead');
  engineer = await signUp(server.baseURL, 'Egon Engineer');
  const teamId = await createTeam(ctx, owner, [
    { user: lead, role: 'lead' },
    { user: engineer, role: 'engineer' },
  ]);
  const review = await lead.agent.post(`/api/teams/${teamId}/reviews`).send({ name: 'Harbour peaker' });
  expect(review.status).toBe(201);
  reviewId = review.body.id;
  for (const [preset, name] of [
    ['simple', 'Open simple'],
    ['regenerative', 'Recuperated'],
    ['intercooled', 'Intercooled'],
  ] as const) {
    const made = await lead.agent.post(`/api/reviews/${reviewId}/candidates`).send({ name, preset });
    expect(made.status).toBe(201);
    ids.push(made.body.id);
  }
});

afterAll(async () => {
  for (const b of browsers) await b.dispose();
  await ctx?.close();
  await server?.stop();
});

describe('the comparison matrix: Engineer at 390×844, Lead at 1440×900', () => {
  let phone: Page;
  let desk: Page;
  const url = () => `${server.baseURL}/reviews/${reviewId}/matrix`;

  it('opens on both, with units and the caution line; on the phone the labels stay while columns swipe', async () => {
    phone = await signedIn(engineer, { width: 390, height: 844 });
    desk = await signedIn(lead, { width: 1440, height: 900 });
    await phone.goto(url());
    await desk.goto(url());
    await byTestId(phone, 'matrix-table').waitFor();
    await byTestId(desk, 'matrix-table').waitFor();
    expect(await byTestId(desk, `matrix-cell-figure-thermalEfficiency-${ids[0]}`).textContent()).toMatch(
      /^\d+\.\d+ %$/,
    );
    expect(await byTestId(desk, `matrix-cell-figure-netWorkKJPerKg-${ids[0]}`).textContent()).toMatch(/kJ\/kg$/);
    expect(await byTestId(phone, 'caution-line').textContent()).toContain('Concept-stage estimates');
    expect(await byTestId(desk, 'matrix-rules').textContent()).toContain(
      '5 = best of the candidates, 1 = worst, linear between',
    );
    expect(await byTestId(desk, `matrix-cell-criterion-complexity-${ids[0]}`).textContent()).toContain('not scored');
    // Wide: one table, no sideways scroller.
    expect(await byTestId(desk, 'matrix-columns').count()).toBe(0);

    const columns = byTestId(phone, 'matrix-columns');
    const label = byTestId(phone, 'matrix-sort-total');
    const head = byTestId(phone, `matrix-head-${ids[0]}`);
    const [labelBefore, headBefore] = [await label.boundingBox(), await head.boundingBox()];
    await columns.evaluate((el) => {
      el.scrollLeft = 200;
    });
    await expect.poll(async () => (await head.boundingBox())!.x).toBeLessThan(headBefore!.x - 100);
    expect((await label.boundingBox())!.x).toBe(labelBefore!.x);
    await columns.evaluate((el) => {
      el.scrollLeft = 0;
    });
    await shot(phone, 'phone');
    await shot(desk, 'wide');
  });

  it('the Engineer scores a candidate, checked as typed; the Lead sees the matrix change live', async () => {
    await byTestId(phone, 'matrix-score').click();
    await byTestId(phone, 'score-sheet').waitFor();
    await byTestId(phone, `score-candidate-${ids[1]}`).click();
    await byTestId(phone, 'score-complexity-5').click();
    await byTestId(phone, 'score-reason-complexity').fill('one heat exchanger, no intercooler');
    await byTestId(phone, 'score-input-maintainability').fill('2.5');
    await byTestId(phone, 'score-input-maintainability-error').waitFor();
    expect(await byTestId(phone, 'score-input-maintainability-error').textContent()).toContain('whole number');
    expect(await byTestId(phone, 'score-save').getAttribute('aria-disabled')).toBe('true');
    await byTestId(phone, 'score-input-maintainability').fill('2');
    await byTestId(phone, 'score-input-maintainability-error').waitFor({ state: 'detached' });
    // Efficiency is pre-scored: an own score overrides it and needs a reason.
    await byTestId(phone, 'score-efficiency-4').click();
    await byTestId(phone, 'score-reason-efficiency-error').waitFor();
    expect(await byTestId(phone, 'score-save').getAttribute('aria-disabled')).toBe('true');
    await byTestId(phone, 'score-reason-efficiency').fill('the recuperator vendor quotes less loss');
    await byTestId(phone, 'score-reason-efficiency-error').waitFor({ state: 'detached' });
    await shot(phone, 'score-sheet');
    await byTestId(phone, 'score-save').click();
    await expect.poll(() => byTestId(phone, 'score-sheet-status').textContent()).toBe('Saved 3 scores.');

    // Live on the Lead's screen, without a reload.
    const cell = byTestId(desk, `matrix-cell-criterion-complexity-${ids[1]}`);
    await expect.poll(() => cell.textContent()).toContain('5.00 / 5');
    expect(await cell.textContent()).toContain('1 person');
    await expect
      .poll(() => byTestId(desk, `matrix-cell-criterion-efficiency-${ids[1]}`).textContent())
      .toContain('1 own');
    const m = await matrixNow();
    expect(m.rows.find((r) => r.criterionId === 'maintainability')!.cells[ids[1]!]!.mean).toBe(2);
    await expect.poll(() => byTestId(desk, `matrix-cell-rank-${ids[1]}`).textContent()).toBe(String(m.ranks[ids[1]!]));
    await shot(desk, 'wide-scored');
  });

  it('sorts by any row: a tap on a row label orders the candidates by it, again reverses', async () => {
    const m = await matrixNow();
    const eff = m.figures.find((f) => f.key === 'thermalEfficiency')!;
    const best = [...ids].sort((a, b) => eff.values[b]! - eff.values[a]!);
    expect(await columnOrder(desk)).toEqual(ids);
    await byTestId(desk, 'matrix-sort-figure-thermalEfficiency').click();
    await expect.poll(() => columnOrder(desk)).toEqual(best);
    await byTestId(desk, 'matrix-sort-figure-thermalEfficiency').click();
    await expect.poll(() => columnOrder(desk)).toEqual([...best].reverse());
    // By rank on the phone: best first.
    await byTestId(phone, 'matrix-sort-rank').click();
    const byRank = [...ids].sort((a, b) => (m.ranks[a] ?? 99) - (m.ranks[b] ?? 99) || ids.indexOf(a) - ids.indexOf(b));
    await expect.poll(() => columnOrder(phone)).toEqual(byRank);
  });

  it('re-ranks live when the Lead changes the weights', async () => {
    const board = (await lead.agent.get(`/api/reviews/${reviewId}/board`).expect(200)).body;
    const { revision: _r, updatedAt: _u, criteria, ...core } = board.designBasis;
    // Only complexity counts now: the one candidate scored on it leads alone.
    await lead.agent
      .put(`/api/reviews/${reviewId}/design-basis`)
      .send({ ...core, criteria: criteria.map((c: Criterion) => ({ ...c, weight: c.id === 'complexity' ? 100 : 0 })) })
      .expect(200);
    await expect.poll(() => byTestId(desk, `matrix-cell-rank-${ids[1]}`).textContent()).toBe('1');
    await expect.poll(() => byTestId(desk, `matrix-cell-rank-${ids[0]}`).textContent()).toBe('no rank');
    expect(await byTestId(desk, 'matrix-sort-criterion-complexity').textContent()).toContain('weight 100 %');
  });

  it('downloads the CSV on the desk and on the phone', async () => {
    for (const page of [desk, phone]) {
      const [download] = await Promise.all([
        page.waitForEvent('download'),
        byTestId(page, 'matrix-download-csv').click(),
      ]);
      expect(download.suggestedFilename()).toBe('Harbour-peaker-comparison-matrix.csv');
      const file = await download.path();
      const text = readFileSync(file!, 'utf8');
      expect(text).toContain('Concept-stage estimates');
      for (const name of ['Open simple', 'Recuperated', 'Intercooled']) expect(text).toContain(name);
      expect(text).toContain('Complexity: mean score');
    }
    const [xlsx] = await Promise.all([desk.waitForEvent('download'), byTestId(desk, 'matrix-download-xlsx').click()]);
    expect(xlsx.suggestedFilename()).toBe('Harbour-peaker-comparison-matrix.xlsx');
  });
});
