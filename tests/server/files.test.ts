import { eq } from 'drizzle-orm';
import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { activity, fileBlob, review, storedFile } from '@/db/schema';
import { createApp } from '@/server/app';
import type { Broadcast } from '@/server/services/broadcast';
import { postgresStorage, readAll, s3Storage, storageFromEnv, type FileStorage } from '@/server/storage';

import { createTestApp, testOrigin, type Sent, type TestUser } from '../helpers/api';
import { startS3Fake, type S3Fake } from '../helpers/s3-fake';
import { startTestServer } from '../helpers/test-server';
import { discussionTeam, type DiscussionTeam } from './fixtures/discussion';
import { csvBytes, jpegBytes, pdfBytes, pngBytes, xlsxBytes } from './fixtures/files';

/**
 * Files of a Review through the real app, once per storage driver: Postgres (file_blob) and
 * S3 (s3rver on a free loopback port, objects in a temporary directory).
 */

const ctx = createTestApp();
let s3: S3Fake;
let t: DiscussionTeam;

beforeAll(async () => {
  s3 = await startS3Fake();
  t = await discussionTeam(ctx, 'Fenna', 2);
});
afterAll(async () => {
  await s3?.stop();
  await ctx.close();
});

/** Puts and deletes seen by a driver, and a hook that runs between the put and the row's transaction. */
function watched(inner: FileStorage) {
  const log: string[] = [];
  let afterPut: (() => Promise<void>) | undefined;
  const storage: FileStorage = {
    driver: inner.driver,
    async put(key, bytes, type) {
      await inner.put(key, bytes, type);
      log.push(`put ${key}`);
      await afterPut?.();
    },
    get: (key) => inner.get(key),
    async delete(key) {
      log.push(`delete ${key}`);
      await inner.delete(key);
    },
  };
  return { storage, log, onPut: (fn?: () => Promise<void>) => (afterPut = fn) };
}

function appWith(storage: FileStorage) {
  const sent: Sent[] = [];
  const broadcast: Broadcast = {
    toTeam: (teamId, event, payload) => void sent.push({ teamId, event, payload }),
    toReview: (reviewId, event, payload) => void sent.push({ reviewId, event, payload }),
  };
  const app = createApp({ db: ctx.db, auth: ctx.auth, broadcast, origin: testOrigin, storage });
  const as = (u: TestUser) => ({
    get: (path: string) => supertest(app).get(path).set('Cookie', u.cookie),
    post: (path: string) => supertest(app).post(path).set('Cookie', u.cookie).set('Origin', testOrigin),
    delete: (path: string) => supertest(app).delete(path).set('Cookie', u.cookie).set('Origin', testOrigin),
  });
  return { app, sent, as };
}

const drivers = [
  { name: 'postgres', make: () => postgresStorage(ctx.db) },
  { name: 's3', make: () => s3Storage(s3.settings) },
] as const;

