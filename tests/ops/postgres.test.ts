import { describe, expect, it } from 'vitest';

import { defaultPgPort, ensureCluster } from '@/server/ops/postgres';

describe("the project's own Postgres cluster", () => {
  it('is reused on a second start and listens on its own port, never 5432', async () => {
    const first = await ensureCluster();
    const again = await ensureCluster();
    expect(again.dataDir).toBe(first.dataDir);
    expect(first.port).not.toBe(5432);
    expect(first.port).toBe(Number(process.env.CYCLEMOOT_PG_PORT ?? defaultPgPort));
    expect(first.url('x')).toMatch(/^postgres:\/\/\w+:[^@]+@127\.0\.0\.1:\d+\/x$/);
  });

  it('names the port and the data directory when asked for a port it does not run on', async () => {
    const running = await ensureCluster();
    const wrongPort = running.port + 1;
    await expect(ensureCluster(wrongPort)).rejects.toThrow(new RegExp(`${running.port}.*${wrongPort}|${wrongPort}`));
    await expect(ensureCluster(wrongPort)).rejects.toThrow(running.dataDir);
  });
});
