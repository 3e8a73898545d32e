import path from 'node:path';

import { migrate } from 'drizzle-orm/node-postgres/migrator';

import { createDatabase } from '@/db/client';

import { repoRoot } from './paths';

/** Applies the committed drizzle-kit migrations in db/migrations. */
export async function migrateDatabase(url: string) {
  const db = createDatabase(url, 1);
  try {
    await migrate(db, { migrationsFolder: path.join(repoRoot, 'db', 'migrations') });
  } finally {
    await db.$client.end();
  }
}
