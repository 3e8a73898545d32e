import { existsSync, mkdirSync } from 'node:fs';
import path from 'node:path';

import type { BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { repoRoot } from '@/server/ops/paths';
import { webDir } from '@/server/ops/web-build';
import {
  launchBrowser,
  startTestServer,
  uniqueEmail,
  verificationLink,
  waitForMail,
} from '@/tests/helpers/test-server';

/**
 * The whole first journey in a real browser, on a phone and on a wide screen: sign up,
 * start a Team, create / rename / archive a Review, invite two people, accept from the
 * mailed link in a second browser, and check what each role is shown.
 */

const screenshotDir = path.join(repoRoot, 'artifacts', 'screenshots');
const viewports = [
  { name: 'phone', size: { width: 390, height: 844 } },
  { name: 'wide', size: { width: 1440, height: 900 } },
] as const;
const password = 'turbine-inlet-1500';

type Server = Awaited<ReturnType<typeof startTestServer>>;
let server: Server;

beforeAll(async () => {
  if (!existsSync(path.join(webDir, 'index.html'))) {
    throw new Error('The web bundle is missing: run `npm run web:build` (npm test builds it first).');
  }
  mkdirSync(screenshotDir, { recursive: true });
  server = await startTestServer();
});

afterAll(async () => {
  await server?.stop();
});

const byTestId = (page: Page, id: string) => page.locator(`[data-testid="${id}"]`);

async function snap(page: Page, viewport: string, step: string) {
  await page.screenshot({ path: path.join(screenshotDir, `${viewport}-${step}.png`) });
}

async function signUp(page: Page, name: string, email: string) {
  await page.goto(`${server.baseURL}/sign-up`);
  await byTestId(page, 'sign-up-name').fill(name);
  await byTestId(page, 'sign-up-email').fill(email);
  await byTestId(page, 'sign-up-password').fill(password);
  await byTestId(page, 'sign-up-button').click();
  await confirmAddress(page, email);
}

/** Sign-up ends at "check your inbox"; the mailed link confirms the address and signs in. */
async function confirmAddress(page: Page, email: string) {
  await byTestId(page, 'sign-up-check-inbox').waitFor();
  expect(await byTestId(page, 'sign-up-check-inbox').textContent()).toContain(email);
  const link = await verificationLink(email);
  expect(link.startsWith(`${server.baseURL}/api/auth/verify-email?`)).toBe(true);
  await page.goto(link);
}

/** Opens the invitation link from the mailbox in `page`, signs up as the invitee, accepts. */
async function acceptByMail(
  page: Page,
  email: string,
  name: string,
  expect_: { teamName: string; inviter: string; role: string; shot: string },
) {
  const mail = await waitForMail(email, /invited you/);
  expect(mail.subject).toContain(expect_.teamName);
  const link = mail.text.match(/https?:\/\/\S+\/invitation\/[\w-]+/)?.[0];
  expect(link, 'the mail carries an invitation link').toBeTruthy();
  expect(link!.startsWith(server.baseURL)).toBe(true);

  await page.goto(link!);
  const summary = byTestId(page, 'invitation-summary');
  await expect.poll(() => summary.textContent()).toContain(expect_.teamName);
  expect(await summary.textContent()).toContain(expect_.inviter);
  expect(await summary.textContent()).toContain(email);
  expect(await byTestId(page, 'invitation-role').textContent()).toBe(expect_.role);
  // The sign-up form starts with the invited address.
  expect(await byTestId(page, 'sign-up-email').inputValue()).toBe(email);
  await page.screenshot({ path: path.join(screenshotDir, `${expect_.shot}.png`) });

  await byTestId(page, 'sign-up-name').fill(name);
  await byTestId(page, 'sign-up-password').fill(password);
  await byTestId(page, 'sign-up-button').click();
  // Confirmed and signed in by the mailed link, back on the invitation to accept it.
  await confirmAddress(page, email);
  await byTestId(page, 'accept-invitation-button').click();
  await byTestId(page, 'reviews-screen').waitFor();
  expect(new URL(page.url()).pathname).toBe('/');
  expect(await byTestId(page, 'current-team-name').textContent()).toBe(expect_.teamName);
}

describe.each(viewports)('first journey at $name size', ({ name: viewport, size }) => {
  let owner: BrowserContext & { dispose(): Promise<void> };
  let guest: BrowserContext & { dispose(): Promise<void> };
  const ownerEmail = uniqueEmail(`owner-${viewport}`);
  const engineerEmail = uniqueEmail(`engineer-${viewport}`);
  const observerEmail = uniqueEmail(`observer-${viewport}`);
  const pendingOwnerEmail = uniqueEmail(`second-owner-${viewport}`);
  const teamName = `Fjellvik peaking ${viewport} ${Date.now().toString(36)}`;
  const reviewName = 'Unit 2 peaker — cycle choice';
  const renamed = 'Unit 2 peaker — final cycle choice';

  beforeAll(async () => {
    owner = await launchBrowser(size);
    guest = await launchBrowser(size);
    // A missing element fails the step in 10 s instead of hanging the run.
    owner.setDefaultTimeout(10_000);
    guest.setDefaultTimeout(10_000);
  });
  afterAll(async () => {
    await owner?.dispose();
    await guest?.dispose();
  });

  it('signs up, starts a Team and lands on its empty Reviews list', async () => {
    const page = owner.pages()[0] ?? (await owner.newPage());
    await page.goto(`${server.baseURL}/`);
    // Signed out: the protected app sends us to sign-in.
    await byTestId(page, 'sign-in-screen').waitFor();
    expect(new URL(page.url()).pathname).toBe('/sign-in');
    await snap(page, viewport, '01-sign-in');

    // Validation as you type, naming the field.
    await page.goto(`${server.baseURL}/sign-up`);
    await byTestId(page, 'sign-up-password').fill('short');
    expect(await byTestId(page, 'sign-up-password-error').textContent()).toContain('at least 10 characters');

    await signUp(page, 'Solveig Aas', ownerEmail);
    await byTestId(page, 'create-team-screen').waitFor();
    await snap(page, viewport, '02-first-team');
    await byTestId(page, 'team-name-input').fill('A');
    expect(await byTestId(page, 'team-name-input-error').textContent()).toContain('at least 2 characters');
    await byTestId(page, 'team-name-input').fill(teamName);
    await byTestId(page, 'create-team-button').click();

    await byTestId(page, 'reviews-screen').waitFor();
    expect(await byTestId(page, 'current-team-name').textContent()).toBe(teamName);
    await byTestId(page, 'reviews-empty').waitFor();
    // Phone: bottom bar; wide: side rail. Both carry the same four places.
    for (const id of ['nav-reviews', 'nav-team', 'nav-activity', 'nav-settings'])
      expect(await byTestId(page, id).count()).toBe(1);
    const bar = await byTestId(page, 'nav-reviews').boundingBox();
    if (viewport === 'phone') expect(bar!.y).toBeGreaterThan(size.height - 100);
    else expect(bar!.x).toBeLessThan(260);
    await snap(page, viewport, '03-reviews-empty');
  });

  it('creates, renames and archives a Review, with field errors as you type', async () => {
    const page = owner.pages()[0]!;
    await byTestId(page, 'new-review-button').click();
    // Submitting the empty form names the field that is missing.
    await byTestId(page, 'create-review-button').click();
    await expect
      .poll(() => byTestId(page, 'review-name-input-error').textContent())
      .toBe('Name needs at least 3 characters.');
    await byTestId(page, 'review-name-input').fill('ab');
    expect(await byTestId(page, 'review-name-input-error').textContent()).toBe('Name needs at least 3 characters.');
    await byTestId(page, 'review-name-input').fill(reviewName);
    expect(await byTestId(page, 'review-name-input-error').count()).toBe(0);
    await byTestId(page, 'review-summary-input').fill(
      '40 MW net at −20 °C design ambient; simple against recuperated.',
    );
    await snap(page, viewport, '04-new-review');
    await byTestId(page, 'create-review-button').click();

    await expect.poll(() => byTestId(page, 'review-count').textContent()).toBe('1 review');
    expect(await byTestId(page, 'review-name').allTextContents()).toEqual([reviewName]);

    // The same name again is a conflict, shown at the name field; Enter submits as the button does.
    await byTestId(page, 'new-review-button').click();
    await byTestId(page, 'review-name-input').fill(reviewName);
    await byTestId(page, 'review-name-input').press('Enter');
    await expect.poll(() => byTestId(page, 'review-name-input-error').textContent()).toMatch(/already has a review/i);
    // The server's message goes once the name changes; the schema's own shows for a short one.
    await byTestId(page, 'review-name-input').fill('x');
    await expect
      .poll(() => byTestId(page, 'review-name-input-error').textContent())
      .toBe('Name needs at least 3 characters.');
    await byTestId(page, 'review-name-input').fill(`${reviewName} (second)`);
    await expect.poll(() => byTestId(page, 'review-name-input-error').count()).toBe(0);
    await byTestId(page, 'create-review-cancel').click();

    // Rename inline.
    await page.locator('[data-testid^="review-rename-"]').first().click();
    await byTestId(page, 'review-rename-input').fill(renamed);
    await byTestId(page, 'review-rename-save').click();
    await expect.poll(() => byTestId(page, 'review-name').allTextContents()).toEqual([renamed]);
    await snap(page, viewport, '05-renamed');

    // Open the Review page; a reload of the deep link shows it again.
    await page.locator('[data-testid^="review-open-"]').first().click();
    await byTestId(page, 'candidates-empty').waitFor();
    expect(new URL(page.url()).pathname).toMatch(/^\/reviews\/[\w-]+$/);
    await page.reload();
    await byTestId(page, 'candidates-empty').waitFor();
    expect(await page.locator('h1').first().textContent()).toBe(renamed);
    expect(await byTestId(page, 'caution-line').textContent()).toContain('Concept-stage estimates');
    await snap(page, viewport, '06-review-page');

    // Archive: it leaves the active list and shows under Archived.
    await byTestId(page, 'back-to-reviews').click();
    await page.locator('[data-testid^="review-archive-"]').first().click();
    await byTestId(page, 'reviews-empty').waitFor();
    await byTestId(page, 'review-filter-archived').click();
    await expect.poll(() => byTestId(page, 'review-name').allTextContents()).toEqual([renamed]);
    expect(await page.locator('[data-testid^="review-restore-"]').count()).toBe(1);
    await snap(page, viewport, '07-archived');
    await page.locator('[data-testid^="review-restore-"]').first().click();
    await byTestId(page, 'review-filter-active').click();
    await expect.poll(() => byTestId(page, 'review-name').allTextContents()).toEqual([renamed]);

    // Activity lists what happened, newest first.
    await byTestId(page, 'nav-activity').click();
    await expect.poll(() => byTestId(page, 'activity-item').count()).toBe(4);
    expect(await byTestId(page, 'activity-item').first().textContent()).toContain('restored');
  });

  it('invites an Engineer and an Observer; the mailed links bring them into the Team', async () => {
    const page = owner.pages()[0]!;
    await byTestId(page, 'nav-team').click();
    await byTestId(page, 'invite-form').waitFor();
    await byTestId(page, 'invite-email-input').fill('not-an-address');
    expect(await byTestId(page, 'invite-email-input-error').textContent()).toBe('Enter a valid e-mail address.');
    await byTestId(page, 'invite-email-input').fill(engineerEmail);
    await byTestId(page, 'invite-role-engineer').click();
    await byTestId(page, 'invite-send-button').click();
    await expect.poll(() => byTestId(page, 'invitation-count').textContent()).toBe('1 invitation');
    await byTestId(page, 'invite-email-input').fill(observerEmail);
    await byTestId(page, 'invite-role-observer').click();
    await byTestId(page, 'invite-send-button').click();
    await expect.poll(() => byTestId(page, 'invitation-count').textContent()).toBe('2 invitations');
    expect(await byTestId(page, `invitation-${observerEmail}`).textContent()).toContain('Observer');
    await snap(page, viewport, '08-team-invited');

    const guestPage = guest.pages()[0] ?? (await guest.newPage());
    await acceptByMail(guestPage, engineerEmail, 'Jonas Lie', {
      teamName,
      inviter: 'Solveig Aas',
      role: 'Engineer',
      shot: `${viewport}-09a-invitation`,
    });
    // An Engineer sees the Review but may not create, rename or archive Reviews.
    await expect.poll(() => byTestId(guestPage, 'review-name').allTextContents()).toEqual([renamed]);
    expect(await byTestId(guestPage, 'new-review-button').count()).toBe(0);
    await snap(guestPage, viewport, '09-engineer-joined');

    // Sign out, then the Observer accepts in the same browser.
    await byTestId(guestPage, 'nav-settings').click();
    await byTestId(guestPage, 'sign-out-button').click();
    await byTestId(guestPage, 'sign-in-screen').waitFor();
    await acceptByMail(guestPage, observerEmail, 'Maren Dahl', {
      teamName,
      inviter: 'Solveig Aas',
      role: 'Observer',
      shot: `${viewport}-09b-invitation-observer`,
    });
    await expect.poll(() => byTestId(guestPage, 'review-name').allTextContents()).toEqual([renamed]);
    expect(await byTestId(guestPage, 'new-review-button').count()).toBe(0);
    // One invitation stays pending (a second Owner), for the Observer not to see.
    await byTestId(page, 'invite-email-input').fill(pendingOwnerEmail);
    await byTestId(page, 'invite-role-owner').click();
    await byTestId(page, 'invite-send-button').click();
    await expect.poll(() => byTestId(page, 'invitation-count').textContent()).toBe('1 invitation');
    expect(await guestPage.locator('[data-testid^="review-rename-"]').count()).toBe(0);
    expect(await guestPage.locator('[data-testid^="review-archive-"]').count()).toBe(0);
    await byTestId(guestPage, 'nav-team').click();
    await byTestId(guestPage, 'member-list').waitFor();
    expect(await byTestId(guestPage, 'invite-form').count()).toBe(0);
    // Pending invitations are the Owner's business: an Observer is shown none of them.
    expect(await byTestId(guestPage, 'invitation-list').count()).toBe(0);
    expect(await byTestId(guestPage, 'invitation-count').count()).toBe(0);
    await snap(guestPage, viewport, '10-observer-team');

    // The Owner's Team page now lists three members and the one invitation still pending.
    await page.reload();
    await expect.poll(() => byTestId(page, 'member-count').textContent()).toBe('3 members');
    expect(await byTestId(page, 'invitation-count').textContent()).toBe('1 invitation');
    expect(await byTestId(page, `invitation-${pendingOwnerEmail}`).textContent()).toContain('Owner');
    expect(await byTestId(page, `member-role-${observerEmail}`).textContent()).toBe('Observer');
  });

  it('sees a Review created by someone else appear without reloading', async () => {
    const page = owner.pages()[0]!;
    await byTestId(page, 'nav-reviews').click();
    await expect.poll(() => byTestId(page, 'review-count').textContent()).toBe('1 review');
    // Created through the API in the Owner's own browser session, outside this page's react-query cache.
    const created = await page.evaluate(async () => {
      const me = await (await fetch('/api/me')).json();
      const res = await fetch(`/api/teams/${me.teams[0].id}/reviews`, {
        method: 'POST',
        headers: { 'content-type': 'application/json' },
        body: JSON.stringify({ name: 'Black-start set sizing' }),
      });
      return res.status;
    });
    expect(created).toBe(201);
    await expect.poll(() => byTestId(page, 'review-count').textContent(), { timeout: 10_000 }).toBe('2 reviews');
    expect(await byTestId(page, 'review-name').allTextContents()).toContain('Black-start set sizing');
  });
});
