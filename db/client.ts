import { drizzle, type NodePgDatabase } from 'drizzle-orm/node-postgres';
import { Pool } from 'pg';

import * as schema from '@/db/schema';

export type Database = NodePgDatabase<typeof schema> & { $client: Pool };
/** The handle a `db.transaction` callback receives. */
export type Tx = Parameters<Parameters<Database['transaction']>[0]>[0];
/** Either: a read that may run inside or outside a transaction. */
export type Reader = Database | Tx;

/**
 * One pool per process; the server and the tests each create theirs from a URL.
 *
 * An idle connection that the database drops (restart, shutdown, network) makes the pool
 * emit `error`; unhandled, that event would end the process. It is logged once per outage
 * instead: the pool discards the broken client and opens a new one when Postgres is back.
 */
export function createDatabase(url: string, max = 10): Database {
  const pool = new Pool({ connectionString: url, max, connectionTimeoutMillis: 5_000 });
  let lastLogged = 0;
  pool.on('error', (error) => {
    if (Date.now() - lastLogged < 10_000) return;
    lastLogged = Date.now();
    console.error(`[db] a pooled connection was lost: ${error.message}`);
  });
  return drizzle(pool, { schema }) as Database;
}

export { schema };
