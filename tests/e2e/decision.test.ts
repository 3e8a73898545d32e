import { mkdirSync, readFileSync } from 'node:fs';
import path from 'node:path';

import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import type { CandidateWire } from '@/server/contracts/board';
import { repoRoot } from '@/server/ops/paths';
import { createTeam, createTestApp, signUp, type TestUser } from '@/tests/helpers/api';
import { byTestId, requireWebBundle, signedInPage, type Browser } from '@/tests/helpers/browser';
import { startTestServer } from '@/tests/helpers/test-server';
import { computedCandidates } from '@/tests/server/fixtures/decision';

/**
 * The decision record in a browser, on a phone and wide: the Lead fills the draft (checked as
 * typed, saved by itself, kept through a reload), signs it, sees it read-only with the
 * signature and the figures, downloads the PDF; a Reviewer reads without edit controls.
 */

const screenshotDir = path.join(repoRoot, 'artifacts', 'screenshots');
type Server = Awaited<ReturnType<typeof startTestServer>>;
let server: Server;
let ctx: ReturnType<typeof createTestApp>;
const browsers: Browser[] = [];

const signedIn = (user: TestUser, size: { width: number; height: number }) =>
  signedInPage(server.baseURL, user.cookie, size, browsers);

beforeAll(async () => {
  requireWebBundle();
  mkdirSync(screenshotDir, { recursive: true });
  server = await startTestServer();
  ctx = createTestApp();
});

afterAll(async () => {
  for (const b of browsers) await b.dispose();
  await server?.stop();
  await ctx?.close();
});

async function reviewWithCandidates(label: string) {
  const lead = await signUp(server.baseURL, `${label} Lead`);
  const owner = await signUp(server.baseURL, `${label} Owner`);
  const reviewer = await signUp(server.baseURL, `${label} Reviewer`);
  const teamId = await createTeam(ctx, owner, [
    { user: lead, role: 'lead' },
    { user: reviewer, role: 'reviewer' },
  ]);
  const created = await lead.agent.post(`/api/teams/${teamId}/reviews`).send({ name: `${label} unit 4 cycle` });
  expect(created.status).toBe(201);
  const reviewId = created.body.id as string;
  const candidates = await computedCandidates(lead, reviewId, ['Open cycle', 'Recuperated', 'Intercooled']);
  return { lead, reviewer, reviewId, candidates };
}

