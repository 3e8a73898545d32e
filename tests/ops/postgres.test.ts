import { readFileSync } from 'node:fs';
import path from 'node:path';

import { describe, expect, it } from 'vitest';

import { defaultPgPort, ensureCluster } from '@/server/ops/postgres';

import { portIsFree } from '../helpers/ports';

describe("the project's own Postgres cluster", () => {
  it('is reused on a second start and listens on its own port, never 5432', async () => {
    const first = await ensureCluster();
    const again = await ensureCluster();
    expect(again.dataDir).toBe(first.dataDir);
    expect(first.port).not.toBe(5432);
    // CYCLEMOOT_PG_PORT when set; otherwise the port it runs on (54329 unless another checkout held it).
    if (process.env.CYCLEMOOT_PG_PORT) expect(first.port).toBe(Number(process.env.CYCLEMOOT_PG_PORT));
    const pid = readFileSync(path.join(first.dataDir, 'postmaster.pid'), 'utf8').split('\n');
    expect(first.port).toBe(Number(pid[3]));
    expect(again.port).toBe(first.port);
    if (first.port !== defaultPgPort) expect(await portIsFree(defaultPgPort)).toBe(false);
    expect(first.url('x')).toMatch(/^postgres:\/\/\w+:[^@]+@127\.0\.0\.1:\d+\/x$/);
  });

  it('names the port and the data directory when asked for a port it does not run on', async () => {
    const running = await ensureCluster();
    const wrongPort = running.port + 1;
    await expect(ensureCluster(wrongPort)).rejects.toThrow(new RegExp(`${running.port}.*${wrongPort}|${wrongPort}`));
    await expect(ensureCluster(wrongPort)).rejects.toThrow(running.dataDir);
  });
});
