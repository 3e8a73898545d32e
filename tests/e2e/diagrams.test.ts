import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { pathToFileURL } from 'node:url';

import { build } from 'esbuild';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { darkTheme, lightTheme } from '@/components/ui/themes';
import { candidateSeries } from '@/components/ui/tokens';
import { repoRoot } from '@/server/ops/paths';
import { launchBrowser } from '@/tests/helpers/test-server';

/**
 * The diagram components in a real browser through react-native-web, mounted with plain props
 * on a page of their own (tests/e2e/diagrams-harness.tsx, bundled here with esbuild into a
 * temporary folder; the engine computes its cycles in the page). Phone width 360 px and wide.
 */

const screenshotDir = path.join(repoRoot, 'artifacts', 'screenshots');
let outDir: string;
let pageURL: string;

const fonts = [
  'ibm-plex-sans/400Regular/IBMPlexSans_400Regular',
  'ibm-plex-sans/500Medium/IBMPlexSans_500Medium',
  'ibm-plex-sans/600SemiBold/IBMPlexSans_600SemiBold',
  'ibm-plex-mono/400Regular/IBMPlexMono_400Regular',
  'ibm-plex-mono/500Medium/IBMPlexMono_500Medium',
];

beforeAll(async () => {
  mkdirSync(screenshotDir, { recursive: true });
  outDir = mkdtempSync(path.join(tmpdir(), 'cyclemoot-diagrams-'));
  await build({
    entryPoints: [path.join(repoRoot, 'tests/e2e/diagrams-harness.tsx')],
    absWorkingDir: repoRoot,
    bundle: true,
    outfile: path.join(outDir, 'app.js'),
    platform: 'browser',
    format: 'iife',
    jsx: 'automatic',
    logLevel: 'error',
    resolveExtensions: ['.web.tsx', '.web.ts', '.web.js', '.tsx', '.ts', '.js', '.jsx', '.mjs', '.json'],
    mainFields: ['browser', 'module', 'main'],
    alias: { 'react-native': 'react-native-web' },
    define: { 'process.env.NODE_ENV': '"production"', __DEV__: 'false', global: 'globalThis' },
    loader: { '.js': 'jsx' },
    plugins: [
      {
        name: 'repo-alias',
        setup(b) {
          b.onResolve({ filter: /^@\// }, (args) =>
            b.resolve(`./${args.path.slice(2)}`, { resolveDir: repoRoot, kind: args.kind }),
          );
        },
      },
    ],
  });
  const faces = fonts
    .map((f) => {
      const url = pathToFileURL(path.join(repoRoot, 'node_modules/@expo-google-fonts', `${f}.ttf`)).href;
      return `@font-face{font-family:'${path.basename(f)}';src:url('${url}')}`;
    })
    .join('');
  writeFileSync(
    path.join(outDir, 'index.html'),
    `<!doctype html><html><head><meta charset="utf-8"><meta name="viewport" content="width=device-width,initial-scale=1">` +
      `<style>${faces} html,body,#root{height:100%;margin:0}</style></head>` +
      `<body><div id="root"></div><script src="app.js"></script></body></html>`,
  );
  pageURL = pathToFileURL(path.join(outDir, 'index.html')).href;
}, 60_000);

afterAll(() => {
  if (outDir) rmSync(outDir, { recursive: true, force: true });
});

const byTestId = (page: Page, id: string) => page.locator(`[data-testid="${id}"]`);

async function open(viewport: { width: number; height: number }, query = '', colorScheme: 'light' | 'dark' = 'light') {
  const context = await launchBrowser(viewport);
  const page = await context.newPage();
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(String(e)));
  page.on('console', (m) => {
    if (m.type() === 'error') errors.push(m.text());
  });
  await page.emulateMedia({ colorScheme });
  await page.goto(pageURL + query);
  await byTestId(page, 'sweep-ratio').locator('svg').waitFor();
  await page.evaluate(() => document.fonts.ready);
  return { context, page, errors };
}

