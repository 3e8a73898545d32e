import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';

import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { demoSiteYearCsv } from '@/server/ops/demo-site-year';
import { repoRoot } from '@/server/ops/paths';
import { signUp, startTeam, type TestUser } from '@/tests/helpers/api';
import { byTestId, requireWebBundle, signInThroughForm, type Browser } from '@/tests/helpers/browser';
import { startTestServer } from '@/tests/helpers/test-server';

/**
 * The Site year screen in a real browser: the rating curves without a profile, a bad CSV
 * refused with its rows named and nothing stored, the demo year uploaded through the file
 * picker, its summary, each candidate's year and curve, at phone and desk sizes.
 */

type Server = Awaited<ReturnType<typeof startTestServer>>;
let server: Server;
let lead: TestUser;
let reviewId: string;
const candidateIds: string[] = [];
const browsers: Browser[] = [];
const screenshotDir = path.join(repoRoot, 'artifacts', 'screenshots');
const files = path.join(tmpdir(), `cyclemoot-site-year-${process.pid}`);

beforeAll(async () => {
  requireWebBundle();
  mkdirSync(screenshotDir, { recursive: true });
  mkdirSync(files, { recursive: true });
  writeFileSync(path.join(files, 'kestrel.csv'), demoSiteYearCsv());
  const bad = demoSiteYearCsv()
    .split('\n')
    .map((line, i) => (i === 4 ? '3,-80,50' : i === 9 ? '8,5,120' : line))
    .join('\n');
  writeFileSync(path.join(files, 'bad.csv'), bad);
  server = await startTestServer();
  lead = await signUp(server.baseURL, 'Lia Lead');
  const teamId = await startTeam(lead, 'Year team');
  reviewId = (await lead.agent.post(`/api/teams/${teamId}/reviews`).send({ name: 'Fell year' }).expect(201)).body.id;
  for (const [name, preset] of [
    ['Simple 19', 'simple'],
    ['Recuperated', 'regenerative'],
  ] as const)
    candidateIds.push(
      (await lead.agent.post(`/api/reviews/${reviewId}/candidates`).send({ name, preset }).expect(201)).body.id,
    );
});

afterAll(async () => {
  for (const b of browsers) await b.dispose();
  await server?.stop();
});

const shot = (page: Page, name: string) =>
  page.screenshot({ path: path.join(screenshotDir, `site-year-${name}.png`), fullPage: true });

async function openSiteYear(viewport: { width: number; height: number }) {
  const page = await signInThroughForm(server.baseURL, lead, viewport, browsers);
  await page.waitForURL((u) => !u.pathname.startsWith('/sign-in'));
  await page.goto(`${server.baseURL}/reviews/${reviewId}/site-year`);
  await byTestId(page, 'site-year-screen').waitFor();
  return page;
}

async function upload(page: Page, file: string) {
  const chooser = page.waitForEvent('filechooser');
  await byTestId(page, 'site-year-upload').click();
  await (await chooser).setFiles(path.join(files, file));
}

const stored = async () =>
  (await fetch(`${server.baseURL}/api/reviews/${reviewId}/site-year`, { headers: { cookie: lead.cookie } })).json();

