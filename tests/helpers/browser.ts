import { existsSync } from 'node:fs';
import path from 'node:path';

import type { BrowserContext, Page } from 'playwright-core';

import { webDir } from '@/server/ops/web-build';

import { testPassword, type TestUser } from './api';
import { launchBrowser } from './test-server';

export type Browser = BrowserContext & { dispose(): Promise<void> };

/** Refuses to start a browser test without the web bundle (npm test builds it first). */
export function requireWebBundle() {
  if (!existsSync(path.join(webDir, 'index.html'))) {
    throw new Error('The web bundle is missing: run `npm run web:build` (npm test builds it first).');
  }
}

/**
 * A fresh Chromium of `size` that carries `cookie` (a signed-in session from the API helpers)
 * for `baseURL`; its first page. The browser goes into `opened`, for the test to dispose.
 */
export async function signedInPage(
  baseURL: string,
  cookie: string,
  size: { width: number; height: number },
  opened: Browser[],
  timeoutMs = 15_000,
): Promise<Page> {
  const context = (await launchBrowser(size)) as Browser;
  opened.push(context);
  context.setDefaultTimeout(timeoutMs);
  const { hostname } = new URL(baseURL);
  await context.addCookies(
    cookie.split('; ').map((pair) => {
      const i = pair.indexOf('=');
      return { name: pair.slice(0, i), value: pair.slice(i + 1), domain: hostname, path: '/' };
    }),
  );
  return context.pages()[0] ?? (await context.newPage());
}

export const byTestId = (page: Page, id: string) => page.locator(`[data-testid="${id}"]`);

/**
 * A fresh Chromium of `size` whose first page has just sent `user`'s address and the test
 * password through the sign-in form at `baseURL` (the browser goes into `opened`); the
 * caller waits for whatever the sign-in leads to.
 */
export async function signInThroughForm(
  baseURL: string,
  user: Pick<TestUser, 'email'>,
  size: { width: number; height: number },
  opened: Browser[],
): Promise<Page> {
  const context = (await launchBrowser(size)) as Browser;
  opened.push(context);
  const page = context.pages()[0] ?? (await context.newPage());
  await page.goto(`${baseURL}/sign-in`);
  await byTestId(page, 'sign-in-email').fill(user.email);
  await byTestId(page, 'sign-in-password').fill(testPassword);
  await byTestId(page, 'sign-in-button').click();
  return page;
}
