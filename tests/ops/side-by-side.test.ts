import { spawn } from 'node:child_process';
import { chmodSync, mkdtempSync, rmSync } from 'node:fs';
import { createServer, type Server } from 'node:net';
import { tmpdir } from 'node:os';
import path from 'node:path';

import { Client } from 'pg';
import { afterAll, describe, expect, it } from 'vitest';

import { repoRoot } from '@/server/ops/paths';
import { defaultPgPort, ensureCluster, removeCluster } from '@/server/ops/postgres';

import { portIsFree } from '../helpers/ports';

/**
 * A second checkout beside this one: its own state folder (so its own cluster), no
 * CYCLEMOOT_PG_PORT, and 54329 held by someone else. Its cluster must come up on another
 * port while this run's keeps answering, as `npm test` in a second checkout needs.
 */

const otherState = mkdtempSync(path.join(tmpdir(), 'cyclemoot-second-checkout-'));
// As a checkout's own state folder is: the postgres OS user must reach into it.
chmodSync(otherState, 0o755);
let otherDataDir: string | undefined;
let holder: Server | undefined;

afterAll(async () => {
  if (otherDataDir) removeCluster({ port: 0, dataDir: otherDataDir, url: () => '' });
  rmSync(otherState, { recursive: true, force: true });
  await new Promise<void>((resolve) => (holder ? holder.close(() => resolve()) : resolve()));
});

/** Runs ensureCluster() in a process of its own, as another checkout's `npm test` would. */
function clusterOfAnotherCheckout(): Promise<{ port: number; dataDir: string; url: string; log: string }> {
  const script = `
    const { ensureCluster } = require(${JSON.stringify(path.join(repoRoot, 'server/ops/postgres.ts'))});
    ensureCluster().then((c) => console.log('CLUSTER ' + JSON.stringify({ port: c.port, dataDir: c.dataDir, url: c.url('postgres') })),
      (e) => { console.error(e.message); process.exit(1); });`;
  const env: NodeJS.ProcessEnv = { ...process.env, CYCLEMOOT_STATE_DIR: otherState };
  delete env.CYCLEMOOT_PG_PORT;
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, ['--import', 'tsx', '-e', script], { cwd: repoRoot, env });
    let out = '';
    child.stdout.on('data', (d) => (out += d));
    child.stderr.on('data', (d) => (out += d));
    child.once('exit', (code) => {
      const line = out.split('\n').find((l) => l.startsWith('CLUSTER '));
      if (code !== 0 || !line) return reject(new Error(`the second cluster did not start (exit ${code}):\n${out}`));
      resolve({ ...JSON.parse(line.slice('CLUSTER '.length)), log: out });
    });
  });
}

async function answers(url: string) {
  const client = new Client({ connectionString: url, connectionTimeoutMillis: 5_000 });
  await client.connect();
  try {
    const { rows } = await client.query<{ port: string; dir: string }>(
      "select current_setting('port') as port, current_setting('data_directory') as dir",
    );
    return rows[0];
  } finally {
    await client.end();
  }
}

describe('two checkouts’ clusters', () => {
  it('run side by side: the second takes a free port when 54329 is held', async () => {
    const mine = await ensureCluster();
    if (await portIsFree(defaultPgPort)) {
      // Nobody holds 54329 right now (this cluster runs elsewhere): hold it for the test.
      holder = createServer();
      await new Promise<void>((resolve) => holder!.listen(defaultPgPort, '127.0.0.1', () => resolve()));
    }

    const other = await clusterOfAnotherCheckout();
    otherDataDir = other.dataDir;
    expect(other.port).not.toBe(defaultPgPort);
    expect(other.port).not.toBe(mine.port);
    expect(other.dataDir.startsWith(otherState)).toBe(true);
    expect(other.log).toContain(`port ${defaultPgPort} is taken`);

    const theirs = await answers(other.url);
    expect(Number(theirs.port)).toBe(other.port);
    expect(theirs.dir).toBe(other.dataDir);
    const ours = await answers(mine.url('postgres'));
    expect(Number(ours.port)).toBe(mine.port);
    expect(ours.dir).toBe(mine.dataDir);

    // Started again, the second checkout finds its cluster where it runs.
    const again = await clusterOfAnotherCheckout();
    expect(again.port).toBe(other.port);
    expect(again.log).toContain('reusing the cluster');
  });
});