for (const size of [
  { name: 'phone', width: 390, height: 844 },
  { name: 'wide', width: 1440, height: 900 },
]) {
  describe(`the decision record at ${size.width}×${size.height}`, () => {
    let lead: TestUser;
    let reviewer: TestUser;
    let reviewId: string;
    let candidates: CandidateWire[];

    beforeAll(async () => {
      ({ lead, reviewer, reviewId, candidates } = await reviewWithCandidates(size.name === 'phone' ? 'Pia' : 'Wen'));
    });

    it('the Lead fills the draft, it survives a reload, signs it, sees it read-only and downloads the PDF', async () => {
      const page = await signedIn(lead, size);
      await page.goto(`${server.baseURL}/reviews/${reviewId}/decision`);
      await byTestId(page, 'decision-form').waitFor();
      await byTestId(page, 'caution-line').waitFor();

      const [chosen, , rejected] = candidates as [CandidateWire, CandidateWire, CandidateWire];
      await byTestId(page, `decision-chosen-${chosen.id}`).click();
      await byTestId(page, 'decision-rationale').fill(
        'Best efficiency on the hot day; the exhaust stays in the window.',
      );
      await byTestId(page, 'decision-assumptions').fill('Pipeline gas as in the basis.');
      await byTestId(page, `decision-reject-${rejected.id}`).click();
      await byTestId(page, 'decision-rejected-0-reason').fill('Two more coolers to maintain for a small gain.');
      await byTestId(page, 'decision-add-action').click();
      await byTestId(page, 'decision-action-0-text').fill('Ask the maker for part-load data');
      await byTestId(page, 'decision-action-0-owner').fill('Process lead');
      // Checked as typed: a day that does not exist is named at the field, nothing is saved.
      await byTestId(page, 'decision-action-0-due').fill('2027-02-30');
      await expect.poll(() => byTestId(page, 'decision-action-0-due-error').textContent()).toMatch(/not a day/);
      await expect.poll(() => byTestId(page, 'decision-save-state').textContent()).toMatch(/Not saved/);
      await byTestId(page, 'decision-action-0-due').fill('2027-02-15');
      await expect
        .poll(() => byTestId(page, 'decision-save-state').textContent(), { timeout: 10_000 })
        .toBe('All changes saved.');
      await page.screenshot({ path: path.join(screenshotDir, `decision-draft-${size.name}.png`), fullPage: true });

      // Nothing lost on reload: the server has it.
      await page.reload();
      await byTestId(page, 'decision-form').waitFor();
      expect(await byTestId(page, 'decision-rationale').inputValue()).toBe(
        'Best efficiency on the hot day; the exhaust stays in the window.',
      );
      expect(await byTestId(page, 'decision-rejected-0-reason').inputValue()).toBe(
        'Two more coolers to maintain for a small gain.',
      );
      expect(await byTestId(page, 'decision-action-0-due').inputValue()).toBe('2027-02-15');
      expect(await byTestId(page, `decision-chosen-${chosen.id}`).getAttribute('aria-checked')).toBe('true');

      // A Reviewer on the page meanwhile reads the draft, with no edit controls.
      const watcher = await signedIn(reviewer, size);
      await watcher.goto(`${server.baseURL}/reviews/${reviewId}/decision`);
      await byTestId(watcher, 'decision-read-only-note').waitFor();
      expect(await byTestId(watcher, 'decision-form').count()).toBe(0);
      await expect.poll(() => byTestId(watcher, 'decision-status').textContent()).toBe('Draft');

      await byTestId(page, 'decision-sign').click();
      await byTestId(page, 'decision-sign-confirm').waitFor();
      await byTestId(page, 'decision-sign-confirm-button').click();
      await byTestId(page, 'decision-view-1').waitFor();
      await expect.poll(() => byTestId(page, 'decision-status').textContent()).toBe('Signed · read-only');
      expect(await byTestId(page, 'decision-signature').textContent()).toContain(lead.name);
      expect(await byTestId(page, 'decision-chosen-name').textContent()).toBe(chosen.name);
      await byTestId(page, 'decision-snapshot').waitFor();
      expect(await byTestId(page, 'decision-snapshot').textContent()).toContain('Thermal efficiency, %');
      expect(await byTestId(page, 'decision-form').count()).toBe(0);
      expect(await byTestId(page, 'decision-reopen').count()).toBe(1);
      // The Reviewer's page turns signed by itself (decision:signed), without a reload.
      await expect.poll(() => byTestId(watcher, 'decision-status').textContent()).toBe('Signed · read-only');
      expect(await byTestId(watcher, 'decision-signature').textContent()).toContain(lead.name);
      await page.screenshot({ path: path.join(screenshotDir, `decision-signed-${size.name}.png`), fullPage: true });

      const [download] = await Promise.all([page.waitForEvent('download'), byTestId(page, 'decision-pdf').click()]);
      expect(download.suggestedFilename()).toMatch(/^decision-record-.*-r1\.pdf$/);
      const file = await download.path();
      const bytes = readFileSync(file!);
      expect(bytes.subarray(0, 5).toString()).toBe('%PDF-');
      expect(bytes.length).toBeGreaterThan(20_000);

      const stored = (await lead.agent.get(`/api/reviews/${reviewId}/decision`).expect(200)).body;
      expect(stored.current).toMatchObject({ status: 'signed', chosenCandidateId: chosen.id });
      expect(stored.current.actions).toEqual([
        { text: 'Ask the maker for part-load data', owner: 'Process lead', due: '2027-02-15' },
      ]);
    });

    it('a Reviewer reads the signed record with no edit controls, and the Activity timeline shows the signature', async () => {
      const page = await signedIn(reviewer, size);
      await page.goto(`${server.baseURL}/reviews/${reviewId}/decision`);
      await byTestId(page, 'decision-view-1').waitFor();
      expect(await byTestId(page, 'decision-form').count()).toBe(0);
      expect(await byTestId(page, 'decision-sign').count()).toBe(0);
      expect(await byTestId(page, 'decision-reopen').count()).toBe(0);
      expect(await byTestId(page, 'decision-pdf').count()).toBe(1);

      await page.goto(`${server.baseURL}/reviews/${reviewId}/activity`);
      await byTestId(page, 'review-activity-list').waitFor();
      const first = await byTestId(page, 'review-activity-item').allTextContents();
      expect(first.some((line) => line.includes(`${lead.name} signed decision record revision 1`))).toBe(true);
      await page.screenshot({ path: path.join(screenshotDir, `review-activity-${size.name}.png`), fullPage: true });
    });
  });
}
