import { eq } from 'drizzle-orm';
import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { activity, siteYear } from '@/db/schema';
import { demoSiteYearCsv } from '@/server/ops/demo-site-year';

import { createTeam, createTestApp, signUp, testOrigin, type TestUser } from '../helpers/api';

/**
 * The site-year routes as an attacker tries them: another Team's review, lower roles, no
 * session, another site's page, an oversized file and broken multipart. Each refusal must
 * change nothing: the stored profile and the Activity are compared whole.
 */

const ctx = createTestApp();
let owner: TestUser;
let lead: TestUser;
let engineer: TestUser;
let reviewer: TestUser;
let observer: TestUser;
let outsider: TestUser;
let reviewId: string;
let outsiderReviewId: string;
const csv = Buffer.from(demoSiteYearCsv(), 'utf8');

const url = (id = reviewId) => `/api/reviews/${id}/site-year`;

beforeAll(async () => {
  [owner, lead, engineer, reviewer, observer, outsider] = await Promise.all([
    signUp(ctx.app, 'Olga Owner'),
    signUp(ctx.app, 'Lars Lead'),
    signUp(ctx.app, 'Eva Engineer'),
    signUp(ctx.app, 'Rolf Reviewer'),
    signUp(ctx.app, 'Otto Observer'),
    signUp(ctx.app, 'Mallory Outsider'),
  ]);
  const teamId = await createTeam(ctx, owner, [
    { user: lead, role: 'lead' },
    { user: engineer, role: 'engineer' },
    { user: reviewer, role: 'reviewer' },
    { user: observer, role: 'observer' },
  ]);
  reviewId = (await lead.agent.post(`/api/teams/${teamId}/reviews`).send({ name: 'Guarded year' }).expect(201)).body.id;
  await lead.agent.put(url()).attach('file', csv, 'year.csv').expect(200);
  const otherTeam = await createTeam(ctx, outsider);
  outsiderReviewId = (
    await outsider.agent.post(`/api/teams/${otherTeam}/reviews`).send({ name: 'Mallory year' }).expect(201)
  ).body.id;
});
afterAll(() => ctx.close());

async function snapshot(id = reviewId) {
  const [rows, log] = await Promise.all([
    ctx.db.select().from(siteYear).where(eq(siteYear.reviewId, id)),
    ctx.db.select().from(activity).where(eq(activity.reviewId, id)),
  ]);
  return { rows, log: log.length };
}

async function expectUnchanged(send: () => PromiseLike<supertest.Response>, status: number, id = reviewId) {
  const before = await snapshot(id);
  const res = await send();
  expect(res.status).toBe(status);
  expect(await snapshot(id)).toEqual(before);
  return res;
}

describe('another Team', () => {
  it("finds nothing of another Team's review: GET, PUT and DELETE are 404", async () => {
    for (const send of [
      () => outsider.agent.get(url()),
      () => outsider.agent.put(url()).attach('file', csv, 'year.csv'),
      () => outsider.agent.delete(url()),
    ]) {
      const res = await expectUnchanged(send, 404);
      expect(res.body.error.code).toBe('not_found');
      expect(JSON.stringify(res.body)).not.toContain('Guarded year');
    }
    // And a member of this Team is not let into the outsider's review either.
    await expectUnchanged(
      () => lead.agent.put(url(outsiderReviewId)).attach('file', csv, 'y.csv'),
      404,
      outsiderReviewId,
    );
    // A review id that is not an id at all.
    await lead.agent.get(url('not-a-review')).expect(404);
  });
});

describe('roles', () => {
  it('lets every member read the year', async () => {
    for (const u of [owner, lead, engineer, reviewer, observer]) await u.agent.get(url()).expect(200);
  });

  it('refuses an Engineer, a Reviewer and an Observer uploading or removing (403)', async () => {
    for (const u of [engineer, reviewer, observer]) {
      const res = await expectUnchanged(() => u.agent.put(url()).attach('file', csv, 'year.csv'), 403);
      expect(res.body.error.code).toBe('forbidden');
      await expectUnchanged(() => u.agent.delete(url()), 403);
    }
  });

  it('lets the Owner replace it', async () => {
    await owner.agent.put(url()).attach('file', csv, 'owner.csv').expect(200);
    expect((await snapshot()).rows[0].fileName).toBe('owner.csv');
  });
});

