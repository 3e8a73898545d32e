import { randomUUID } from 'node:crypto';

import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { fileBlob, storedFile } from '@/db/schema';

import { createTestApp, testOrigin, type TestUser } from '../helpers/api';
import { refusalsChangeNothing } from '../helpers/unchanged';
import { discussionTeam, type DiscussionTeam } from '../server/fixtures/discussion';
import { csvBytes, exeBytes, pdfBytes, pngBytes } from '../server/fixtures/files';

/**
 * The files routes as an attacker tries them: another Team's ids, a role without the right,
 * someone else's file, no session, another site's page, too large, lying names, missing and
 * extra parts. Each refusal is checked to have stored nothing and deleted nothing.
 */

const ctx = createTestApp();
let t: DiscussionTeam;
let them: DiscussionTeam;
let engineersFile: string;
let theirFile: string;

beforeAll(async () => {
  t = await discussionTeam(ctx, 'Ilse', 2);
  them = await discussionTeam(ctx, 'Mallory', 1);
  engineersFile = (
    await t.engineer.agent
      .post(`/api/reviews/${t.reviewId}/files`)
      .attach('file', pdfBytes(), 'datasheet.pdf')
      .expect(201)
  ).body.id;
  theirFile = (
    await them.lead.agent
      .post(`/api/reviews/${them.reviewId}/files`)
      .attach('file', csvBytes(), 'theirs.csv')
      .expect(201)
  ).body.id;
});
afterAll(() => ctx.close());

async function snapshot() {
  const [files, blobs] = await Promise.all([ctx.db.select().from(storedFile), ctx.db.select().from(fileBlob)]);
  return JSON.stringify({ files: files.map((f) => f.id).sort(), blobs: blobs.map((b) => b.storageKey).sort() });
}

const expectUnchanged = refusalsChangeNothing(snapshot, 'field');

const upload = (u: TestUser, reviewId: string) => u.agent.post(`/api/reviews/${reviewId}/files`);

describe('another Team’s Review and files', () => {
  it('are not found: list, upload, download and delete', async () => {
    await expectUnchanged(() => t.owner.agent.get(`/api/reviews/${them.reviewId}/files`), 404);
    await expectUnchanged(() => upload(t.lead, them.reviewId).attach('file', pngBytes(), 'a.png'), 404);
    await expectUnchanged(() => t.lead.agent.get(`/api/files/${theirFile}`), 404);
    await expectUnchanged(() => t.owner.agent.delete(`/api/files/${theirFile}`), 404);
    // The same answer as for a file that never was, and for an id that is no id at all.
    const never = await t.lead.agent.get(`/api/files/${randomUUID()}`);
    const theirs = await t.lead.agent.get(`/api/files/${theirFile}`);
    expect(never.status).toBe(404);
    expect(theirs.body.error.message).toBe(never.body.error.message);
    await expectUnchanged(() => t.lead.agent.get('/api/files/not-a-file'), 404);
    await expectUnchanged(() => t.lead.agent.delete(`/api/files/${'x'.repeat(101)}`), 422);
  });
});

describe('roles', () => {
  it('refuse an Observer’s upload (403) but let them list and download', async () => {
    await expectUnchanged(() => upload(t.observer, t.reviewId).attach('file', pngBytes(), 'a.png'), 403);
    expect((await t.observer.agent.get(`/api/reviews/${t.reviewId}/files`)).status).toBe(200);
    expect((await t.observer.agent.get(`/api/files/${engineersFile}`)).status).toBe(200);
  });

  it('refuse a Reviewer (and an Observer) deleting someone else’s file; the uploader and the Lead may', async () => {
    await expectUnchanged(() => t.reviewer.agent.delete(`/api/files/${engineersFile}`), 403);
    await expectUnchanged(() => t.observer.agent.delete(`/api/files/${engineersFile}`), 403);
    const reviewers = (await upload(t.reviewer, t.reviewId).attach('file', pngBytes(), 'reviewer.png').expect(201)).body
      .id;
    await expectUnchanged(() => t.engineer.agent.delete(`/api/files/${reviewers}`), 403);
    expect((await t.reviewer.agent.delete(`/api/files/${reviewers}`)).status).toBe(204);
    const another = (await upload(t.engineer, t.reviewId).attach('file', pngBytes(), 'b.png').expect(201)).body.id;
    expect((await t.lead.agent.delete(`/api/files/${another}`)).status).toBe(204);
    const third = (await upload(t.engineer, t.reviewId).attach('file', pngBytes(), 'c.png').expect(201)).body.id;
    expect((await t.owner.agent.delete(`/api/files/${third}`)).status).toBe(204);
  });
});

