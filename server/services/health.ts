import { sql } from 'drizzle-orm';

import type { Database } from '@/db/client';

/** The health check answers within this even when the database hangs. */
const healthTimeoutMs = 2_000;

export type DatabaseHealth = { ok: true; latencyMs: number } | { ok: false; message: string };

/** One `select 1`, bounded in time. Never the driver's message: it can carry the host, port or user. */
export async function checkDatabase(db: Database): Promise<DatabaseHealth> {
  const started = performance.now();
  const check = db.execute(sql`select 1`);
  let timer: NodeJS.Timeout | undefined;
  const timeout = new Promise<never>((_resolve, reject) => {
    timer = setTimeout(() => reject(new Error('timed out')), healthTimeoutMs);
  });
  try {
    await Promise.race([check, timeout]);
    return { ok: true, latencyMs: Math.round((performance.now() - started) * 10) / 10 };
  } catch {
    check.catch(() => {});
    return { ok: false, message: 'The database is not reachable.' };
  } finally {
    clearTimeout(timer);
  }
}
