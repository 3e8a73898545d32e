import { randomUUID } from 'node:crypto';

import { eq } from 'drizzle-orm';
import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { ballot, comment, round } from '@/db/schema';

import { createTestApp, testOrigin, type TestUser } from '../helpers/api';
import { refusalsChangeNothing } from '../helpers/unchanged';
import { discussionTeam, type DiscussionTeam } from '../server/fixtures/discussion';

/**
 * Preference rounds and comments as an attacker tries them: another Team's ids, a role
 * without the right, no session, another site's page, and bodies too large or malformed.
 * Each refusal is checked to have changed nothing.
 */

const ctx = createTestApp();
let t: DiscussionTeam;
let them: DiscussionTeam;
let openRoundId: string;
let theirRoundId: string;
let theirCommentId: string;

beforeAll(async () => {
  t = await discussionTeam(ctx, 'Sigrun', 2);
  them = await discussionTeam(ctx, 'Mallory', 2);
  openRoundId = (
    await t.lead.agent.post(`/api/reviews/${t.reviewId}/rounds`).send({ votesPerPerson: 2, blind: true }).expect(201)
  ).body.id;
  theirRoundId = (
    await them.lead.agent
      .post(`/api/reviews/${them.reviewId}/rounds`)
      .send({ votesPerPerson: 2, blind: false })
      .expect(201)
  ).body.id;
  theirCommentId = (
    await them.reviewer.agent
      .post(`/api/reviews/${them.reviewId}/comments`)
      .send({ body: 'Theirs.', clientId: `c-${randomUUID()}` })
      .expect(201)
  ).body.id;
});
afterAll(() => ctx.close());

/** Everything these routes can change, counted, to prove a refusal changed nothing. */
async function snapshot() {
  const [rounds, ballots, comments] = await Promise.all([
    ctx.db.select().from(round),
    ctx.db.select().from(ballot),
    ctx.db.select().from(comment),
  ]);
  return JSON.stringify({
    rounds: rounds.map((r) => [r.id, r.status, r.votesPerPerson]).sort(),
    ballots: ballots.map((b) => [b.roundId, b.userId, b.votes]).sort(),
    comments: comments.map((c) => c.id).sort(),
  });
}

const expectUnchanged = refusalsChangeNothing(snapshot);

type Call = { what: string; run: (u: TestUser) => Promise<{ status: number; body: any }> };

/** Every route of the two resources, aimed at `reviewId` (and a round in it). */
function callsOn(reviewId: string, roundId: string, candidateId: string, parentId?: string): Call[] {
  const r = `/api/reviews/${reviewId}`;
  return [
    { what: 'list rounds', run: (u) => u.agent.get(`${r}/rounds`) },
    { what: 'open a round', run: (u) => u.agent.post(`${r}/rounds`).send({ votesPerPerson: 1, blind: false }) },
    {
      what: 'cast a ballot',
      run: (u) => u.agent.put(`${r}/rounds/${roundId}/ballot`).send({ votes: { [candidateId]: 1 } }),
    },
    { what: 'close a round', run: (u) => u.agent.post(`${r}/rounds/${roundId}/close`).send({}) },
    { what: 'list comments', run: (u) => u.agent.get(`${r}/comments`) },
    {
      what: 'post a comment',
      run: (u) =>
        u.agent
          .post(`${r}/comments`)
          .send({ body: 'Intruding.', candidateId, parentId: parentId ?? null, clientId: `c-${randomUUID()}` }),
    },
    { what: 'list mentionable people', run: (u) => u.agent.get(`${r}/mentionable`) },
  ];
}

describe('another Team’s ids', () => {
  it('every route answers 404 for a review of another Team, for each role, and changes nothing', async () => {
    for (const role of ['owner', 'lead', 'engineer', 'reviewer', 'observer'] as const) {
      for (const call of callsOn(them.reviewId, theirRoundId, them.candidates[0], theirCommentId)) {
        const res = await expectUnchanged(() => call.run(t[role]), 404, 'not_found');
        expect(res.body.error.message, `${role}: ${call.what}`).toBe('The Review was not found.');
      }
    }
  });

  it('a round of another review cannot be reached through one’s own review', async () => {
    const mine = `/api/reviews/${t.reviewId}/rounds/${theirRoundId}`;
    await expectUnchanged(() => t.lead.agent.post(`${mine}/close`).send({}), 404);
    await expectUnchanged(() => t.reviewer.agent.put(`${mine}/ballot`).send({ votes: { [t.candidates[0]]: 1 } }), 404);
    const [theirs] = await ctx.db.select().from(round).where(eq(round.id, theirRoundId));
    expect(theirs.status).toBe('open');
  });

  it('unknown and malformed ids are simply not found', async () => {
    for (const id of ['not-a-uuid', randomUUID(), "1' or '1'='1"]) {
      await expectUnchanged(() => t.lead.agent.post(`/api/reviews/${t.reviewId}/rounds/${id}/close`).send({}), 404);
      await expectUnchanged(() => t.lead.agent.get(`/api/reviews/${encodeURIComponent(id)}/comments`), 404);
    }
  });
});