describe('without a session or from another site', () => {
  it('answers 401 to every route without a session', async () => {
    const anon = supertest(ctx.app);
    await expectUnchanged(() => anon.get(`/api/reviews/${t.reviewId}/files`), 401);
    await expectUnchanged(
      () => anon.post(`/api/reviews/${t.reviewId}/files`).set('Origin', testOrigin).attach('file', pngBytes(), 'a.png'),
      401,
    );
    await expectUnchanged(() => anon.get(`/api/files/${engineersFile}`), 401);
    await expectUnchanged(() => anon.delete(`/api/files/${engineersFile}`).set('Origin', testOrigin), 401);
  });

  it('refuses an upload and a delete sent by another site’s page (403)', async () => {
    const foreign = 'https://attacker.example';
    const res = await expectUnchanged(
      () =>
        supertest(ctx.app)
          .post(`/api/reviews/${t.reviewId}/files`)
          .set('Cookie', t.lead.cookie)
          .set('Origin', foreign)
          .attach('file', pngBytes(), 'a.png'),
      403,
    );
    expect(res.body.error.code).toBe('foreign_origin');
    await expectUnchanged(
      () =>
        supertest(ctx.app).delete(`/api/files/${engineersFile}`).set('Cookie', t.lead.cookie).set('Origin', foreign),
      403,
    );
    // A cookie without any Origin is refused as well.
    await expectUnchanged(
      () => supertest(ctx.app).delete(`/api/files/${engineersFile}`).set('Cookie', t.lead.cookie),
      403,
    );
  });
});

describe('bad uploads', () => {
  it('refuses 21 MB with 413 naming file', async () => {
    const big = Buffer.concat([pngBytes(), Buffer.alloc(21 * 1024 * 1024, 7)]);
    const res = await expectUnchanged(
      () => upload(t.engineer, t.reviewId).attach('file', big, 'huge.png'),
      413,
      'file',
    );
    expect(res.body.error.message).toMatch(/20 MB/);
  });

  it('refuses a PNG named .pdf and a program renamed .pdf with 422 naming file', async () => {
    const png = await expectUnchanged(
      () => upload(t.engineer, t.reviewId).attach('file', pngBytes(), 'datasheet.pdf'),
      422,
      'file',
    );
    expect(png.body.error.message).toMatch(/PNG image.*\.pdf/);
    const exe = await expectUnchanged(
      () => upload(t.engineer, t.reviewId).attach('file', exeBytes(), 'datasheet.pdf'),
      422,
      'file',
    );
    expect(exe.body.error.message).toMatch(/EXE/);
    await expectUnchanged(() => upload(t.engineer, t.reviewId).attach('file', exeBytes(), 'setup.exe'), 422, 'file');
    // Binary noise is neither a known type nor CSV text.
    await expectUnchanged(
      () => upload(t.engineer, t.reviewId).attach('file', Buffer.from([1, 0, 2, 0, 3, 0, 255]), 'noise.csv'),
      422,
      'file',
    );
    await expectUnchanged(
      () => upload(t.engineer, t.reviewId).attach('file', Buffer.alloc(0), 'empty.csv'),
      422,
      'file',
    );
  });

  it('refuses a body without the file field, or not multipart at all, with 422 naming file', async () => {
    await expectUnchanged(() => upload(t.engineer, t.reviewId).field('candidateId', t.candidates[0]), 422, 'file');
    await expectUnchanged(() => upload(t.engineer, t.reviewId).send({ file: 'aGVsbG8=' }), 422, 'file');
  });

  it('refuses a file in another field, two files, and unknown fields, naming each', async () => {
    await expectUnchanged(
      () => upload(t.engineer, t.reviewId).attach('document', pngBytes(), 'a.png'),
      422,
      'document',
    );
    await expectUnchanged(
      () => upload(t.engineer, t.reviewId).attach('file', pngBytes(), 'a.png').attach('file', pngBytes(), 'b.png'),
      422,
      'file',
    );
    await expectUnchanged(
      () => upload(t.engineer, t.reviewId).field('reviewId', them.reviewId).attach('file', pngBytes(), 'a.png'),
      422,
      'reviewId',
    );
  });

  it('refuses a candidateId of another Review (or none at all) with 422 naming candidateId', async () => {
    await expectUnchanged(
      () => upload(t.engineer, t.reviewId).field('candidateId', them.candidates[0]).attach('file', pngBytes(), 'a.png'),
      422,
      'candidateId',
    );
    await expectUnchanged(
      () => upload(t.engineer, t.reviewId).field('candidateId', 'nope').attach('file', pngBytes(), 'a.png'),
      422,
      'candidateId',
    );
  });
});
