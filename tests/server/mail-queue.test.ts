import { randomUUID } from 'node:crypto';

import { eq, sql } from 'drizzle-orm';
import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { comment, userSetting } from '@/db/schema';
import { createSmtpMailer } from '@/server/auth/mailer';
import { sendDailyDigests } from '@/server/jobs/mail';
import { startMailFake, type MailFake } from '@/server/ops/mail-fake';

import { createTestApp, type TestUser } from '../helpers/api';
import { freePort } from '../helpers/ports';
import { startTestServer, type Mail } from '../helpers/test-server';
import { discussionTeam, type DiscussionTeam } from './fixtures/discussion';

/**
 * Mail through the job queue (pg-boss on the test database): the servers here send to a
 * mail fake of this file's own, which the tests stop and start again. People and Teams are
 * made through the test app (whose mail goes to the run's fake); their session cookies work
 * on the servers, which share the database and the secret.
 */

const ctx = createTestApp();
let fake: MailFake;
let ports: { smtpPort: number; webPort: number };
let server: Awaited<ReturnType<typeof startTestServer>>;
let t: DiscussionTeam;

beforeAll(async () => {
  ports = { smtpPort: await freePort(), webPort: await freePort() };
  fake = await startMailFake(ports);
  server = await startTestServer({ mail: fake });
  t = await discussionTeam(ctx, 'Oskar', 2);
});
afterAll(async () => {
  await server?.stop();
  await fake?.stop();
  await ctx.close();
});

async function inbox(address: string, subject?: RegExp): Promise<Mail[]> {
  const all = (await (await fetch(`${fake.webURL}/api/email`)).json()) as Mail[];
  return all.filter(
    (m) =>
      m.to.some((to) => to.address.toLowerCase() === address.toLowerCase()) && (!subject || subject.test(m.subject)),
  );
}

