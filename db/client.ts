import { drizzle, type NodePgDatabase } from 'drizzle-orm/node-postgres';
import { Pool } from 'pg';

import * as schema from '@/db/schema';

export type Database = NodePgDatabase<typeof schema> & { $client: Pool };

/** One pool per process; the server and the tests each create theirs from a URL. */
export function createDatabase(url: string, max = 10): Database {
  const pool = new Pool({ connectionString: url, max, connectionTimeoutMillis: 5_000 });
  return drizzle(pool, { schema }) as Database;
}

export { schema };
