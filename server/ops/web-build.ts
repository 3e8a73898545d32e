import { spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { existsSync, readdirSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import path from 'node:path';

import { repoRoot } from './paths';

const inputs = [
  'app',
  'components',
  'assets',
  'realtime',
  'server/contracts',
  'app.json',
  'metro.config.js',
  'babel.config.js',
  'tsconfig.json',
  'package-lock.json',
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

/** Exports the Expo web bundle into dist/ when it is missing or older than its sources. */
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
  writeFileSync(stampFile, stamp);
  const seconds = (Date.now() - started) / 1000;
  console.log(`[web] built in ${seconds.toFixed(1)} s`);
  return { built: true, seconds };
}