describe.each(drivers)('files kept by the $name driver', ({ name, make }) => {
  let w: ReturnType<typeof watched>;
  let api: ReturnType<typeof appWith>;
  beforeAll(() => {
    w = watched(make());
    api = appWith(w.storage);
  });

  /** The bytes the driver holds under `key`, or null. */
  const held = async (key: string) => {
    const body = await w.storage.get(key);
    return body ? readAll(body) : null;
  };

  it('stores each allowed kind with the type read from its content, and gives the same bytes back', async () => {
    const kinds = [
      ['site-survey.pdf', pdfBytes(), 'application/pdf'],
      ['sketch.PNG', pngBytes(), 'image/png'],
      ['photo.jpeg', jpegBytes(), 'image/jpeg'],
      ['ambient.csv', csvBytes(), 'text/csv'],
      ['site-data.xlsx', await xlsxBytes(), 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet'],
    ] as const;
    for (const [fileName, bytes, type] of kinds) {
      // The browser's claimed type is ignored: the content decides.
      const res = await api
        .as(t.engineer)
        .post(`/api/reviews/${t.reviewId}/files`)
        .attach('file', bytes, { filename: fileName, contentType: 'application/octet-stream' });
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      expect(res.body).toMatchObject({
        reviewId: t.reviewId,
        candidateId: null,
        name: fileName,
        contentType: type,
        sizeBytes: bytes.length,
        uploadedBy: { id: t.engineer.id, name: t.engineer.name },
      });
      const [row] = await ctx.db.select().from(storedFile).where(eq(storedFile.id, res.body.id));
      expect(row.driver).toBe(name);
      expect(await held(row.storageKey)).toEqual(bytes);
      if (name === 's3') {
        // Nothing of it in the database's own blob table.
        expect(await ctx.db.select().from(fileBlob).where(eq(fileBlob.storageKey, row.storageKey))).toEqual([]);
      }

      const down = await api
        .as(t.observer)
        .get(`/api/files/${res.body.id}`)
        .buffer(true)
        .parse((r, cb) => {
          const chunks: Buffer[] = [];
          r.on('data', (c: Buffer) => chunks.push(c));
          r.on('end', () => cb(null, Buffer.concat(chunks)));
        });
      expect(down.status).toBe(200);
      expect(Buffer.compare(down.body as Buffer, bytes)).toBe(0);
      expect(down.headers['content-type']).toBe(type);
      expect(down.headers['content-disposition']).toMatch(new RegExp(`^attachment; filename="?${fileName}"?$`));
      expect(down.headers['x-content-type-options']).toBe('nosniff');
      expect(Number(down.headers['content-length'])).toBe(bytes.length);
    }
    const list = await api.as(t.observer).get(`/api/reviews/${t.reviewId}/files`);
    expect(list.status).toBe(200);
    const mine = (list.body as Array<{ name: string; sha256: string }>).slice(0, kinds.length);
    // Newest first.
    expect(mine.map((f) => f.name)).toEqual(kinds.map(([n]) => n).reverse());
    expect(mine.every((f) => /^[0-9a-f]{64}$/.test(f.sha256))).toBe(true);
  });

  it('attaches to a candidate of the Review, lists by candidate, tells the room and writes Activity', async () => {
    api.sent.length = 0;
    const res = await api
      .as(t.reviewer)
      .post(`/api/reviews/${t.reviewId}/files`)
      .field('candidateId', t.candidates[1])
      .attach('file', pngBytes(8, 8), 'recuperator-sketch.png');
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.candidateId).toBe(t.candidates[1]);
    const byCandidate = await api.as(t.lead).get(`/api/reviews/${t.reviewId}/files?candidateId=${t.candidates[1]}`);
    expect(byCandidate.body.map((f: { id: string }) => f.id)).toContain(res.body.id);
    expect(byCandidate.body.every((f: { candidateId: string }) => f.candidateId === t.candidates[1])).toBe(true);
    const other = await api.as(t.lead).get(`/api/reviews/${t.reviewId}/files?candidateId=${t.candidates[0]}`);
    expect(other.body.map((f: { id: string }) => f.id)).not.toContain(res.body.id);

    expect(api.sent).toEqual([{ reviewId: t.reviewId, event: 'file:added', payload: { file: res.body } }]);
    const lines = await ctx.db.select().from(activity).where(eq(activity.reviewId, t.reviewId));
    expect(lines.find((l) => l.kind === 'file:added' && l.detail.fileId === res.body.id)?.detail).toMatchObject({
      name: 'recuperator-sketch.png',
      candidateName: 'Candidate 2',
    });
  });

  it('keeps only the last part of the name, in UTF-8, without bidi overrides', async () => {
    const res = await api
      .as(t.engineer)
      .post(`/api/reviews/${t.reviewId}/files`)
      .attach('file', csvBytes(), 'C:\\Users\\x\\..\\Müller  site \u202Ejuly\u202C.csv');
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.name).toBe('Müller site july.csv');
    const down = await api.as(t.engineer).get(`/api/files/${res.body.id}`);
    expect(down.headers['content-disposition']).toContain("filename*=UTF-8''M%C3%BCller%20site%20july.csv");
  });

  it('deletes the row and the bytes, tells the room and writes Activity', async () => {
    const up = await api.as(t.engineer).post(`/api/reviews/${t.reviewId}/files`).attach('file', pdfBytes(), 'x.pdf');
    const [row] = await ctx.db.select().from(storedFile).where(eq(storedFile.id, up.body.id));
    api.sent.length = 0;
    const del = await api.as(t.engineer).delete(`/api/files/${up.body.id}`);
    expect(del.status).toBe(204);
    expect(await ctx.db.select().from(storedFile).where(eq(storedFile.id, up.body.id))).toEqual([]);
    expect(await held(row.storageKey)).toBeNull();
    expect(api.sent).toEqual([
      {
        reviewId: t.reviewId,
        event: 'file:removed',
        payload: { reviewId: t.reviewId, fileId: up.body.id, candidateId: null },
      },
    ]);
    const lines = await ctx.db.select().from(activity).where(eq(activity.reviewId, t.reviewId));
    expect(lines.some((l) => l.kind === 'file:removed' && l.detail.fileId === up.body.id)).toBe(true);
    expect((await api.as(t.engineer).get(`/api/files/${up.body.id}`)).status).toBe(404);
  });

  it('removes the bytes again when the row cannot be written (the Review went away meanwhile)', async () => {
    const gone = await ctx.db
      .insert(review)
      .values({ teamId: t.teamId, name: `Short-lived ${name}`, createdById: t.lead.id })
      .returning({ id: review.id });
    const reviewId = gone[0].id;
    w.log.length = 0;
    w.onPut(async () => {
      await ctx.db.delete(review).where(eq(review.id, reviewId));
    });
    try {
      const res = await api.as(t.lead).post(`/api/reviews/${reviewId}/files`).attach('file', pngBytes(), 'a.png');
      expect(res.status).toBe(404);
    } finally {
      w.onPut(undefined);
    }
    expect(w.log).toHaveLength(2);
    const key = w.log[0].replace(/^put /, '');
    expect(w.log[1]).toBe(`delete ${key}`);
    expect(await held(key)).toBeNull();
    expect(await ctx.db.select().from(storedFile).where(eq(storedFile.reviewId, reviewId))).toEqual([]);
  });
});