describe('no session, another site', () => {
  it('answers 401 without a session', async () => {
    const anon = supertest(ctx.app);
    await expectUnchanged(() => anon.get(url()), 401);
    await expectUnchanged(() => anon.put(url()).set('Origin', testOrigin).attach('file', csv, 'y.csv'), 401);
    await expectUnchanged(() => anon.delete(url()).set('Origin', testOrigin), 401);
  });

  it("refuses an upload and a delete sent by another site's page (403 foreign_origin)", async () => {
    for (const origin of ['https://attacker.example', 'http://127.0.0.1:3999.evil.example', 'null']) {
      const res = await expectUnchanged(
        () =>
          supertest(ctx.app).put(url()).set('Cookie', lead.cookie).set('Origin', origin).attach('file', csv, 'y.csv'),
        403,
      );
      expect(res.body.error.code).toBe('foreign_origin');
      await expectUnchanged(
        () => supertest(ctx.app).delete(url()).set('Cookie', lead.cookie).set('Origin', origin),
        403,
      );
    }
  });
});

describe('bad uploads', () => {
  it('refuses 11 MB with 413 naming file', async () => {
    const big = Buffer.concat([csv, Buffer.alloc(11 * 1024 * 1024 - csv.length, '1,2,3\n')]);
    const res = await expectUnchanged(() => lead.agent.put(url()).attach('file', big, 'huge.csv'), 413);
    expect(res.body.error).toMatchObject({ code: 'file_too_large', field: 'file' });
    expect(res.body.error.message).toMatch(/10 MB/);
  });

  it('refuses malformed multipart (400) and a body that is not multipart (422 naming file)', async () => {
    const broken = await expectUnchanged(
      () =>
        lead.agent
          .put(url())
          .set('Content-Type', 'multipart/form-data; boundary=xyz')
          .send('--xyz\r\nContent-Disposition: form-data; name="file"; filename="a.csv"\r\n\r\nhour,t\r\n1,2'),
      400,
    );
    expect(broken.body.error.code).toBe('malformed_upload');
    const noBoundary = await expectUnchanged(
      () => lead.agent.put(url()).set('Content-Type', 'multipart/form-data').send('garbage'),
      400,
    );
    expect(noBoundary.body.error.code).toBe('malformed_upload');
    const json = await expectUnchanged(() => lead.agent.put(url()).send({ file: 'hour,t\n' }), 422);
    expect(json.body.error.field).toBe('file');
  });

  it('refuses a file in another field, two files, a text field, and no file at all, naming the part', async () => {
    const other = await expectUnchanged(() => lead.agent.put(url()).attach('profile', csv, 'y.csv'), 422);
    expect(other.body.error.field).toBe('profile');
    const two = await expectUnchanged(
      () => lead.agent.put(url()).attach('file', csv, 'a.csv').attach('file', csv, 'b.csv'),
      422,
    );
    expect(two.body.error.field).toBe('file');
    const text = await expectUnchanged(
      () => lead.agent.put(url()).field('reviewId', outsiderReviewId).attach('file', csv, 'a.csv'),
      422,
    );
    expect(text.body.error.field).toBe('file');
    expect(text.body.error.message).toMatch(/only the CSV file/);
    const none = await expectUnchanged(() => lead.agent.put(url()).field('x', '1'), 422);
    expect(none.body.error.field).toBe('file');
  });

  it('refuses binary noise and a spreadsheet renamed .csv as a profile without its columns (422)', async () => {
    const noise = await expectUnchanged(
      () => lead.agent.put(url()).attach('file', Buffer.from([0x50, 0x4b, 3, 4, 0, 0, 255, 10, 1, 2]), 'year.csv'),
      422,
    );
    expect(noise.body.error.code).toBe('invalid_profile');
  });

  it('keeps a hostile file name as text only', async () => {
    await lead.agent.put(url()).attach('file', csv, '<img src=x onerror=alert(1)>.csv').expect(200);
    const [row] = (await snapshot()).rows;
    expect(row.fileName).toBe('<img src=x onerror=alert(1)>.csv');
  });
});
