/**
 * Shell benchmark: how soon a phone shows the reviews list on a cold cache. Debian's
 * Chromium at 390×844 with the CPU slowed 4× (CDP Emulation.setCPUThrottlingRate) opens
 * the reviews list, signed in as the demo Owner, in a new browser context per run (empty
 * cache), on loopback and on an emulated 4G phone network. Each run reads first-contentful-paint from the Paint Timing API, the time until
 * the first Review card is on screen, and the bytes the scripts took on the wire. Runs
 * alternate between the compressed bundle (the browser's own Accept-Encoding) and the plain
 * one (Accept-Encoding: identity), so the gain is visible. Prints figures and asserts
 * nothing. Run with `npm run bench`; its own database `cyclemoot_bench`, never the demo one.
 */
import path from 'node:path';

import { chromium, type Browser } from 'playwright-core';

import { createDatabase } from '@/db/client';
import { startServer } from '@/server/index';
import { chromiumPath, ensureChromium } from '@/server/ops/chromium';
import { startMailFake } from '@/server/ops/mail-fake';
import { migrateDatabase } from '@/server/ops/migrate';
import { stateDir } from '@/server/ops/paths';
import { ensureCluster, ensureDatabase } from '@/server/ops/postgres';
import { authSecret } from '@/server/ops/secrets';
import { demoPassword, isEmpty, seedDemo } from '@/server/ops/seed';
import { ensureWebBuild, webDir } from '@/server/ops/web-build';
import { freePort } from '@/tests/helpers/ports';

const runsPerMode = Number(process.env.BENCH_RUNS ?? 7);
const cpuSlowdown = 4;
const phone = { width: 390, height: 844 };
/** The figure the shell must stay under on a cold cache, as the board arrives. */
const targetFcpMs = 1500;
const signInAs = 'owner@tindra.example';

type Mode = { name: string; headers: Record<string, string> };
const modes: Mode[] = [
  { name: 'compressed', headers: {} },
  { name: 'uncompressed', headers: { 'Accept-Encoding': 'identity' } },
];

/**
 * Loopback is the figure the target is set on; a 4G phone (12 Mbit/s down, 60 ms round
 * trip, CDP Network.emulateNetworkConditions) shows what the bytes cost on a real network.
 */
type Network = { name: string; conditions?: { latency: number; downloadThroughput: number; uploadThroughput: number } };
const networks: Network[] = [
  { name: 'loopback' },
  {
    name: '4G phone',
    conditions: { latency: 60, downloadThroughput: (12e6 / 8) | 0, uploadThroughput: (6e6 / 8) | 0 },
  },
];

type Run = { fcpMs: number; listMs: number; jsWireBytes: number; jsBytes: number; encoding: string };

async function signIn(baseURL: string): Promise<Array<{ name: string; value: string }>> {
  const res = await fetch(`${baseURL}/api/auth/sign-in/email`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', origin: baseURL },
    body: JSON.stringify({ email: signInAs, password: demoPassword }),
  });
  if (!res.ok) throw new Error(`Sign-in as ${signInAs} failed: ${res.status} ${await res.text()}`);
  return res.headers.getSetCookie().map((line) => {
    const [pair] = line.split(';');
    const at = pair.indexOf('=');
    return { name: pair.slice(0, at), value: pair.slice(at + 1) };
  });
}