describe('the Site year screen', () => {
  it('on a phone: curves without a profile, a bad file refused by row, the demo year uploaded', async () => {
    const page = await openSiteYear({ width: 390, height: 844 });
    await byTestId(page, 'site-year-no-profile').waitFor();
    for (const id of candidateIds) await byTestId(page, `rating-curve-${id}`).locator('svg').first().waitFor();
    expect(await byTestId(page, 'site-year-first-order').textContent()).toMatch(
      /first-order estimate without component maps/,
    );
    expect(await byTestId(page, 'caution-line').textContent()).toMatch(/Concept-stage estimates/);

    await upload(page, 'bad.csv');
    await byTestId(page, 'site-year-errors').waitFor();
    const rows = await byTestId(page, 'site-year-error-row').allTextContents();
    expect(rows).toEqual([
      expect.stringMatching(/^Row 5, temperature °C: -80 °C is outside −60 °C to \+60 °C/),
      expect.stringMatching(/^Row 10, RH %: 120 % is outside 0–100 %/),
    ]);
    expect((await stored()).profile).toBeNull();
    await shot(page, 'phone-refused');

    await upload(page, 'kestrel.csv');
    await byTestId(page, 'site-year-summary').waitFor();
    await expect.poll(async () => (await byTestId(page, 'site-year-errors').count()) === 0).toBe(true);
    expect(await byTestId(page, 'site-year-summary-file').textContent()).toMatch(/kestrel\.csv · 8760 hourly rows/);
    expect(await byTestId(page, 'site-year-mean').textContent()).toMatch(/°C/);
    const card = byTestId(page, `site-year-candidate-${candidateIds[0]}`);
    await card.locator('[data-testid="site-year-annual"]').waitFor();
    expect(await card.locator('[data-testid="site-year-energy"]').textContent()).toMatch(/GWh|MWh/);
    expect(await card.locator('[data-testid="site-year-fuel"]').textContent()).toMatch(/ t$/);
    expect(await card.locator('[data-testid="site-year-heat-rate"]').textContent()).toMatch(/kJ\/kWh/);
    expect(await card.locator('[data-testid="site-year-shortfall"]').textContent()).toMatch(/ h$/);
    // The same figures the API gives.
    const body = await stored();
    expect(body.profile.hours).toBe(8760);
    const energy = body.candidates[0].annual.energyMWh as number;
    const shownEnergy = await card.locator('[data-testid="site-year-energy"]').textContent();
    expect(shownEnergy).toContain(energy >= 10_000 ? (energy / 1000).toPrecision(3) : energy.toPrecision(3));

    // Reading the curve: a tap gives net power, heat rate and exhaust temperature with units.
    const hit = byTestId(page, `rating-curve-${candidateIds[0]}-hit`);
    await hit.scrollIntoViewIfNeeded();
    const box = (await hit.boundingBox())!;
    await hit.click({ position: { x: box.width / 2, y: 60 } });
    const readout = await byTestId(page, `rating-curve-${candidateIds[0]}-readout`).textContent();
    expect(readout).toMatch(/Ambient .* °C/);
    expect(readout).toMatch(/MW/);
    expect(readout).toMatch(/kJ\/kWh/);
    await shot(page, 'phone');

    // Nothing lost on reload.
    await page.reload();
    await byTestId(page, 'site-year-summary').waitFor();
  });

  it('at a desk: the stored year and every candidate’s curve', async () => {
    const page = await openSiteYear({ width: 1440, height: 900 });
    await byTestId(page, 'site-year-summary').waitFor();
    for (const id of candidateIds) {
      await byTestId(page, `rating-curve-${id}`).locator('svg').first().waitFor();
      await byTestId(page, `site-year-candidate-${id}`).locator('[data-testid="site-year-annual"]').waitFor();
    }
    // Fired hours: checked as typed, saved into the basis, and the year follows.
    const hours = byTestId(page, 'site-year-fired-hours-input');
    await hours.fill('9000');
    expect(await byTestId(page, 'site-year-fired-hours-input-error').textContent()).toMatch(/at most 8784/);
    await hours.fill('500');
    await byTestId(page, 'site-year-fired-hours-save').click();
    await expect.poll(async () => (await stored()).firedHoursPerYear).toBe(500);
    await expect.poll(() => byTestId(page, 'site-year-fired-hours').textContent()).toMatch(/500\s*h/);
    const year = (await stored()).candidates[0].annual;
    expect(year.firedHours).toBe(500);
    const width = await byTestId(page, `rating-curve-${candidateIds[0]}`).evaluate(
      (e) => e.getBoundingClientRect().width,
    );
    expect(width).toBeGreaterThan(500);
    await shot(page, 'desk');
    expect(readFileSync(path.join(screenshotDir, 'site-year-desk.png')).length).toBeGreaterThan(10_000);
  });
});
