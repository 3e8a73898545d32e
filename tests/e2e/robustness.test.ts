import { mkdirSync } from 'node:fs';
import path from 'node:path';

import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { repoRoot } from '@/server/ops/paths';
import { createTeam, createTestApp, signUp, type TestUser } from '@/tests/helpers/api';
import { byTestId, requireWebBundle, signedInPage, type Browser } from '@/tests/helpers/browser';
import { startTestServer } from '@/tests/helpers/test-server';

/**
 * The robustness check from the matrix, in two browsers: the Lead (wide) sets the draws, the
 * form refuses a bad number as it is typed, starts the run; the Reviewer's phone shows the
 * progress bar from the room's news and then how often each candidate ranks first; the Lead
 * cancels a second run.
 */

const screenshotDir = path.join(repoRoot, 'artifacts', 'screenshots');
type Server = Awaited<ReturnType<typeof startTestServer>>;
let server: Server;
let ctx: ReturnType<typeof createTestApp>;
let lead: TestUser;
let reviewer: TestUser;
let reviewId: string;
const ids: string[] = [];
const browsers: Browser[] = [];

const signedIn = (user: TestUser, size: { width: number; height: number }) =>
  signedInPage(server.baseURL, user.cookie, size, browsers);

beforeAll(async () => {
  requireWebBundle();
  mkdirSync(screenshotDir, { recursive: true });
  server = await startTestServer();
  ctx = createTestApp();
  lead = await signUp(server.baseURL, 'Liv Lead');
  reviewer = await signUp(server.baseURL, 'Ravi Reviewer');
  const teamId = await createTeam(ctx, lead, [{ user: reviewer, role: 'reviewer' }]);
  const review = await lead.agent.post(`/api/teams/${teamId}/reviews`).send({ name: 'Upland peaker' });
  reviewId = review.body.id;
  for (const preset of ['simple', 'regenerative', 'intercooled-reheat-regenerative'] as const) {
    const made = await lead.agent
      .post(`/api/reviews/${reviewId}/candidates`)
      .send({ name: `Option ${preset}`, preset });
    expect(made.status).toBe(201);
    ids.push(made.body.id);
  }
});

afterAll(async () => {
  for (const b of browsers) await b.dispose();
  await ctx?.close();
  await server?.stop();
});

describe('the robustness check on the matrix', () => {
  it('the Lead starts a run; the Reviewer’s phone shows its progress and the result', async () => {
    const desk = await signedIn(lead, { width: 1440, height: 900 });
    const phone = await signedIn(reviewer, { width: 390, height: 844 });
    await desk.goto(`${server.baseURL}/reviews/${reviewId}/matrix`);
    await phone.goto(`${server.baseURL}/reviews/${reviewId}/matrix`);
    await byTestId(desk, 'robustness-form').waitFor();
    await byTestId(phone, 'robustness-panel').waitFor();
    // A Reviewer reads, and starts nothing.
    expect(await byTestId(phone, 'robustness-start').count()).toBe(0);

    await byTestId(desk, 'robustness-samples').fill('25000');
    await expect.poll(() => byTestId(desk, 'robustness-samples-error').textContent()).toContain('At most 20,000');
    expect(await byTestId(desk, 'robustness-start').getAttribute('aria-disabled')).toBe('true');
    await byTestId(desk, 'robustness-samples').fill('20000');
    await byTestId(desk, 'robustness-seed').fill('17');
    await expect.poll(() => byTestId(desk, 'robustness-samples-error').count()).toBe(0);
    await byTestId(desk, 'robustness-start').click();

    await byTestId(phone, 'robustness-progress').waitFor();
    await expect.poll(() => byTestId(phone, 'robustness-progress-text').textContent()).toMatch(/of 20,000 draws/);
    await phone.screenshot({ path: path.join(screenshotDir, 'robustness-phone-progress.png') });

    await byTestId(phone, 'robustness-result').waitFor({ timeout: 120_000 });
    const shares: number[] = [];
    for (const id of ids) {
      const text = (await byTestId(phone, `robustness-first-${id}`).textContent())!;
      expect(text).toMatch(/ranks first in [\d.]+ % of 20,000 draws/);
      shares.push(Number(text.match(/([\d.]+) %/)![1]));
    }
    // Rounded to whole per cents, the shares still add to about 100.
    expect(Math.abs(shares.reduce((s, v) => s + v, 0) - 100)).toBeLessThanOrEqual(2);
    await byTestId(desk, 'robustness-result').waitFor();
    await desk.screenshot({ path: path.join(screenshotDir, 'robustness-desk-result.png'), fullPage: true });
    await phone.screenshot({ path: path.join(screenshotDir, 'robustness-phone-result.png'), fullPage: true });

    // A second run, cancelled by the Lead: the phone says so.
    await byTestId(desk, 'robustness-seed').fill('18');
    await byTestId(desk, 'robustness-start').click();
    await byTestId(desk, 'robustness-cancel').click();
    await byTestId(phone, 'robustness-cancelled').waitFor();
  });
});
