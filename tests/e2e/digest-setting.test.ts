import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { signUp, startTeam, type TestUser } from '@/tests/helpers/api';
import { byTestId, requireWebBundle, signInThroughForm, type Browser } from '@/tests/helpers/browser';
import { startTestServer } from '@/tests/helpers/test-server';

/** The daily digest is chosen on the settings screen, kept with the account, and survives a reload. */

let server: Awaited<ReturnType<typeof startTestServer>>;
let person: TestUser;
const browsers: Browser[] = [];

beforeAll(async () => {
  requireWebBundle();
  server = await startTestServer();
  person = await signUp(server.baseURL, 'Dora Digest');
  await startTeam(person, 'Digest team');
});
afterAll(async () => {
  for (const b of browsers) await b.dispose();
  await server?.stop();
});

const stored = async () =>
  (await (await fetch(`${server.baseURL}/api/me/settings`, { headers: { cookie: person.cookie } })).json()) as {
    dailyDigest: boolean;
  };

describe('the daily digest setting', () => {
  it('is off at first, turned on from the settings screen, and stays on after a reload', async () => {
    const page = await signInThroughForm(server.baseURL, person, { width: 390, height: 844 }, browsers);
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
