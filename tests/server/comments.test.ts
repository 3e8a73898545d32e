import { randomUUID } from 'node:crypto';

import { and, eq } from 'drizzle-orm';
import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';

import { activity, comment } from '@/db/schema';
import { createApp } from '@/server/app';
import type { Mail } from '@/server/auth/mailer';
import type { Comment } from '@/server/contracts/board';
import { noBroadcast } from '@/server/services/broadcast';
import { commentCounts, resolveMentions } from '@/server/services/comments';

import { createTestApp, signUp, testOrigin, type TestUser } from '../helpers/api';
import { mailsTo, waitForMail } from '../helpers/test-server';
import { discussionTeam, type DiscussionTeam } from './fixtures/discussion';

const ctx = createTestApp();
let t: DiscussionTeam;
let other: DiscussionTeam;
let anaLima: TestUser;
let ana: TestUser;

beforeAll(async () => {
  t = await discussionTeam(ctx, 'Cora');
  other = await discussionTeam(ctx, 'Dmitri', 1);
  anaLima = await signUp(ctx.app, 'Ana Lima');
  ana = await signUp(ctx.app, 'Ana');
  for (const u of [anaLima, ana]) {
    await ctx.auth.api.addMember({ body: { userId: u.id, role: 'reviewer', organizationId: t.teamId } });
  }
});
afterAll(() => ctx.close());

const path = () => `/api/reviews/${t.reviewId}/comments`;
const clientId = () => `c-${randomUUID()}`;
const post = (by: TestUser, body: Record<string, unknown>) =>
  by.agent.post(path()).send({ clientId: clientId(), ...body });
const rowsWith = (id: string) =>
  ctx.db
    .select()
    .from(comment)
    .where(and(eq(comment.reviewId, t.reviewId), eq(comment.clientId, id)));

