import { mkdirSync } from 'node:fs';
import path from 'node:path';

import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { siteYearSchema } from '@/server/contracts/site-year';
import { demoSiteYearCsv } from '@/server/ops/demo-site-year';
import { repoRoot } from '@/server/ops/paths';
import { createTeam, createTestApp, signUp, type TestUser } from '@/tests/helpers/api';
import { byTestId, requireWebBundle, signedInPage, type Browser } from '@/tests/helpers/browser';
import { startTestServer } from '@/tests/helpers/test-server';

/**
 * The site year on the matrix screen: a Lead on a wide screen and an Engineer on a phone see
 * the Site year group (hot and cold days, a dash for the year without a profile); the rows
 * on the phone stay level with their labels; a profile stored meanwhile fills the year live.
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

/** A screenshot with the Site year group in view (the screen scrolls inside the page). */
async function shot(page: Page, name: string) {
  await byTestId(page, 'matrix-group-year-hotDayKW').scrollIntoViewIfNeeded();
  await page.screenshot({ path: path.join(screenshotDir, `matrix-year-${name}.png`) });
}

const signedIn = (user: TestUser, size: { width: number; height: number }) =>
  signedInPage(server.baseURL, user.cookie, size, browsers, 10_000);

beforeAll(async () => {
  requireWebBundle();
  mkdirSync(screenshotDir, { recursive: true });
  server = await startTestServer();
  ctx = createTestApp();
  const owner = await signUp(server.baseURL, 'Olga Owner');
  lead = await signUp(server.baseURL, 'Lars Lead');
  engineer = await signUp(server.baseURL, 'Edda Engineer');
  const teamId = await createTeam(ctx, owner, [
    { user: lead, role: 'lead' },
    { user: engineer, role: 'engineer' },
  ]);
  const review = await lead.agent.post(`/api/teams/${teamId}/reviews`).send({ name: 'Inland peaker' });
  expect(review.status).toBe(201);
  reviewId = review.body.id;
  for (const [preset, name] of [
    ['simple', 'Open simple'],
    ['regenerative', 'Recuperated'],
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

describe('the site year in the matrix: Lead at 1440×900, Engineer at 390×844', () => {
  let desk: Page;
  let phone: Page;
  const url = () => `${server.baseURL}/reviews/${reviewId}/matrix`;
  const text = (page: Page, id: string) => byTestId(page, id).textContent();

  it('shows the Site year group with the hot and cold days in units and a dash for the year', async () => {
    desk = await signedIn(lead, { width: 1440, height: 900 });
    phone = await signedIn(engineer, { width: 390, height: 844 });
    await desk.goto(url());
    await phone.goto(url());
    await byTestId(desk, 'matrix-table').waitFor();
    await byTestId(phone, 'matrix-table').waitFor();
    expect(await text(desk, 'matrix-group-year-hotDayKW')).toBe('Site year');
    expect(await text(desk, 'matrix-group-caption-year-hotDayKW')).toContain(
      'First-order estimate without component maps',
    );
    expect(await text(desk, 'matrix-year-rule')).toContain('first-order estimate without component maps');
    expect(await text(desk, `matrix-cell-year-hotDayKW-${ids[0]}`)).toMatch(/^\d+\.\d+ MW$/);
    expect(await text(desk, 'matrix-sort-year-hotDayKW')).toContain('at 45.0 °C');
    expect(await text(desk, `matrix-cell-year-energyMWh-${ids[0]}`)).toBe('—no site profile');
    expect(await text(phone, `matrix-cell-year-coldDayKW-${ids[1]}`)).toMatch(/^\d+\.\d+ MW$/);
  });

  it('keeps each row level with its label on the phone, the band included', async () => {
    for (const key of ['year-hotDayKW', 'year-shortfallHours', 'total', 'rank']) {
      const label = (await byTestId(phone, `matrix-sort-${key}`).boundingBox())!;
      const cell = (await byTestId(phone, `matrix-cell-${key}-${ids[0]}`).boundingBox())!;
      expect(Math.abs(label.y - cell.y), key).toBeLessThan(1);
    }
    await shot(phone, 'phone');
  });

  it('fills the year live when a profile is stored, in the numbers GET site-year gives', async () => {
    const cell = byTestId(desk, `matrix-cell-year-energyMWh-${ids[0]}`);
    const put = await lead.agent
      .put(`/api/reviews/${reviewId}/site-year`)
      .attach('file', Buffer.from(demoSiteYearCsv(), 'utf8'), 'inland.csv');
    expect(put.status).toBe(200);
    await expect.poll(() => cell.textContent(), { timeout: 10_000 }).toMatch(/^[\d.,]+ (MWh|GWh)$/);
    const year = siteYearSchema.parse((await lead.agent.get(`/api/reviews/${reviewId}/site-year`).expect(200)).body);
    const shortfall = year.candidates.find((c) => c.candidateId === ids[0])!.annual!.shortfallHours;
    const shown = await text(desk, `matrix-cell-year-shortfallHours-${ids[0]}`);
    expect(Number(shown!.replace(/[^\d.]/g, ''))).toBeCloseTo(shortfall < 10 ? shortfall : Math.round(shortfall), 1);
    expect(await text(desk, 'matrix-group-caption-year-hotDayKW')).toContain('8760 hours of profile');
    await byTestId(phone, `matrix-cell-year-energyMWh-${ids[0]}`).filter({ hasText: 'Wh' }).waitFor();
    await shot(desk, 'wide');
  });

  it('sorts the candidates by a site-year row', async () => {
    await byTestId(desk, 'matrix-sort-year-fuelTonnes').click();
    const order = await desk.$$eval('[data-testid^="matrix-head-"]', (els) =>
      els.map((e) => e.getAttribute('data-testid')!.replace('matrix-head-', '')),
    );
    const year = siteYearSchema.parse((await lead.agent.get(`/api/reviews/${reviewId}/site-year`).expect(200)).body);
    const fuel = (id: string) => year.candidates.find((c) => c.candidateId === id)!.annual!.fuelTonnes;
    expect(order).toEqual([...ids].sort((a, b) => fuel(a) - fuel(b)));
  });
});