describe('the stored name', () => {
  it('drops path parts, control and invisible formatting characters, and keeps the extension when shortened', async () => {
    const { sanitiseFileName } = await import('@/server/services/files');
    expect(sanitiseFileName('../../etc/passwd.csv')).toBe('passwd.csv');
    expect(sanitiseFileName('a\u0000b\u0007c\r\n\u200B.png')).toBe('abc.png');
    expect(sanitiseFileName('report\u202Efdp.exe.pdf')).toBe('reportfdp.exe.pdf');
    expect(sanitiseFileName('...hidden.pdf')).toBe('hidden.pdf');
    const long = sanitiseFileName(`${'x'.repeat(300)}.xlsx`);
    expect(long).toHaveLength(200);
    expect(long.endsWith('.xlsx')).toBe(true);
  });
});

describe('choosing the driver', () => {
  it('keeps bytes in Postgres unless CYCLEMOOT_STORAGE=s3 names a complete bucket', () => {
    expect(storageFromEnv(ctx.db, {}).driver).toBe('postgres');
    expect(storageFromEnv(ctx.db, { CYCLEMOOT_STORAGE: 'postgres' }).driver).toBe('postgres');
    expect(() => storageFromEnv(ctx.db, { CYCLEMOOT_STORAGE: 'ftp' })).toThrow(/postgres or s3/);
    expect(() => storageFromEnv(ctx.db, { CYCLEMOOT_STORAGE: 's3', CYCLEMOOT_S3_ENDPOINT: 'http://x' })).toThrow(
      /CYCLEMOOT_S3_BUCKET/,
    );
    const env = {
      CYCLEMOOT_STORAGE: 's3',
      CYCLEMOOT_S3_ENDPOINT: s3.settings.endpoint,
      CYCLEMOOT_S3_BUCKET: s3.settings.bucket,
      CYCLEMOOT_S3_ACCESS_KEY_ID: s3.settings.accessKeyId,
      CYCLEMOOT_S3_SECRET_ACCESS_KEY: s3.settings.secretAccessKey,
    };
    expect(storageFromEnv(ctx.db, env).driver).toBe('s3');
  });

  it('a running server set to S3 by the environment stores there; a server on the other driver answers 503 for it', async () => {
    const saved = { ...process.env };
    Object.assign(process.env, {
      CYCLEMOOT_STORAGE: 's3',
      CYCLEMOOT_S3_ENDPOINT: s3.settings.endpoint,
      CYCLEMOOT_S3_BUCKET: s3.settings.bucket,
      CYCLEMOOT_S3_ACCESS_KEY_ID: s3.settings.accessKeyId,
      CYCLEMOOT_S3_SECRET_ACCESS_KEY: s3.settings.secretAccessKey,
    });
    // No storage given: the server reads the environment, as `npm start` does.
    const server = await startTestServer({ storage: (db) => storageFromEnv(db) });
    process.env = saved;
    try {
      const res = await supertest(server.baseURL)
        .post(`/api/reviews/${t.reviewId}/files`)
        .set('Cookie', t.lead.cookie)
        .set('Origin', server.baseURL)
        .attach('file', pdfBytes(), 'from-env.pdf');
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      const [row] = await ctx.db.select().from(storedFile).where(eq(storedFile.id, res.body.id));
      expect(row.driver).toBe('s3');
      const elsewhere = await supertest(ctx.app).get(`/api/files/${res.body.id}`).set('Cookie', t.lead.cookie);
      expect(elsewhere.status).toBe(503);
      expect(elsewhere.body.error.code).toBe('storage_unavailable');
    } finally {
      await server.stop();
    }
  });
});
