import { spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { existsSync, readdirSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { brotliCompressSync, constants, gzipSync } from 'node:zlib';

import { repoRoot } from './paths';

const inputs = [
  'app',
  'components',
  'assets',
  'public',
  'realtime',
  'server/contracts',
  // The contracts take their limits from the engine.
  'server/engine',
  'app.json',
  'metro.config.js',
  'babel.config.js',
  'tsconfig.json',
  'package-lock.json',
  // How the bundle is built and compressed is an input too: a change here rebuilds it.
  'server/ops/web-build.ts',
];
export const webDir = path.join(repoRoot, 'dist');
const stampFile = path.join(webDir, '.build-stamp');

function* files(entry: string): Generator<string> {
  const full = path.join(repoRoot, entry);
  if (!existsSync(full)) return;
  if (statSync(full).isFile()) {
    yield entry;
    return;
  }
  for (const name of readdirSync(full).sort()) yield* files(path.join(entry, name));
}

/** A hash of everything the web bundle is built from. */
export function sourceStamp(): string {
  const hash = createHash('sha256');
  for (const entry of inputs) {
    for (const file of files(entry)) {
      hash.update(file);
      hash.update(readFileSync(path.join(repoRoot, file)));
    }
  }
  return hash.digest('hex');
}

/** Types worth compressing; images and woff/woff2 fonts are compressed already. */
const compressible = new Set(['.js', '.mjs', '.css', '.html', '.json', '.map', '.svg', '.txt', '.ttf', '.otf', '.ico']);
/** A variant that saves less than this share of the original is not written. */
const worthKeeping = 0.9;

function brotliMode(file: string): number {
  const ext = path.extname(file).toLowerCase();
  if (ext === '.ttf' || ext === '.otf') return constants.BROTLI_MODE_FONT;
  if (ext === '.ico') return constants.BROTLI_MODE_GENERIC;
  return constants.BROTLI_MODE_TEXT;
}

export type CompressionTotals = { files: number; rawBytes: number; gzipBytes: number; brotliBytes: number };

/**
 * Writes `<file>.br` (brotli, quality 11) and `<file>.gz` (gzip, level 9) beside every
 * compressible file in `dir`, for the server to send as they are (see
 * `server/http/web-bundle.ts`). Maximum effort is affordable once per build; a variant that
 * is hardly smaller than the original is left out, and the server sends the original.
 */
export function precompressWebBundle(dir: string): CompressionTotals {
  const totals: CompressionTotals = { files: 0, rawBytes: 0, gzipBytes: 0, brotliBytes: 0 };
  const walk = (folder: string) => {
    for (const entry of readdirSync(folder, { withFileTypes: true })) {
      const full = path.join(folder, entry.name);
      if (entry.isDirectory()) walk(full);
      else if (entry.isFile() && compressible.has(path.extname(entry.name).toLowerCase())) compress(full);
    }
  };
  const compress = (file: string) => {
    const raw = readFileSync(file);
    const brotli = brotliCompressSync(raw, {
      params: {
        [constants.BROTLI_PARAM_QUALITY]: constants.BROTLI_MAX_QUALITY,
        [constants.BROTLI_PARAM_MODE]: brotliMode(file),
        [constants.BROTLI_PARAM_SIZE_HINT]: raw.length,
      },
    });
    const gzip = gzipSync(raw, { level: constants.Z_BEST_COMPRESSION });
    totals.files += 1;
    totals.rawBytes += raw.length;
    totals.gzipBytes += Math.min(gzip.length, raw.length);
    totals.brotliBytes += Math.min(brotli.length, raw.length);
    if (brotli.length < raw.length * worthKeeping) writeFileSync(`${file}.br`, brotli);
    if (gzip.length < raw.length * worthKeeping) writeFileSync(`${file}.gz`, gzip);
  };
  walk(dir);
  return totals;
}

const kB = (bytes: number) => `${(bytes / 1024).toFixed(0)} kB`;

/**
 * Exports the Expo web bundle into dist/ and compresses it, when it is missing or older than
 * its sources. `expo export` empties dist/ first, so no compressed file outlives its original.
 */
export function ensureWebBuild({ force = false } = {}): { built: boolean; seconds: number } {
  const stamp = sourceStamp();
  if (
    !force &&
    existsSync(stampFile) &&
    readFileSync(stampFile, 'utf8') === stamp &&
    existsSync(path.join(webDir, 'index.html'))
  ) {
    return { built: false, seconds: 0 };
  }
  // No stamp while building: a build that stops half-way is never taken for a fresh one.
  rmSync(stampFile, { force: true });
  console.log('[web] building the web app (expo export); the first build takes about a minute…');
  const started = Date.now();
  const res = spawnSync(
    process.execPath,
    [path.join(repoRoot, 'node_modules', 'expo', 'bin', 'cli'), 'export', '--platform', 'web', '--output-dir', 'dist'],
    {
      cwd: repoRoot,
      stdio: ['ignore', 'inherit', 'inherit'],
      env: { ...process.env, EXPO_OFFLINE: '1', EXPO_NO_TELEMETRY: '1', CI: '1', NODE_ENV: 'production' },
    },
  );
  if (res.status !== 0)
    throw new Error(`The web build failed (expo export exited ${res.status}); see the output above.`);
  const totals = precompressWebBundle(webDir);
  console.log(
    `[web] compressed ${totals.files} files: ${kB(totals.rawBytes)} → gzip ${kB(totals.gzipBytes)}, brotli ${kB(totals.brotliBytes)}`,
  );
  writeFileSync(stampFile, stamp);
  const seconds = (Date.now() - started) / 1000;
  console.log(`[web] built in ${seconds.toFixed(1)} s`);
  return { built: true, seconds };
}