async function coldLoad(
  browser: Browser,
  baseURL: string,
  network: Network,
  mode: Mode,
  cookies: Awaited<ReturnType<typeof signIn>>,
) {
  const context = await browser.newContext({
    viewport: phone,
    deviceScaleFactor: 3,
    isMobile: true,
    hasTouch: true,
    extraHTTPHeaders: mode.headers,
  });
  try {
    await context.addCookies(cookies.map((c) => ({ ...c, url: baseURL })));
    const page = await context.newPage();
    const cdp = await context.newCDPSession(page);
    await cdp.send('Emulation.setCPUThrottlingRate', { rate: cpuSlowdown });
    await cdp.send('Network.enable');
    await cdp.send('Network.setCacheDisabled', { cacheDisabled: true });
    if (network.conditions) {
      await cdp.send('Network.emulateNetworkConditions', { offline: false, ...network.conditions });
    }
    let encoding = 'none';
    page.on('response', (response) => {
      if (response.url().endsWith('.js')) encoding = response.headers()['content-encoding'] ?? 'none';
    });
    await page.goto(`${baseURL}/`, { waitUntil: 'load' });
    const listMs = await page
      .waitForFunction(() => document.querySelector('[data-testid^="review-card-"]') && performance.now(), null, {
        timeout: 30_000,
        polling: 'raf',
      })
      .then((handle) => handle.jsonValue() as Promise<number>);
    const figures = await page.evaluate(() => {
      const fcp = performance.getEntriesByName('first-contentful-paint', 'paint')[0];
      const scripts = (performance.getEntriesByType('resource') as PerformanceResourceTiming[]).filter((r) =>
        new URL(r.name).pathname.endsWith('.js'),
      );
      return {
        fcpMs: fcp ? fcp.startTime : NaN,
        jsWireBytes: scripts.reduce((sum, r) => sum + r.transferSize, 0),
        jsBytes: scripts.reduce((sum, r) => sum + r.decodedBodySize, 0),
      };
    });
    return { ...figures, listMs, encoding } satisfies Run;
  } finally {
    await context.close();
  }
}

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  return sorted.length % 2 ? sorted[mid] : 0.5 * (sorted[mid - 1] + sorted[mid]);
}

const ms = (value: number) => `${value.toFixed(0).padStart(5)} ms`;
const kB = (bytes: number) => `${(bytes / 1024).toFixed(0)} kB`;

async function main() {
  ensureChromium();
  ensureWebBuild();
  const cluster = await ensureCluster();
  const databaseUrl = await ensureDatabase(cluster, 'cyclemoot_bench');
  await migrateDatabase(databaseUrl);
  const db = createDatabase(databaseUrl, 2);
  if (await isEmpty(db)) await seedDemo(db);
  await db.$client.end();

  const mail = await startMailFake({
    smtpPort: await freePort(),
    webPort: await freePort(),
    mailDir: path.join(stateDir(), 'bench-mail'),
  });
  const server = await startServer({
    databaseUrl,
    secret: authSecret(),
    smtp: { host: '127.0.0.1', port: mail.smtpPort },
    port: 0,
    webDir,
  });
  const browser = await chromium.launch({
    executablePath: chromiumPath,
    args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking'],
  });
  try {
    const cookies = await signIn(server.url);
    // One warm-up load, not counted: the server's first answers pay for its own start.
    await coldLoad(browser, server.url, networks[0], modes[0], cookies);
    let worstCompressedOnLoopback = NaN;
    for (const network of networks) {
      const runs = new Map<string, Run[]>(modes.map((m) => [m.name, []]));
      for (let i = 0; i < runsPerMode; i++) {
        for (const mode of modes)
          runs.get(mode.name)!.push(await coldLoad(browser, server.url, network, mode, cookies));
      }
      console.log(
        `\nReviews list, cold cache, ${phone.width}×${phone.height}, CPU ${cpuSlowdown}× slower, ${network.name} network, ${runsPerMode} runs each`,
      );
      console.log(
        'mode           encoding  JS on the wire  JS decoded   FCP median  FCP worst   list median  list worst',
      );
      for (const mode of modes) {
        const r = runs.get(mode.name)!;
        const fcp = r.map((x) => x.fcpMs);
        const list = r.map((x) => x.listMs);
        if (network === networks[0] && mode === modes[0]) worstCompressedOnLoopback = Math.max(...fcp);
        console.log(
          [
            mode.name.padEnd(14),
            r[0].encoding.padEnd(9),
            kB(r[0].jsWireBytes).padStart(14),
            kB(r[0].jsBytes).padStart(11),
            ms(median(fcp)).padStart(12),
            ms(Math.max(...fcp)).padStart(10),
            ms(median(list)).padStart(13),
            ms(Math.max(...list)).padStart(11),
          ].join(' '),
        );
      }
    }
    console.log(
      `\nTarget: first contentful paint under ${targetFcpMs} ms cold on loopback: ${worstCompressedOnLoopback < targetFcpMs ? 'met' : 'NOT met'} (worst compressed run ${worstCompressedOnLoopback.toFixed(0)} ms)`,
    );
  } finally {
    await browser.close();
    await server.close();
    await mail.stop();
  }
}

main().catch((error: Error) => {
  console.error(`\nThe shell benchmark could not run: ${error.stack ?? error.message}`);
  process.exit(1);
});