describe('comments on a review and its candidates', () => {
  it('stores comments and one level of replies, and lists them oldest first', async () => {
    const [a, b] = t.candidates;
    const onReview = await post(t.reviewer, { body: '  Which site air temperature is the design point?  ' });
    expect(onReview.status).toBe(201);
    expect(onReview.body).toMatchObject({
      reviewId: t.reviewId,
      candidateId: null,
      parentId: null,
      body: 'Which site air temperature is the design point?',
      author: { id: t.reviewer.id, name: t.reviewer.name },
      mentions: [],
    });
    const onA = await post(t.engineer, { body: 'The regenerator pays back within the fired hours.', candidateId: a });
    expect(onA.status).toBe(201);
    expect(onA.body.candidateId).toBe(a);

    const reply = await post(t.lead, { body: 'Minus fifteen degrees, as in the basis.', parentId: onReview.body.id });
    expect(reply.status).toBe(201);
    expect(reply.body).toMatchObject({ parentId: onReview.body.id, candidateId: null });
    // A reply without candidateId stays on its parent's candidate.
    const replyOnA = await post(t.owner, { body: 'Agreed.', parentId: onA.body.id });
    expect(replyOnA.status).toBe(201);
    expect(replyOnA.body.candidateId).toBe(a);

    const all = await t.observer.agent.get(path());
    expect(all.status).toBe(200);
    expect(all.body.map((c: Comment) => c.id)).toEqual([
      onReview.body.id,
      onA.body.id,
      reply.body.id,
      replyOnA.body.id,
    ]);
    const onlyA = await t.observer.agent.get(`${path()}?candidateId=${a}`);
    expect(onlyA.body.map((c: Comment) => c.id)).toEqual([onA.body.id, replyOnA.body.id]);
    expect((await t.observer.agent.get(`${path()}?candidateId=${b}`)).body).toEqual([]);

    expect(await commentCounts(ctx.db, t.reviewId)).toEqual({ review: 2, [a]: 2 });

    const told = ctx.sent.filter((s) => s.reviewId === t.reviewId && s.event === 'comment:posted');
    expect(told.map((s) => (s.payload as { comment: Comment }).comment.id)).toEqual(all.body.map((c: Comment) => c.id));
  });

  it('records comment:posted in Activity with the review and candidate names, not the body', async () => {
    const [, b] = t.candidates;
    const res = await post(t.engineer, { body: 'A confidential remark about first cost.', candidateId: b });
    const [line] = (await ctx.db.select().from(activity).where(eq(activity.reviewId, t.reviewId))).filter(
      (l) => l.kind === 'comment:posted' && l.actorId === t.engineer.id && l.detail.candidateName === 'Candidate 2',
    );
    expect(res.status).toBe(201);
    expect(line.detail).toEqual({ reviewName: 'Cora review', candidateName: 'Candidate 2', reply: false });
    expect(JSON.stringify(line.detail)).not.toContain('confidential');
  });

  it('refuses a reply to a reply, and a reply on another candidate, naming parentId', async () => {
    const [a, b] = t.candidates;
    const top = await post(t.reviewer, { body: 'Top.', candidateId: a });
    const reply = await post(t.engineer, { body: 'Reply.', parentId: top.body.id });
    const id = clientId();
    const deeper = await t.lead.agent.post(path()).send({ body: 'Deeper.', parentId: reply.body.id, clientId: id });
    expect(deeper.status).toBe(422);
    expect(deeper.body.error.field).toBe('parentId');
    expect(deeper.body.error.message).toContain('one level deep');
    expect(await rowsWith(id)).toEqual([]);

    const elsewhere = await post(t.lead, { body: 'Elsewhere.', parentId: top.body.id, candidateId: b });
    expect(elsewhere.status).toBe(422);
    expect(elsewhere.body.error.field).toBe('parentId');
    const onReview = await post(t.lead, { body: 'On the review.', parentId: top.body.id, candidateId: null });
    expect(onReview.status).toBe(422);
  });

  it('refuses a comment on another review’s candidate or a reply to its comment, storing nothing', async () => {
    const foreignComment = await other.reviewer.agent
      .post(`/api/reviews/${other.reviewId}/comments`)
      .send({ body: 'Theirs.', clientId: clientId() });
    const id = clientId();
    const res = await t.reviewer.agent
      .post(path())
      .send({ body: 'Sneaky.', candidateId: other.candidates[0], clientId: id });
    expect(res.status).toBe(422);
    expect(res.body.error.field).toBe('candidateId');
    const reply = await t.reviewer.agent
      .post(path())
      .send({ body: 'Sneaky reply.', parentId: foreignComment.body.id, clientId: id });
    expect(reply.status).toBe(422);
    expect(reply.body.error.field).toBe('parentId');
    const malformed = await t.reviewer.agent.post(path()).send({ body: 'x', candidateId: 'not-a-uuid', clientId: id });
    expect(malformed.status).toBe(422);
    expect(await rowsWith(id)).toEqual([]);
    // Listing by another review's candidate finds no such candidate here.
    expect((await t.reviewer.agent.get(`${path()}?candidateId=${other.candidates[0]}`)).status).toBe(404);
  });
});

describe('a retried comment', () => {
  it('is stored once and answered with the stored comment (201, marked as replayed)', async () => {
    const id = clientId();
    const first = await t.reviewer.agent.post(path()).send({ body: 'Sent on a bad connection.', clientId: id });
    const again = await t.reviewer.agent.post(path()).send({ body: 'Sent on a bad connection.', clientId: id });
    expect(first.status).toBe(201);
    expect(first.headers['idempotent-replayed']).toBeUndefined();
    expect(again.status).toBe(201);
    expect(again.headers['idempotent-replayed']).toBe('true');
    expect(again.body).toEqual(first.body);
    expect(await rowsWith(id)).toHaveLength(1);
    const told = ctx.sent.filter(
      (s) => s.event === 'comment:posted' && (s.payload as { comment: Comment }).comment.clientId === id,
    );
    expect(told).toHaveLength(1);
  });

  it('sent twice at the same moment is stored once, both answers the same comment', async () => {
    const id = clientId();
    const logged = async () =>
      (await ctx.db.select().from(activity).where(eq(activity.reviewId, t.reviewId))).filter(
        (l) => l.kind === 'comment:posted',
      ).length;
    const before = await logged();
    const send = () => t.engineer.agent.post(path()).send({ body: 'Double tap.', clientId: id });
    const answers = await Promise.all([send(), send(), send()]);
    expect(answers.map((r) => r.status)).toEqual([201, 201, 201]);
    expect(new Set(answers.map((r) => r.body.id)).size).toBe(1);
    expect(await rowsWith(id)).toHaveLength(1);
    expect(await logged()).toBe(before + 1);
  });

  it('with the same clientId from another person is a comment of its own', async () => {
    const id = clientId();
    await t.engineer.agent.post(path()).send({ body: 'Mine.', clientId: id }).expect(201);
    const theirs = await t.reviewer.agent.post(path()).send({ body: 'Mine too.', clientId: id });
    expect(theirs.status).toBe(201);
    expect(theirs.body.body).toBe('Mine too.');
    expect(await rowsWith(id)).toHaveLength(2);
  });
});