/** Centre of an element in the viewport, scrolled into view first so the mouse can reach it. */
async function centreOf(page: Page, id: string) {
  await byTestId(page, id).scrollIntoViewIfNeeded();
  const box = (await byTestId(page, id).boundingBox())!;
  return { x: box.x + box.width / 2, y: box.y + box.height / 2 };
}

/** A touch on the diagram's hit layer at a page point, as a finger's pointerdown. */
async function tap(page: Page, hitLayer: string, at: { x: number; y: number }) {
  await byTestId(page, hitLayer).evaluate((el, p) => {
    const rect = el.getBoundingClientRect();
    el.dispatchEvent(
      new PointerEvent('pointerdown', {
        bubbles: true,
        pointerType: 'touch',
        clientX: p.x,
        clientY: p.y,
        isPrimary: true,
        pointerId: 7,
      }),
    );
    return rect.width;
  }, at);
}

describe('diagrams on a 360 px phone', () => {
  it('draws every diagram inside the screen, described in words, with a card diagram at least 160 px tall', async () => {
    const { context, page, errors } = await open({ width: 360, height: 800 });
    try {
      expect(await byTestId(page, 'ts-simple').getAttribute('aria-label')).toBe(
        'T-s diagram of Simple: 4 states, T from 288.2 K to 1,500 K, s from 6.865 to 7.996 kJ/(kg·K)',
      );
      expect(await byTestId(page, 'ts-irr').getAttribute('aria-label')).toMatch(
        /^T-s diagram of Intercooled \+ reheat \+ regenerative: 10 states, T from 288\.2 K to 1,500 K/,
      );
      expect(await byTestId(page, 'overlay').getAttribute('aria-label')).toMatch(
        /^T-s diagrams of 3 candidates: Simple, Regenerative, Intercooled \+ reheat \+ regenerative; T from/,
      );
      expect(await byTestId(page, 'sweep-inlet').getAttribute('aria-label')).toMatch(
        /^Sweep of turbine inlet temperature from 400\.0 to 1,800 K, 15 samples; 3 not feasible; highest efficiency/,
      );
      for (const id of ['ts-simple', 'ts-irr']) {
        const svg = (await byTestId(page, id).locator('svg').boundingBox())!;
        const card = (await byTestId(page, id).boundingBox())!;
        expect(svg.height).toBeGreaterThanOrEqual(160);
        expect(svg.width).toBeLessThanOrEqual(card.width + 0.5);
      }
      // Every path of the engine is one <path>, and each state has a keyboard stop.
      expect(await byTestId(page, 'ts-irr').locator('svg path').count()).toBe(10);
      expect(await page.locator('[data-testid^="ts-irr-state-"]').count()).toBe(10);
      expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(360);
      await page.screenshot({ path: path.join(screenshotDir, 'diagrams-phone.png'), fullPage: true });
      expect(errors).toEqual([]);
    } finally {
      await context.dispose();
    }
  });

  it('colours heat added copper, heat rejected glacier and work in the candidate colour', async () => {
    const { context, page } = await open({ width: 360, height: 800 });
    try {
      const strokes = await byTestId(page, 'ts-irr')
        .locator('svg path')
        .evaluateAll((paths) => paths.map((p) => p.getAttribute('stroke')));
      // Flow order of the engine's paths: c, ic, c, regen heat, burner, t, reheat, t, regen cool, exhaust.
      const { heat, cold } = lightTheme;
      const work = candidateSeries[2];
      expect(strokes).toEqual([work, cold, work, heat, heat, work, heat, work, cold, cold]);
    } finally {
      await context.dispose();
    }
  });

  it('reads a state under the mouse, clears when it leaves, and reads the state a finger taps', async () => {
    const { context, page } = await open({ width: 360, height: 800 });
    try {
      const readout = byTestId(page, 'ts-simple-readout');
      await expect.poll(() => readout.textContent()).toMatch(/^Tap, point at or Tab/);
      const s3 = await centreOf(page, 'ts-simple-state-3');
      await page.mouse.move(s3.x + 3, s3.y + 2);
      await expect.poll(() => readout.textContent()).toMatch(/^State 3 · combustor exit/);
      const text = (await readout.textContent())!;
      expect(text).toContain('T 1,500 K');
      expect(text).toMatch(/p 1,459 kPa/);
      expect(text).toMatch(/h [\d,.]+ kJ\/kg/);
      expect(text).toMatch(/s 7\.891 kJ\/\(kg·K\)/);
      await page.mouse.move(5, 5);
      await expect.poll(() => readout.textContent()).toMatch(/^Tap, point at or Tab/);

      const s4 = await centreOf(page, 'ts-simple-state-4');
      await tap(page, 'ts-simple-hit', s4);
      await expect.poll(() => readout.textContent()).toMatch(/^State 4 · turbine exit/);
      await page.screenshot({ path: path.join(screenshotDir, 'diagrams-phone-readout.png') });
    } finally {
      await context.dispose();
    }
  });

  it('moves the readout with keyboard focus, state by state with Tab', async () => {
    const { context, page } = await open({ width: 360, height: 800 });
    try {
      let focused: string | null = null;
      for (let i = 0; i < 30 && focused !== 'ts-simple-state-1'; i++) {
        await page.keyboard.press('Tab');
        focused = await page.evaluate(() => document.activeElement?.getAttribute('data-testid') ?? null);
      }
      expect(focused).toBe('ts-simple-state-1');
      const readout = byTestId(page, 'ts-simple-readout');
      await expect.poll(() => readout.textContent()).toMatch(/^State 1 · compressor inlet/);
      expect(await byTestId(page, 'ts-simple-state-1').getAttribute('aria-label')).toMatch(
        /^State 1, compressor inlet: T 288\.2 K, p 101\.3 kPa, h [-\d.,]+ kJ\/kg, s 6\.865 kJ\/\(kg·K\)$/,
      );
      await page.keyboard.press('Tab');
      await expect.poll(() => readout.textContent()).toMatch(/^State 2 · compressor exit/);
      // The focused state is ringed in the focus colour.
      const ring = await byTestId(page, 'ts-simple')
        .locator('svg circle[stroke-width="2.5"]')
        .evaluateAll((cs) => cs.map((c) => c.getAttribute('stroke')));
      expect(ring).toEqual([lightTheme.focus]);
      // Leaving the diagram clears it.
      for (let i = 0; i < 3; i++) await page.keyboard.press('Tab');
      await expect.poll(() => readout.textContent()).toMatch(/^Tap, point at or Tab/);
    } finally {
      await context.dispose();
    }
  });

  it('names the candidate of a state on the overlay, beside a legend of all three', async () => {
    const { context, page } = await open({ width: 360, height: 800 });
    try {
      expect(await byTestId(page, 'overlay-legend').textContent()).toBe(
        'SimpleRegenerativeIntercooled + reheat + regenerative',
      );
      const strokes = await byTestId(page, 'overlay')
        .locator('svg path')
        .evaluateAll((ps) => [...new Set(ps.map((p) => p.getAttribute('stroke')))]);
      expect(strokes).toEqual([candidateSeries[0], candidateSeries[1], candidateSeries[2]]);
      const s6 = await centreOf(page, 'overlay-state-irr-6');
      await page.mouse.move(s6.x, s6.y);
      await expect
        .poll(() => byTestId(page, 'overlay-readout').textContent())
        .toMatch(/^Intercooled \+ reheat \+ regenerative · state 6 · combustor exit/);
    } finally {
      await context.dispose();
    }
  });

  it('leaves a gap where the engine refused a value and reads its reason', async () => {
    const { context, page } = await open({ width: 360, height: 800 });
    try {
      const chart = byTestId(page, 'sweep-inlet');
      await chart.scrollIntoViewIfNeeded();
      const lines = await chart
        .locator(`svg path[stroke="${candidateSeries[0]}"]`)
        .evaluateAll((ps) => ps.map((p) => p.getAttribute('d')!));
      // One run per panel: the refused samples (400, 500, 600 K) start no line and draw no zero.
      expect(lines).toHaveLength(2);
      const band = (await chart.locator(`svg rect[fill="${lightTheme.danger}"]`).first().boundingBox())!;
      const svg = (await chart.locator('svg').boundingBox())!;
      for (const d of lines) {
        const firstX = Number(/^M(-?[\d.]+),/.exec(d)![1]);
        expect(svg.x + firstX).toBeGreaterThan(band.x + band.width - 0.5);
      }
      await page.mouse.move(band.x + band.width / 2, band.y + band.height / 2);
      await expect
        .poll(() => byTestId(page, 'sweep-inlet-readout').textContent())
        .toMatch(
          /^Turbine inlet temperature [\d.]+ KNot feasible: The turbine inlet temperature \(\d+ K\) must be above/,
        );
      await page.mouse.move(band.x + band.width + 120, band.y + 20);
      await expect
        .poll(() => byTestId(page, 'sweep-inlet-readout').textContent())
        .toMatch(/^Turbine inlet temperature [\d,.]+ Kη [\d.]+ %w [\d.]+ kJ\/kg$/);
    } finally {
      await context.dispose();
    }
  });
});