describe('a role without the right', () => {
  const ballotOf = (u: TestUser) =>
    u.agent.put(`/api/reviews/${t.reviewId}/rounds/${openRoundId}/ballot`).send({ votes: { [t.candidates[0]]: 1 } });

  it('an Observer and an Owner may not vote (403)', async () => {
    await expectUnchanged(() => ballotOf(t.observer), 403, 'forbidden');
    await expectUnchanged(() => ballotOf(t.owner), 403, 'forbidden');
  });

  it('a Reviewer and an Engineer may not open or close a round (403)', async () => {
    for (const who of [t.reviewer, t.engineer]) {
      await expectUnchanged(
        () => who.agent.post(`/api/reviews/${t.reviewId}/rounds`).send({ votesPerPerson: 1, blind: false }),
        403,
        'forbidden',
      );
      await expectUnchanged(
        () => who.agent.post(`/api/reviews/${t.reviewId}/rounds/${openRoundId}/close`).send({}),
        403,
        'forbidden',
      );
    }
  });

  it('an Observer may not comment (403) but reads', async () => {
    await expectUnchanged(
      () =>
        t.observer.agent
          .post(`/api/reviews/${t.reviewId}/comments`)
          .send({ body: 'Just watching.', clientId: `c-${randomUUID()}` }),
      403,
      'forbidden',
    );
    expect((await t.observer.agent.get(`/api/reviews/${t.reviewId}/comments`)).status).toBe(200);
    expect((await t.observer.agent.get(`/api/reviews/${t.reviewId}/rounds`)).status).toBe(200);
  });

  it('the roles that may, can (so the refusals above are about the role)', async () => {
    for (const who of [t.lead, t.engineer, t.reviewer]) expect((await ballotOf(who)).status).toBe(200);
  });
});

describe('no session', () => {
  it('every route answers 401 and changes nothing', async () => {
    const anonymous = { agent: supertest.agent(ctx.app).set('Origin', testOrigin) } as unknown as TestUser;
    for (const call of callsOn(t.reviewId, openRoundId, t.candidates[0])) {
      await expectUnchanged(() => call.run(anonymous), 401, 'unauthorized');
    }
  });
});

describe('another site’s page', () => {
  it('every write with the session cookie and a foreign Origin is refused (403) and changes nothing', async () => {
    const r = `/api/reviews/${t.reviewId}`;
    const from = (method: 'post' | 'put', url: string) =>
      supertest(ctx.app)[method](url).set('Cookie', t.lead.cookie).set('Origin', 'https://evil.example');
    await expectUnchanged(
      () => from('post', `${r}/rounds`).send({ votesPerPerson: 1, blind: false }),
      403,
      'foreign_origin',
    );
    await expectUnchanged(
      () => from('put', `${r}/rounds/${openRoundId}/ballot`).send({ votes: { [t.candidates[0]]: 2 } }),
      403,
      'foreign_origin',
    );
    await expectUnchanged(() => from('post', `${r}/rounds/${openRoundId}/close`).send({}), 403, 'foreign_origin');
    await expectUnchanged(
      () => from('post', `${r}/comments`).send({ body: 'From elsewhere.', clientId: `c-${randomUUID()}` }),
      403,
      'foreign_origin',
    );
  });
});

