import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync } from 'node:fs';
import path from 'node:path';

import { ensureChromium } from './chromium';
import { repoRoot } from './paths';
import { ensureWebBuild } from './web-build';

const bin = (pkg: string, file: string) => path.join(repoRoot, 'node_modules', pkg, file);
const reportFile = path.join(repoRoot, 'artifacts', 'vitest-report.json');

function run(label: string, args: string[]) {
  console.log(`[test] ${label}`);
  const res = spawnSync(process.execPath, args, { cwd: repoRoot, stdio: 'inherit' });
  return res.status ?? 1;
}

/** Totals from vitest's JSON report, for the one plain summary line at the very end. */
function totals(): { passed: number; failed: number; skipped: number } | undefined {
  if (!existsSync(reportFile)) return undefined;
  const report = JSON.parse(readFileSync(reportFile, 'utf8')) as {
    numPassedTests: number;
    numFailedTests: number;
    numPendingTests: number;
    numTodoTests: number;
  };
  return {
    passed: report.numPassedTests,
    failed: report.numFailedTests,
    skipped: report.numPendingTests + report.numTodoTests,
  };
}

/**
 * `npm test`: types and formatting, Chromium and the web bundle (the browser tests need
 * both), then every vitest suite. Postgres and the mail fake are started by the vitest
 * global setup, so a single test file also runs on its own with `npx vitest run <file>`.
 * Arguments (`npm test -- tests/server`) narrow the vitest run and skip the static checks.
 */
function main() {
  const started = Date.now();
  const narrowed = process.argv.length > 2;
  let status = 0;
  if (!narrowed) {
    status ||= run('typecheck (app and server)', [bin('typescript', 'bin/tsc'), '--noEmit', '-p', 'tsconfig.json']);
    status ||= run('typecheck (engine, no Node types)', [
      bin('typescript', 'bin/tsc'),
      '--noEmit',
      '-p',
      'server/engine/tsconfig.json',
    ]);
    status ||= run('formatting', [bin('prettier', 'bin/prettier.cjs'), '--check', '--log-level', 'warn', '.']);
  }
  ensureChromium();
  ensureWebBuild();
  mkdirSync(path.dirname(reportFile), { recursive: true });
  const vitest = run('vitest', [
    bin('vitest', 'vitest.mjs'),
    'run',
    '--reporter=default',
    '--reporter=json',
    `--outputFile.json=${reportFile}`,
    ...process.argv.slice(2),
  ]);
  status ||= vitest;
  const t = totals();
  console.log(`npm test finished in ${((Date.now() - started) / 1000).toFixed(1)} s`);
  if (status !== 0 && vitest === 0) console.log('[test] static checks failed: see above');
  if (t) console.log(`Tests: ${t.passed} passed, ${t.failed} failed${t.skipped ? `, ${t.skipped} skipped` : ''}`);
  process.exit(status);
}

try {
  main();
} catch (error) {
  console.error(`\nnpm test could not run: ${(error as Error).message}`);
  process.exit(1);
}
