import type { Readable } from 'node:stream';

import type { Database } from '@/db/client';

import { postgresStorage } from './postgres';
import { s3Storage, type S3Settings } from './s3';

export type StorageDriver = 'postgres' | 's3';

/**
 * Where a file's bytes live. One small interface, two drivers: Postgres (the default, a
 * `file_blob` row per object) and S3 (any S3-compatible store). The `stored_file` row that
 * names the key is the files service's; a driver only keeps bytes.
 */
export type FileStorage = {
  readonly driver: StorageDriver;
  put(key: string, bytes: Buffer, contentType: string): Promise<void>;
  /** The bytes (or a stream of them); null when nothing is stored under `key`. */
  get(key: string): Promise<Buffer | Readable | null>;
  /** Removes the object; removing a missing key is not an error. */
  delete(key: string): Promise<void>;
};

/**
 * The storage the environment asks for: `CYCLEMOOT_STORAGE=s3` with `CYCLEMOOT_S3_ENDPOINT`,
 * `CYCLEMOOT_S3_BUCKET`, `CYCLEMOOT_S3_ACCESS_KEY_ID`, `CYCLEMOOT_S3_SECRET_ACCESS_KEY` and
 * optionally `CYCLEMOOT_S3_REGION` (us-east-1) and `CYCLEMOOT_S3_PATH_STYLE` (true); anything
 * else (unset, `postgres`) keeps the bytes in the product's own database.
 */
export function storageFromEnv(db: Database, env: Record<string, string | undefined> = process.env): FileStorage {
  const chosen = (env.CYCLEMOOT_STORAGE ?? 'postgres').trim().toLowerCase();
  if (chosen === 'postgres' || chosen === '') return postgresStorage(db);
  if (chosen !== 's3') throw new Error(`CYCLEMOOT_STORAGE must be postgres or s3, not "${env.CYCLEMOOT_STORAGE}".`);
  const required = (name: string) => {
    const value = env[name]?.trim();
    if (!value) throw new Error(`CYCLEMOOT_STORAGE=s3 needs ${name}.`);
    return value;
  };
  const settings: S3Settings = {
    endpoint: required('CYCLEMOOT_S3_ENDPOINT'),
    bucket: required('CYCLEMOOT_S3_BUCKET'),
    accessKeyId: required('CYCLEMOOT_S3_ACCESS_KEY_ID'),
    secretAccessKey: required('CYCLEMOOT_S3_SECRET_ACCESS_KEY'),
    region: env.CYCLEMOOT_S3_REGION?.trim() || 'us-east-1',
    forcePathStyle: (env.CYCLEMOOT_S3_PATH_STYLE ?? 'true').trim().toLowerCase() !== 'false',
  };
  return s3Storage(settings);
}

/** Reads a driver's answer into one buffer (downloads are at most 20 MiB). */
export async function readAll(body: Buffer | Readable): Promise<Buffer> {
  if (Buffer.isBuffer(body)) return body;
  const chunks: Buffer[] = [];
  for await (const chunk of body) chunks.push(Buffer.isBuffer(chunk) ? chunk : Buffer.from(chunk as Uint8Array));
  return Buffer.concat(chunks);
}

export { postgresStorage, s3Storage };
export type { S3Settings };
