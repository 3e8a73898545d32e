import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { signUp, startTeam, testPassword, type TestUser } from '@/tests/helpers/api';
import { byTestId, requireWebBundle } from '@/tests/helpers/browser';
import { launchBrowser, startTestServer } from '@/tests/helpers/test-server';

/** The daily digest is chosen on the settings screen, kept with the account, and survives a reload. */

let server: Awaited<ReturnType<typeof startTestServer>>;
let person: TestUser;
let browser: Awaited<ReturnType<typeof launchBrowser>> | undefined;

beforeAll(async () => {
  requireWebBundle();
  server = await startTestServer();
  person = await signUp(server.baseURL, 'Dora Digest');
  await startTeam(person, 'Digest team');
});
afterAll(async () => {
  await browser?.dispose();
  await server?.stop();
});

const stored = async () =>
  (await (await fetch(`${server.baseURL}/api/me/settings`, { headers: { cookie: person.cookie } })).json()) as {
    dailyDigest: boolean;
  };

describe('the daily digest setting', () => {
  it('is off at first, turned on from the settings screen, and stays on after a reload', async () => {
    browser = await launchBrowser({ width: 390, height: 844 });
    const page = browser.pages()[0] ?? (await browser.newPage());
    await page.goto(`${server.baseURL}/sign-in`);
    await byTestId(page, 'sign-in-email').fill(person.email);
    await byTestId(page, 'sign-in-password').fill(testPassword);
    await byTestId(page, 'sign-in-button').click();
    await byTestId(page, 'nav-settings').click();
    await byTestId(page, 'settings-screen').waitFor();
    await expect.poll(() => byTestId(page, 'daily-digest-off').getAttribute('aria-checked')).toBe('true');

    await byTestId(page, 'daily-digest-daily').click();
    await expect.poll(async () => (await stored()).dailyDigest).toBe(true);
    expect(await byTestId(page, 'daily-digest-summary').textContent()).toContain('07:00 UTC');

    await page.reload();
    await byTestId(page, 'settings-screen').waitFor();
    await expect.poll(() => byTestId(page, 'daily-digest-daily').getAttribute('aria-checked')).toBe('true');
  });
});