async function waitForInbox(address: string, subject: RegExp, timeoutMs = 15_000): Promise<Mail[]> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const found = await inbox(address, subject).catch(() => []);
    if (found.length) return found;
    if (Date.now() > deadline) throw new Error(`No mail like ${subject} for ${address} within ${timeoutMs} ms`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

const on = (baseURL: string, u: TestUser) => ({
  post: (path: string) => supertest(baseURL).post(path).set('Cookie', u.cookie).set('Origin', baseURL),
});

const mention = (baseURL: string, author: TestUser, who: TestUser, text: string) =>
  on(baseURL, author)
    .post(`/api/reviews/${t.reviewId}/comments`)
    .send({ body: `@${who.name} ${text}`, clientId: `c-${randomUUID()}` });

/** The queue's rows for mails to `address` (pg-boss keeps finished jobs for a while). */
async function jobsTo(address: string) {
  const { rows } = await ctx.db.$client.query<{ state: string; retry_count: number }>(
    `select state, retry_count from pgboss.job where name = 'mail' and data->>'to' = $1 order by created_on`,
    [address],
  );
  return rows;
}

describe('mail through the job queue', () => {
  it('sends an @mention through a queued job', async () => {
    const res = await mention(server.baseURL, t.lead, t.engineer, 'please check the recuperator effectiveness.');
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const [mail] = await waitForInbox(t.engineer.email, /mentioned you/);
    expect(mail.subject).toBe('Oskar Lead mentioned you in “Oskar review” on Cyclemoot');
    expect(mail.text).toContain('recuperator effectiveness');
    await expect.poll(async () => (await jobsTo(t.engineer.email)).map((j) => j.state)).toEqual(['completed']);
  });

  it('sends an invitation through the queue', async () => {
    const email = `invitee.${randomUUID().slice(0, 8)}@test.example`;
    const res = await on(server.baseURL, t.owner)
      .post('/api/auth/organization/invite-member')
      .send({ email, role: 'reviewer', organizationId: t.teamId });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const [mail] = await waitForInbox(email, /invited you/);
    expect(mail.text).toContain(`${server.baseURL}/invitation/`);
    expect((await jobsTo(email)).length).toBe(1);
  });

  it('answers at once while the mail server is down, retries with back-off, and sends once it is back', async () => {
    await fake.stop();
    try {
      const started = Date.now();
      const res = await mention(server.baseURL, t.reviewer, t.owner, 'the fuel gas heater duty looks high.');
      const tookMs = Date.now() - started;
      expect(res.status).toBe(201);
      expect(tookMs).toBeLessThan(1_000);
      // The worker tried, failed and put the job back with a later start.
      await expect
        .poll(async () => (await jobsTo(t.owner.email)).at(-1), { timeout: 10_000, interval: 200 })
        .toMatchObject({ state: 'retry' });
      await expect
        .poll(async () => (await jobsTo(t.owner.email)).at(-1)?.retry_count, { timeout: 10_000, interval: 200 })
        .toBeGreaterThanOrEqual(1);
    } finally {
      fake = await startMailFake(ports);
    }
    const [mail] = await waitForInbox(t.owner.email, /mentioned you/, 30_000);
    expect(mail.text).toContain('fuel gas heater duty');
    await expect.poll(async () => (await jobsTo(t.owner.email)).at(-1)?.state, { timeout: 5_000 }).toBe('completed');
  });

  it('sends each mail once with two server processes working the queue', async () => {
    const second = await startTestServer({ mail: fake });
    try {
      for (let i = 0; i < 6; i++) {
        const via = i % 2 === 0 ? server.baseURL : second.baseURL;
        expect((await mention(via, t.lead, t.reviewer, `twin process note ${i}.`)).status).toBe(201);
      }
      await expect
        .poll(async () => (await inbox(t.reviewer.email, /mentioned you/)).length, { timeout: 15_000 })
        .toBe(6);
      // Longer than a poll interval and a retry: still exactly one mail per comment.
      await new Promise((r) => setTimeout(r, 2_000));
      const texts = (await inbox(t.reviewer.email, /mentioned you/)).map(
        (m) => /twin process note (\d)/.exec(m.text)?.[1],
      );
      expect(texts.sort()).toEqual(['0', '1', '2', '3', '4', '5']);
      // One daily schedule however many processes started it.
      const { rows } = await ctx.db.$client.query(`select name, cron from pgboss.schedule where name = 'mail-digest'`);
      expect(rows).toEqual([{ name: 'mail-digest', cron: '0 7 * * *' }]);
    } finally {
      await second.stop();
    }
  });
});

describe('the daily digest', () => {
  it('mails each opted-in member the others’ comments since their last digest, and only once', async () => {
    const smtp = createSmtpMailer({
      host: '127.0.0.1',
      port: fake.smtpPort,
      from: 'Cyclemoot <no-reply@cyclemoot.test>',
    });
    const other = await discussionTeam(ctx, 'Quirin', 1);
    // The engineer and the observer choose the digest (from now on); the reviewer does not.
    for (const u of [t.engineer, t.observer]) {
      await u.agent.put('/api/me/settings').send({ dailyDigest: true }).expect(200);
      const [row] = await ctx.db.select().from(userSetting).where(eq(userSetting.userId, u.id));
      expect(row.digestSentAt).not.toBeNull();
    }
    const post = (u: TestUser, reviewId: string, body: string, candidateId?: string) =>
      u.agent
        .post(`/api/reviews/${reviewId}/comments`)
        .send({ body, clientId: `d-${randomUUID()}`, ...(candidateId ? { candidateId } : {}) })
        .expect(201);
    await post(t.lead, t.reviewId, 'Intercooled case closes the heat-rate gap.', t.candidates[0]);
    await post(t.reviewer, t.reviewId, 'Site ambient of 35 °C still to be confirmed.');
    await post(t.engineer, t.reviewId, 'My own remark, not for my own digest.');
    await post(other.lead, other.reviewId, 'Another Team’s comment.');
    // A comment older than the last digest is not repeated.
    const [old] = await ctx.db
      .insert(comment)
      .values({
        reviewId: t.reviewId,
        authorId: t.lead.id,
        body: 'Already in an earlier digest.',
        clientId: `o-${randomUUID()}`,
        createdAt: sql`now() - interval '2 hours'`,
      })
      .returning({ id: comment.id });
    expect(old.id).toBeTruthy();

    const sent = await sendDailyDigests({ db: ctx.db, mailer: smtp, origin: server.baseURL });
    expect(sent).toBeGreaterThanOrEqual(2);
    const [engineers] = await waitForInbox(t.engineer.email, /new comments? in your Reviews/);
    expect(engineers.subject).toBe('Cyclemoot: 2 new comments in your Reviews');
    expect(engineers.text).toContain('Intercooled case closes the heat-rate gap.');
    expect(engineers.text).toContain('on “Candidate 1”');
    expect(engineers.text).toContain('Site ambient of 35 °C');
    expect(engineers.text).not.toContain('My own remark');
    expect(engineers.text).not.toContain('Another Team');
    expect(engineers.text).not.toContain('Already in an earlier digest');
    expect(engineers.text).toContain(`${server.baseURL}/reviews/${t.reviewId}`);
    const [observers] = await waitForInbox(t.observer.email, /new comments? in your Reviews/);
    expect(observers.subject).toBe('Cyclemoot: 3 new comments in your Reviews');
    // The reviewer did not choose it; the other Team's Lead neither.
    await new Promise((r) => setTimeout(r, 500));
    expect(await inbox(t.reviewer.email, /in your Reviews/)).toEqual([]);

    // A second run finds nothing new: no second mail.
    await sendDailyDigests({ db: ctx.db, mailer: smtp, origin: server.baseURL });
    await new Promise((r) => setTimeout(r, 500));
    expect(await inbox(t.engineer.email, /in your Reviews/)).toHaveLength(1);
    // Turned off, no digest even with news.
    await t.engineer.agent.put('/api/me/settings').send({ dailyDigest: false }).expect(200);
    await post(t.lead, t.reviewId, 'After the first digest.');
    await sendDailyDigests({ db: ctx.db, mailer: smtp, origin: server.baseURL });
    const [next] = await waitForInbox(t.observer.email, /1 new comment in your Reviews/);
    expect(next.text).toContain('After the first digest.');
    expect(await inbox(t.engineer.email, /in your Reviews/)).toHaveLength(1);
  });
});
