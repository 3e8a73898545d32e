import { mkdirSync } from 'node:fs';
import path from 'node:path';

import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { repoRoot } from '@/server/ops/paths';
import { createTeam, createTestApp, signUp, type TestUser } from '@/tests/helpers/api';
import { byTestId, requireWebBundle, signedInPage, type Browser } from '@/tests/helpers/browser';
import { startTestServer, waitForMail } from '@/tests/helpers/test-server';

/**
 * The live board in two browsers at once, as in the meeting: the Lead at a wide screen, a
 * Reviewer on a phone. The Reviewer sees the Lead's edit change the card and its T-s diagram,
 * follows Gather the room onto the candidate's page and stops following with Escape, votes in
 * the Lead's round, and comments with an @mention that mails the Lead.
 */

const screenshotDir = path.join(repoRoot, 'artifacts', 'screenshots');
type Server = Awaited<ReturnType<typeof startTestServer>>;
let server: Server;
let ctx: ReturnType<typeof createTestApp>;
let lead: TestUser;
let reviewer: TestUser;
let reviewId: string;
const ids: Record<'simple' | 'regenerative' | 'reheat', string> = { simple: '', regenerative: '', reheat: '' };
const browsers: Browser[] = [];

const shot = (page: Page, name: string) => page.screenshot({ path: path.join(screenshotDir, `board-${name}.png`) });

const signedIn = (user: TestUser, size: { width: number; height: number }) =>
  signedInPage(server.baseURL, user.cookie, size, browsers);

beforeAll(async () => {
  requireWebBundle();
  mkdirSync(screenshotDir, { recursive: true });
  server = await startTestServer();
  ctx = createTestApp();
  lead = await signUp(server.baseURL, 'Ingrid Lead');
  reviewer = await signUp(server.baseURL, 'Rolf Reviewer');
  const teamId = await createTeam(ctx, lead, [{ user: reviewer, role: 'reviewer' }]);
  const review = await lead.agent.post(`/api/teams/${teamId}/reviews`).send({ name: 'Valley peaker' });
  expect(review.status).toBe(201);
  reviewId = review.body.id;
  for (const [preset, name] of [
    ['simple', 'Open simple'],
    ['regenerative', 'Recuperated'],
    ['reheat', 'Sequential reheat'],
  ] as const) {
    const made = await lead.agent.post(`/api/reviews/${reviewId}/candidates`).send({ name, preset });
    expect(made.status).toBe(201);
    ids[preset] = made.body.id;
  }
});

afterAll(async () => {
  for (const b of browsers) await b.dispose();
  await ctx?.close();
  await server?.stop();
});

