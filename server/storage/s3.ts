import type { Readable } from 'node:stream';

import { DeleteObjectCommand, GetObjectCommand, NoSuchKey, PutObjectCommand, S3Client } from '@aws-sdk/client-s3';

import type { FileStorage } from './index';

export type S3Settings = {
  /** e.g. http://127.0.0.1:9000 for a local store; the provider's URL otherwise. */
  endpoint: string;
  bucket: string;
  accessKeyId: string;
  secretAccessKey: string;
  region: string;
  /** Bucket in the path (http://host/bucket/key), as local S3-compatible stores need. */
  forcePathStyle: boolean;
};

/** Bytes in an S3-compatible bucket through @aws-sdk/client-s3. */
export function s3Storage(settings: S3Settings): FileStorage & { client: S3Client } {
  const client = new S3Client({
    endpoint: settings.endpoint,
    region: settings.region,
    forcePathStyle: settings.forcePathStyle,
    credentials: { accessKeyId: settings.accessKeyId, secretAccessKey: settings.secretAccessKey },
    // Checksums only where S3 requires them: S3-compatible stores do not all read the trailers.
    requestChecksumCalculation: 'WHEN_REQUIRED',
    responseChecksumValidation: 'WHEN_REQUIRED',
  });
  const Bucket = settings.bucket;
  return {
    driver: 's3',
    client,
    async put(key, bytes, contentType) {
      await client.send(
        new PutObjectCommand({ Bucket, Key: key, Body: bytes, ContentType: contentType, ContentLength: bytes.length }),
      );
    },
    async get(key) {
      try {
        const out = await client.send(new GetObjectCommand({ Bucket, Key: key }));
        return (out.Body as Readable | undefined) ?? null;
      } catch (error) {
        if (error instanceof NoSuchKey || (error as { name?: string }).name === 'NoSuchKey') return null;
        throw error;
      }
    },
    async delete(key) {
      await client.send(new DeleteObjectCommand({ Bucket, Key: key }));
    },
  };
}