describe('diagrams in US customary units and in the dark', () => {
  it('labels axes and readouts in °F, Btu/(lb·°R), psia and Btu/lb, in the dark theme’s colours', async () => {
    const { context, page, errors } = await open({ width: 360, height: 800 }, '?units=us', 'dark');
    try {
      const labels = await byTestId(page, 'ts-simple').locator('svg text').allTextContents();
      expect(labels).toContain('T, °F');
      expect(labels).toContain('s, Btu/(lb·°R)');
      expect(labels).toContain('2,000');
      const s3 = await centreOf(page, 'ts-simple-state-3');
      await page.mouse.move(s3.x, s3.y);
      const readout = byTestId(page, 'ts-simple-readout');
      await expect.poll(() => readout.textContent()).toMatch(/^State 3 · combustor exit/);
      const text = (await readout.textContent())!;
      expect(text).toContain('T 2,240 °F');
      expect(text).toMatch(/p 211\.\d psia/);
      expect(text).toMatch(/h [\d,.]+ Btu\/lb/);
      expect(text).toMatch(/s 1\.88\d Btu\/\(lb·°R\)/);
      const strokes = await byTestId(page, 'ts-simple')
        .locator('svg path')
        .evaluateAll((ps) => ps.map((p) => p.getAttribute('stroke')));
      expect(strokes).toEqual([candidateSeries[0], darkTheme.heat, candidateSeries[0], darkTheme.cold]);
      const tickFill = await byTestId(page, 'ts-simple').locator('svg text').first().getAttribute('fill');
      expect(tickFill).toBe(darkTheme.textSoft);
      expect(await byTestId(page, 'sweep-ratio').locator('svg text').allTextContents()).toContain(
        'Net specific work, Btu/lb',
      );
      await page.screenshot({ path: path.join(screenshotDir, 'diagrams-phone-us-dark.png'), fullPage: true });
      expect(errors).toEqual([]);
    } finally {
      await context.dispose();
    }
  });
});

describe('diagrams on a wide screen', () => {
  it('grows the detail diagram to 280–440 px and keeps the card size at 200 px', async () => {
    const { context, page } = await open({ width: 1280, height: 900 });
    try {
      const large = (await byTestId(page, 'ts-irr-large').locator('svg').boundingBox())!;
      expect(large.height).toBeGreaterThanOrEqual(280);
      expect(large.height).toBeLessThanOrEqual(440);
      expect(large.width).toBeGreaterThan(700);
      const small = (await byTestId(page, 'ts-simple').locator('svg').boundingBox())!;
      expect(small.height).toBe(200);
      await page.screenshot({ path: path.join(screenshotDir, 'diagrams-wide.png'), fullPage: true });
    } finally {
      await context.dispose();
    }
  });
});