describe('oversized and malformed bodies', () => {
  const r = () => `/api/reviews/${t.reviewId}`;

  it('a body over the limit is 413, broken JSON 400', async () => {
    const huge = 'x'.repeat(300 * 1024);
    await expectUnchanged(
      () => t.reviewer.agent.post(`${r()}/comments`).send({ body: huge, clientId: `c-${randomUUID()}` }),
      413,
      'body_too_large',
    );
    await expectUnchanged(
      () =>
        t.reviewer.agent
          .put(`${r()}/rounds/${openRoundId}/ballot`)
          .set('Content-Type', 'application/json')
          .send('{"votes": {'),
      400,
      'malformed_json',
    );
    await expectUnchanged(
      () => t.lead.agent.post(`${r()}/rounds`).set('Content-Type', 'application/json').send('{"votesPerPerson":'),
      400,
      'malformed_json',
    );
  });

  it('a 5001-character comment is refused naming body; 5000 characters are taken', async () => {
    const res = await expectUnchanged(
      () => t.reviewer.agent.post(`${r()}/comments`).send({ body: 'é'.repeat(5001), clientId: `c-${randomUUID()}` }),
      422,
      'invalid_input',
    );
    expect(res.body.error.field).toBe('body');
    expect(res.body.error.message).toContain('at most 5000 characters');
    const ok = await t.reviewer.agent
      .post(`${r()}/comments`)
      .send({ body: 'é'.repeat(5000), clientId: `c-${randomUUID()}` });
    expect(ok.status).toBe(201);
  });

  const roundBodies: Array<[unknown, string]> = [
    [{ votesPerPerson: '3', blind: false }, 'votesPerPerson'],
    [{ votesPerPerson: 2.5, blind: false }, 'votesPerPerson'],
    [{ votesPerPerson: 0, blind: false }, 'votesPerPerson'],
    [{ votesPerPerson: 21, blind: false }, 'votesPerPerson'],
    [{ votesPerPerson: 3, blind: 'yes' }, 'blind'],
    [{ votesPerPerson: 3 }, 'blind'],
    [{ votesPerPerson: 3, blind: false, number: 99 }, 'number'],
    [[1, 2], '(body)'],
  ];
  it.each(roundBodies)('opening a round with %j is 422 naming %s', async (body, field) => {
    const res = await expectUnchanged(() => t.lead.agent.post(`${r()}/rounds`).send(body as object), 422);
    expect(res.body.error.field).toBe(field);
  });

  const ballotBodies = (c: string): Array<[unknown, string]> => [
    [{ votes: { [c]: -1 } }, `votes.${c}`],
    [{ votes: { [c]: 0.5 } }, `votes.${c}`],
    [{ votes: { [c]: '1' } }, `votes.${c}`],
    [{ votes: [1] }, 'votes'],
    [{ votes: null }, 'votes'],
    [{}, 'votes'],
    [{ votes: {}, userId: 'someone' }, 'userId'],
    [{ votes: { constructor: 1 } }, 'votes.constructor'],
    [{ votes: Object.fromEntries(Array.from({ length: 51 }, (_, i) => [`k${i}`, 0])) }, 'votes'],
  ];
  it('a malformed ballot is 422 naming the field', async () => {
    for (const [body, field] of ballotBodies(t.candidates[0])) {
      const res = await expectUnchanged(
        () => t.reviewer.agent.put(`${r()}/rounds/${openRoundId}/ballot`).send(body as object),
        422,
      );
      expect(res.body.error.field, JSON.stringify(body)).toBe(field);
    }
  });

  it('a __proto__ key in a ballot is dropped by the parser: no prototype touched, no such key stored', async () => {
    const res = await t.engineer.agent
      .put(`${r()}/rounds/${openRoundId}/ballot`)
      .set('Content-Type', 'application/json')
      .send(`{"votes": {"__proto__": {"polluted": 1}, "${t.candidates[1]}": 1}}`);
    expect(res.status).toBe(200);
    expect(res.body.myBallot).toEqual({ [t.candidates[1]]: 1 });
    expect(({} as Record<string, unknown>).polluted).toBeUndefined();
    const stored = await ctx.db.select().from(ballot).where(eq(ballot.roundId, openRoundId));
    expect(stored.every((b) => !Object.hasOwn(b.votes, '__proto__'))).toBe(true);
  });

  const commentBodies: Array<[unknown, string]> = [
    [{ body: '', clientId: 'c-12345678' }, 'body'],
    [{ body: '   ', clientId: 'c-12345678' }, 'body'],
    [{ body: 'NUL \u0000 inside', clientId: 'c-12345678' }, 'body'],
    [{ body: 'lone \ud800 surrogate', clientId: 'c-12345678' }, 'body'],
    [{ body: 42, clientId: 'c-12345678' }, 'body'],
    [{ body: 'No client id.' }, 'clientId'],
    [{ body: 'Short id.', clientId: 'c-1' }, 'clientId'],
    [{ body: 'Odd id.', clientId: '../../etc/passwd' }, 'clientId'],
    [{ body: 'Extra.', clientId: 'c-12345678', authorId: 'someone' }, 'authorId'],
    [{ body: 'Parent.', clientId: 'c-12345678', parentId: 7 }, 'parentId'],
  ];
  it.each(commentBodies)('posting %j is 422 naming %s', async (body, field) => {
    const res = await expectUnchanged(() => t.reviewer.agent.post(`${r()}/comments`).send(body as object), 422);
    expect(res.body.error.field).toBe(field);
  });
});
