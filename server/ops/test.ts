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
 * `npm test`: types, lint and formatting (each runs and reports, whatever the others found), Chromium and the web bundle (the browser tests need
 * both), then every vitest suite. Postgres and the mail fake are started by the vitest
 * global setup, so a single test file also runs on its own with `npx vitest run <file>`.
 * Arguments (`npm test -- tests/server`) narrow the vitest run and skip the static checks.
 */
function main() {
  const started = Date.now();
  const narrowed = process.argv.length > 2;
  // Every static check runs, whatever the one before it found; all failures are listed at the end.
  const failedChecks: string[] = [];
  const check = (label: string, args: string[]) => {
    if (run(label, args) !== 0) failedChecks.push(label);
  };
  if (!narrowed) {
    const tsc = bin('typescript', 'bin/tsc');
    check('typecheck (app and server)', [tsc, '--noEmit', '-p', 'tsconfig.json']);
    check('typecheck (engine, no Node types)', [tsc, '--noEmit', '-p', 'server/engine/tsconfig.json']);
    check('lint (ESLint: typescript-eslint, react-hooks, import boundaries)', [
      bin('eslint', 'bin/eslint.js'),
      '--max-warnings',
      '0',
      '.',
    ]);
    check('formatting', [bin('prettier', 'bin/prettier.cjs'), '--check', '--log-level', 'warn', '.']);
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
  const t = totals();
  console.log(`npm test finished in ${((Date.now() - started) / 1000).toFixed(1)} s`);
  for (const label of failedChecks) console.log(`[test] static check failed: ${label} (see above)`);
  if (t) console.log(`Tests: ${t.passed} passed, ${t.failed} failed${t.skipped ? `, ${t.skipped} skipped` : ''}`);
  const status = failedChecks.length > 0 || vitest !== 0 ? 1 : 0;
  process.exit(status);
}

try {
  main();
} catch (error) {
  console.error(`\nnpm test could not run: ${(error as Error).message}`);
  process.exit(1);
}
