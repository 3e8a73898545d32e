import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';

import { chromium, type BrowserContext } from 'playwright-core';
import { inject } from 'vitest';

import type { SocketLimits } from '@/realtime/server';
import { productionAuthLimits, type AuthLimits } from '@/server/auth/gate';
import { startServer, type ServerConfig } from '@/server/index';
import type { QueueOptions } from '@/server/jobs/queue';
import { chromiumPath } from '@/server/ops/chromium';
import { webDir } from '@/server/ops/web-build';
import { postgresStorage } from '@/server/storage';

export const testSecret = 'test-secret-for-sessions-0123456789abcdef';

/**
 * The suites sign dozens of people up from loopback within a minute; the security tests
 * check the production limits on an app of their own.
 */
export const roomyAuthLimits: AuthLimits = Object.fromEntries(
  Object.entries(productionAuthLimits).map(([name, rule]) => [name, { ...rule, points: rule.points * 1000 }]),
) as AuthLimits;

/**
 * The job queue in tests: idle workers look twice a second and a failed mail is tried again
 * after about a second, then two, four… (production: every second, first retry after two).
 */
export const testQueueOptions: QueueOptions = { pollingIntervalSeconds: 0.5, retryDelaySeconds: 1 };

/**
 * A real server on a free loopback port: test database, mail fake (the run's own unless
 * `mail` names another), the job queue, file storage (Postgres unless `storage`), the built web app.
 */
export async function startTestServer({
  authLimits = roomyAuthLimits,
  socketLimits,
  databaseUrl = inject('databaseUrl'),
  mail,
  storage,
  queue = testQueueOptions,
}: {
  authLimits?: AuthLimits;
  socketLimits?: SocketLimits;
  databaseUrl?: string;
  mail?: { smtpPort: number; webURL: string };
  storage?: ServerConfig['storage'];
  queue?: QueueOptions;
} = {}) {
  const server = await startServer({
    authLimits,
    socketLimits,
    databaseUrl,
    secret: testSecret,
    smtp: { host: '127.0.0.1', port: mail?.smtpPort ?? inject('smtpPort') },
    port: 0,
    webDir,
    storage: storage ?? ((db) => postgresStorage(db)),
    queue,
  });
  return { baseURL: server.url, mailboxURL: mail?.webURL ?? inject('mailboxURL'), stop: () => server.close() };
}

export type Mail = { id: string; subject: string; to: Array<{ address: string }>; text: string; html?: string };

/** Mails the fake received for `address`, newest last. */
export async function mailsTo(address: string): Promise<Mail[]> {
  const res = await fetch(`${inject('mailboxURL')}/api/email`);
  const all = (await res.json()) as Mail[];
  return all.filter((m) => m.to.some((t) => t.address.toLowerCase() === address.toLowerCase()));
}

/**
 * Waits until a mail for `address` arrives (SMTP delivery is asynchronous), the newest one
 * whose subject matches `subject` when given.
 */
export async function waitForMail(address: string, subject?: RegExp, timeoutMs = 10_000): Promise<Mail> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const mails = (await mailsTo(address)).filter((m) => !subject || subject.test(m.subject));
    if (mails.length) return mails[mails.length - 1];
    if (Date.now() > deadline)
      throw new Error(`No mail${subject ? ` like ${subject}` : ''} for ${address} within ${timeoutMs} ms`);
    await new Promise((r) => setTimeout(r, 40));
  }
}

/** The address-confirmation link of the newest confirmation mail to `address`. */
export async function verificationLink(address: string): Promise<string> {
  const mail = await waitForMail(address, /^Confirm your e-mail address/);
  const link = mail.text.match(/https?:\/\/\S+\/api\/auth\/verify-email\?\S+/)?.[0];
  if (!link) throw new Error(`The confirmation mail to ${address} carries no link:\n${mail.text}`);
  return link;
}

/** Debian's Chromium through playwright-core, headless, with its own throwaway profile. */
export async function launchBrowser(
  viewport = { width: 390, height: 844 },
): Promise<BrowserContext & { dispose(): Promise<void> }> {
  const profile = mkdtempSync(path.join(tmpdir(), 'cyclemoot-chromium-'));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: chromiumPath,
    viewport,
    args: [
      '--headless',
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
    ],
  });
  return Object.assign(context, {
    async dispose() {
      await context.close();
      rmSync(profile, { recursive: true, force: true });
    },
  });
}

/** A unique address per test so runs never collide. */
export const uniqueEmail = (who: string) =>
  `${who}.${Date.now().toString(36)}${Math.random().toString(36).slice(2, 6)}@test.example`;