describe('@mentions', () => {
  it('resolves names without regard to case, the longest name first, and mails each person a link', async () => {
    const res = await post(t.lead, {
      body: '@ana lima can you check the intercooler loss? And @Ana, the fuel temperature. @Cora Lead notes it.',
      candidateId: t.candidates[0],
    });
    expect(res.status).toBe(201);
    expect(res.body.mentions).toEqual([anaLima.id, ana.id, t.lead.id]);

    const mail = await waitForMail(anaLima.email, /mentioned you/);
    expect(mail.subject).toBe('Cora Lead mentioned you in “Cora review” on Cyclemoot');
    expect(mail.text).toContain(`${testOrigin}/reviews/${t.reviewId}`);
    expect(mail.text).toContain('on the candidate “Candidate 1”');
    expect(mail.text).toContain('> @ana lima can you check the intercooler loss?');
    await waitForMail(ana.email, /mentioned you/);
    // The author is not mailed about mentioning themselves (both mails above went out at once).
    expect((await mailsTo(t.lead.email)).filter((m) => /mentioned you/.test(m.subject))).toEqual([]);
  });

  it('lists the Team’s people as mentionable', async () => {
    const res = await t.reviewer.agent.get(`/api/reviews/${t.reviewId}/mentionable`);
    expect(res.status).toBe(200);
    expect(res.body).toHaveLength(7);
    expect(res.body).toContainEqual({ id: anaLima.id, name: 'Ana Lima' });
    expect(Object.keys(res.body[0]).sort()).toEqual(['id', 'name']);
  });

  it('does not make the poster wait for the mail, and a failed mail leaves the comment standing', async () => {
    const sent: Mail[] = [];
    const hanging = createApp({
      db: ctx.db,
      auth: ctx.auth,
      broadcast: noBroadcast,
      origin: testOrigin,
      mailer: { send: (m) => (sent.push(m), new Promise<void>(() => {})) },
    });
    const hung = await supertest(hanging)
      .post(path())
      .set('Cookie', t.engineer.cookie)
      .set('Origin', testOrigin)
      .send({ body: 'Hello @Ana Lima.', clientId: clientId() });
    expect(hung.status).toBe(201);
    expect(sent.map((m) => m.to)).toEqual([anaLima.email]);

    const logged = vi.spyOn(console, 'error').mockImplementation(() => {});
    try {
      const failing = createApp({
        db: ctx.db,
        auth: ctx.auth,
        broadcast: noBroadcast,
        origin: testOrigin,
        mailer: { send: async () => Promise.reject(new Error('SMTP refused')) },
      });
      const res = await supertest(failing)
        .post(path())
        .set('Cookie', t.engineer.cookie)
        .set('Origin', testOrigin)
        .send({ body: 'Hello again @Ana.', clientId: clientId() });
      expect(res.status).toBe(201);
      await vi.waitFor(() =>
        expect(logged).toHaveBeenCalledWith(expect.stringContaining(ana.email), expect.anything()),
      );
    } finally {
      logged.mockRestore();
    }
  });
});

describe('resolveMentions', () => {
  const people = [
    { id: 'u1', name: 'Ana' },
    { id: 'u2', name: 'Ana Lima' },
    { id: 'u3', name: 'Bo' },
  ];
  it.each([
    ['@Ana Lima and @ana', ['u2', 'u1']],
    ['@Anabel is nobody here', []],
    ['write to ana@bo.example', []],
    ['(@Bo) and @bo again', ['u3']],
    ['@Ana’s point, @Bo.', ['u1', 'u3']],
    ['@ nobody', []],
    ['@Ana Limas', ['u1']],
  ])('%s → %j', (body, expected) => {
    expect(resolveMentions(body, people)).toEqual(expected);
  });
});
