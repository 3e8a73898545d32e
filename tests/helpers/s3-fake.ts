import { mkdtempSync, rmSync } from 'node:fs';
import { createRequire } from 'node:module';
import { tmpdir } from 'node:os';
import path from 'node:path';

import type { S3Settings } from '@/server/storage';

import { freePort } from './ports';

type S3rverInstance = { run(): Promise<{ port: number }>; close(): Promise<void> };
type S3rverClass = new (options: Record<string, unknown>) => S3rverInstance;

/** s3rver ships no types; loaded through require and given the two methods used. */
const S3rver = createRequire(__filename)('s3rver') as S3rverClass;

export type S3Fake = { settings: S3Settings; directory: string; stop(): Promise<void> };

/** A local S3 (s3rver) on a free loopback port, its objects in a temporary directory, one bucket. */
export async function startS3Fake(bucket = 'cyclemoot-files'): Promise<S3Fake> {
  const directory = mkdtempSync(path.join(tmpdir(), 'cyclemoot-s3-'));
  const port = await freePort();
  const server = new S3rver({
    address: '127.0.0.1',
    port,
    silent: true,
    directory,
    configureBuckets: [{ name: bucket }],
    vhostBuckets: false,
  });
  await server.run();
  return {
    directory,
    settings: {
      endpoint: `http://127.0.0.1:${port}`,
      bucket,
      // s3rver's fixed development credentials.
      accessKeyId: 'S3RVER',
      secretAccessKey: 'S3RVER',
      region: 'us-east-1',
      forcePathStyle: true,
    },
    async stop() {
      await server.close();
      rmSync(directory, { recursive: true, force: true });
    },
  };
}