describe('a meeting on the live board: Lead at 1440×900, Reviewer at 390×844', () => {
  let desk: Page;
  let phone: Page;
  const board = () => `${server.baseURL}/reviews/${reviewId}`;

  it('the Reviewer sees the Lead’s edit change the card and its T-s diagram', async () => {
    desk = await signedIn(lead, { width: 1440, height: 900 });
    phone = await signedIn(reviewer, { width: 390, height: 844 });
    await desk.goto(board());
    await phone.goto(board());
    await byTestId(desk, 'card-grid').waitFor();
    await byTestId(phone, 'card-pager').waitFor();
    const id = ids.simple;
    await byTestId(phone, `card-ts-${id}`).waitFor();
    const efficiencyBefore = await byTestId(phone, `value-thermalEfficiency-${id}`).textContent();
    const loopBefore = await byTestId(phone, `card-ts-${id}`).innerHTML();
    expect(efficiencyBefore).toMatch(/\d/);
    // Both are in the room before the edit.
    await expect.poll(() => byTestId(desk, 'board-panel').textContent()).toContain('Rolf Reviewer');

    await byTestId(desk, `candidate-open-${id}`).click();
    await byTestId(desk, 'parameter-form').waitFor();
    await byTestId(desk, 'param-compressor-pressureRatio').fill('28');
    await byTestId(desk, 'parameters-save').click();
    await expect.poll(() => byTestId(desk, 'parameters-unsaved').count()).toBe(0);

    await expect.poll(() => byTestId(phone, `value-thermalEfficiency-${id}`).textContent()).not.toBe(efficiencyBefore);
    expect(await byTestId(phone, `card-ts-${id}`).innerHTML()).not.toBe(loopBefore);
    // What the phone shows is the engine's figure for the stored candidate.
    const stored = (await lead.agent.get(`/api/reviews/${reviewId}/board`)).body.candidates.find(
      (c: { id: string }) => c.id === id,
    );
    expect(stored.parameters.compressor.pressureRatio).toBe(28);
    const percent = (stored.results.thermalEfficiency * 100).toFixed(1);
    expect(await byTestId(phone, `value-thermalEfficiency-${id}`).textContent()).toContain(percent);
    await shot(phone, 'phone-after-edit');
  });

  it('the Reviewer follows Gather the room onto the candidate’s page and stops with Escape', async () => {
    await desk.goto(board());
    const target = ids.reheat;
    await byTestId(desk, `gather-${target}`).click();
    await byTestId(desk, 'gather-stop').waitFor();

    // The phone opens the gathered candidate's detail page by itself.
    await expect.poll(() => phone.url()).toContain(`/candidates/${target}`);
    await byTestId(phone, 'gather-banner').waitFor();
    expect(await byTestId(phone, 'gather-banner-text').textContent()).toContain('Ingrid Lead gathered the room');
    expect(await byTestId(phone, 'candidate-head').textContent()).toBeTruthy();
    await shot(phone, 'phone-following');
    await shot(desk, 'desk-gathering');

    // The Lead moves on: the follower's page moves too.
    await byTestId(desk, `gather-${ids.regenerative}`).click();
    await expect.poll(() => phone.url()).toContain(`/candidates/${ids.regenerative}`);

    await phone.keyboard.press('Escape');
    await byTestId(phone, 'follow-again').waitFor();
    expect(await byTestId(phone, 'gather-banner-text').textContent()).toContain('You stopped following');
    // No longer following: the Lead moving on leaves the phone where it is.
    await byTestId(desk, `gather-${ids.simple}`).click();
    await expect.poll(() => byTestId(phone, 'gather-banner-text').textContent()).toContain('Open simple');
    expect(phone.url()).toContain(`/candidates/${ids.regenerative}`);

    await byTestId(desk, 'gather-stop').click();
    await expect.poll(() => byTestId(phone, 'gather-banner').count()).toBe(0);
    await byTestId(phone, 'back-to-board').click();
    await byTestId(phone, 'card-pager').waitFor();
  });

  it('the Reviewer votes in the Lead’s blind round; the Lead sees who and closes it', async () => {
    await byTestId(desk, 'round-open').click();
    await byTestId(desk, 'round-open-panel').waitFor();

    await byTestId(phone, 'board-tab-round').click();
    await byTestId(phone, 'ballot').waitFor();
    await byTestId(phone, `ballot-${ids.reheat}-more`).click();
    await byTestId(phone, `ballot-${ids.reheat}-more`).click();
    await byTestId(phone, `ballot-${ids.simple}-more`).click();
    await byTestId(phone, 'ballot-save').click();

    await expect.poll(() => byTestId(desk, 'round-voters').textContent()).toContain('1 person has voted');
    expect(await byTestId(desk, 'round-voted-by').textContent()).toContain('Rolf Reviewer');
    // Blind: nobody sees a tally while it is open.
    expect(await byTestId(desk, `tally-count-${ids.reheat}`).count()).toBe(0);
    await shot(phone, 'phone-ballot');

    await byTestId(desk, 'round-close').click();
    await expect.poll(() => byTestId(phone, `tally-count-${ids.reheat}`).textContent()).toBe('2');
    expect(await byTestId(phone, `tally-count-${ids.simple}`).textContent()).toBe('1');
    await expect.poll(() => byTestId(desk, `tally-count-${ids.reheat}`).textContent()).toBe('2');
  });

  it('the Reviewer comments with an @mention: it reaches the Lead’s board and mails the Lead', async () => {
    await byTestId(phone, 'board-tab-comments').click();
    const thread = `comments-${ids.simple}`;
    await byTestId(phone, 'pager-dot-' + ids.simple).click();
    await byTestId(phone, 'comment-input').click();
    await byTestId(phone, 'comment-input').pressSequentially('The exhaust is hot for the HRSG, @Ing');
    await byTestId(phone, 'comment-mention-option').first().click();
    await byTestId(phone, 'comment-input').pressSequentially('what do you think?');
    await byTestId(phone, 'comment-post').click();
    await expect.poll(() => byTestId(phone, thread).textContent()).toContain('@Ingrid Lead');

    await expect.poll(() => byTestId(desk, `candidate-comments-${ids.simple}`).textContent()).toContain('1');
    const comments = (await lead.agent.get(`/api/reviews/${reviewId}/comments`)).body as Array<{
      body: string;
      mentions: string[];
      candidateId: string | null;
    }>;
    const posted = comments.find((c) => c.body.includes('exhaust is hot'))!;
    expect(posted.candidateId).toBe(ids.simple);
    expect(posted.mentions).toHaveLength(1);
    const mail = await waitForMail(lead.email, /Rolf Reviewer mentioned you/);
    expect(mail.text).toContain(`/reviews/${reviewId}`);
    await shot(phone, 'phone-comment');
    await shot(desk, 'desk-after-meeting');
  });

  it('at 360 px in the dark: one bottom bar, nothing wider than the screen, the T-s diagram drawn', async () => {
    const narrow = await signedIn(reviewer, { width: 360, height: 740 });
    await narrow.emulateMedia({ colorScheme: 'dark' });
    await narrow.goto(board());
    await byTestId(narrow, `card-ts-${ids.simple}`).waitFor();
    // The Review's bar replaces the main one on a phone.
    expect(await byTestId(narrow, 'nav-reviews').count()).toBe(0);
    const overflow = await narrow.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
    expect(overflow).toBeLessThanOrEqual(0);
    // The Lead's four header buttons wrap inside the screen (the page scroller would clip them unseen).
    const narrowLead = await signedIn(lead, { width: 360, height: 740 });
    await narrowLead.goto(board());
    for (const id of ['design-basis-open', 'site-year-open', 'review-details-toggle', 'add-candidate-toggle']) {
      const box = await byTestId(narrowLead, id).boundingBox();
      expect(box!.x + box!.width, id).toBeLessThanOrEqual(360);
    }
    const card = await byTestId(narrow, `candidate-card-${ids.simple}`).boundingBox();
    expect(card!.x).toBeGreaterThanOrEqual(0);
    expect(card!.x + card!.width).toBeLessThanOrEqual(360);
    // Dark: the page is dark behind light text.
    const [bg, fg] = await byTestId(narrow, 'board-screen').evaluate((el) => {
      const lum = (c: string) => {
        const [r, g, b] = (c.match(/\d+/g) ?? []).map(Number);
        return 0.2126 * r! + 0.7152 * g! + 0.0722 * b!;
      };
      const heading = el.querySelector('h1') ?? el;
      return [lum(getComputedStyle(el).backgroundColor), lum(getComputedStyle(heading).color)];
    });
    expect(bg).toBeLessThan(80);
    expect(fg).toBeGreaterThan(170);
    await shot(narrow, 'phone-360-dark');
  });
});
