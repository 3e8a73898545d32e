import { existsSync } from 'node:fs';
import path from 'node:path';

import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { webDir } from '@/server/ops/web-build';
import { signUp, startTeam, testPassword, type TestUser } from '@/tests/helpers/api';
import { launchBrowser, startTestServer } from '@/tests/helpers/test-server';

/**
 * The unit system lives with the account: chosen on a phone, it is what a second device (a
 * browser with nothing stored) shows, and it survives a reload.
 */

type Server = Awaited<ReturnType<typeof startTestServer>>;
let server: Server;
let person: TestUser;
const browsers: Array<Awaited<ReturnType<typeof launchBrowser>>> = [];

beforeAll(async () => {
  if (!existsSync(path.join(webDir, 'index.html'))) {
    throw new Error('The web bundle is missing: run `npm run web:build` (npm test builds it first).');
  }
  server = await startTestServer();
  person = await signUp(server.baseURL, 'Una Units');
  await startTeam(person, 'Units team');
});

afterAll(async () => {
  for (const b of browsers) await b.dispose();
  await server?.stop();
});

const byTestId = (page: Page, id: string) => page.locator(`[data-testid="${id}"]`);

async function signedInSettings(viewport: { width: number; height: number }) {
  const browser = await launchBrowser(viewport);
  browsers.push(browser);
  const page = browser.pages()[0] ?? (await browser.newPage());
  await page.goto(`${server.baseURL}/sign-in`);
  await byTestId(page, 'sign-in-email').fill(person.email);
  await byTestId(page, 'sign-in-password').fill(testPassword);
  await byTestId(page, 'sign-in-button').click();
  await byTestId(page, 'nav-settings').click();
  await byTestId(page, 'settings-screen').waitFor();
  return page;
}

const checked = (page: Page, system: 'si' | 'us') =>
  byTestId(page, `unit-system-${system}`).getAttribute('aria-checked');
const storedOnServer = async () =>
  (await (await fetch(`${server.baseURL}/api/me/settings`, { headers: { cookie: person.cookie } })).json()).unitSystem;

describe('the unit system, kept with the account', () => {
  it('follows the person from one device to another and through a reload', async () => {
    const phone = await signedInSettings({ width: 390, height: 844 });
    await expect.poll(() => checked(phone, 'si')).toBe('true');
    await byTestId(phone, 'unit-system-us').click();
    await expect.poll(() => checked(phone, 'us')).toBe('true');
    expect(await byTestId(phone, 'unit-summary').textContent()).toContain('°F');
    await expect.poll(storedOnServer).toBe('us');

    // Another device: a fresh browser profile, nothing in its local storage.
    const desk = await signedInSettings({ width: 1440, height: 900 });
    await expect.poll(() => checked(desk, 'us')).toBe('true');
    expect(await byTestId(desk, 'unit-summary').textContent()).toContain('psia');

    // Changed back at the desk, the phone shows SI after a reload, its own remembered value notwithstanding.
    await byTestId(desk, 'unit-system-si').click();
    await expect.poll(storedOnServer).toBe('si');
    await phone.reload();
    await byTestId(phone, 'settings-screen').waitFor();
    await expect.poll(() => checked(phone, 'si')).toBe('true');
    expect(await byTestId(phone, 'unit-summary').textContent()).toContain('kPa');
  });
});
