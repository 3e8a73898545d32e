import { eq } from 'drizzle-orm';

import type { Database } from '@/db/client';
import { fileBlob } from '@/db/schema';

import type { FileStorage } from './index';

/** Bytes in the product's own database (table `file_blob`): nothing else to run. */
export function postgresStorage(db: Database): FileStorage {
  return {
    driver: 'postgres',
    async put(key, bytes) {
      await db.insert(fileBlob).values({ storageKey: key, bytes });
    },
    async get(key) {
      const [row] = await db.select({ bytes: fileBlob.bytes }).from(fileBlob).where(eq(fileBlob.storageKey, key));
      return row ? row.bytes : null;
    },
    async delete(key) {
      await db.delete(fileBlob).where(eq(fileBlob.storageKey, key));
    },
  };
}
