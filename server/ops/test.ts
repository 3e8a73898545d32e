import { spawnSync } from 'node:child_process';
import path from 'node:path';

import { ensureChromium } from './chromium';
import { repoRoot } from './paths';
import { ensureWebBuild } from './web-build';

/**
 * `npm test`: Chromium and the web bundle first (the browser tests need both), then every
 * vitest suite. Postgres and the mail fake are started by the vitest global setup, so a
 * single test file also runs on its own with `npx vitest run <file>`.
 */
function main() {
  const started = Date.now();
  ensureChromium();
  ensureWebBuild();
  const res = spawnSync(process.execPath, [path.join(repoRoot, 'node_modules', 'vitest', 'vitest.mjs'), 'run', ...process.argv.slice(2)], {
    cwd: repoRoot,
    stdio: 'inherit',
    env: { ...process.env, CYCLEMOOT_WEB_READY: '1' },
  });
  console.log(`npm test finished in ${((Date.now() - started) / 1000).toFixed(1)} s`);
  process.exit(res.status ?? 1);
}

try {
  main();
} catch (error) {
  console.error(`\nnpm test could not run: ${(error as Error).message}`);
  process.exit(1);
}
