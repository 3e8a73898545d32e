import { eq } from 'drizzle-orm';
import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { activity, decisionRevision } from '@/db/schema';

import { createTestApp, testOrigin, type TestUser } from '../helpers/api';
import { refusalsChangeNothing } from '../helpers/unchanged';
import { discussionTeam, type DiscussionTeam } from '../server/fixtures/discussion';

/**
 * The decision record and a Review's Activity as an attacker tries them: another Team's ids,
 * a role without the right, no session, another site's page, bodies too large or malformed,
 * a candidate of another review. Each refusal is checked to have changed nothing.
 */

const ctx = createTestApp();
let t: DiscussionTeam;
let them: DiscussionTeam;

beforeAll(async () => {
  t = await discussionTeam(ctx, 'Halvard', 2);
  them = await discussionTeam(ctx, 'Mallory', 2);
  // Both records exist (revision 1), theirs with content an outsider must not read.
  await t.lead.agent.get(`/api/reviews/${t.reviewId}/decision`).expect(200);
  await them.lead.agent
    .put(`/api/reviews/${them.reviewId}/decision`)
    .send({ chosenCandidateId: them.candidates[0], rationale: 'Their secret reasons.' })
    .expect(200);
});
afterAll(() => ctx.close());

/** Everything these routes can change, to prove a refusal changed nothing. */
async function snapshot() {
  const [revisions, lines] = await Promise.all([
    ctx.db.select().from(decisionRevision),
    ctx.db.select({ id: activity.id }).from(activity),
  ]);
  return JSON.stringify({
    revisions: revisions
      .map((r) => [r.id, r.number, r.status, r.chosenCandidateId, r.rationale, r.rejected, r.actions, r.updatedAt])
      .sort(),
    activity: lines.length,
  });
}

const expectUnchanged = refusalsChangeNothing(snapshot);

type Call = { what: string; write: boolean; run: (u: TestUser) => PromiseLike<{ status: number; body: any }> };

function callsOn(reviewId: string, candidateId: string): Call[] {
  const r = `/api/reviews/${reviewId}`;
  return [
    { what: 'read the record', write: false, run: (u) => u.agent.get(`${r}/decision`) },
    { what: 'download the PDF', write: false, run: (u) => u.agent.get(`${r}/decision.pdf`) },
    { what: 'read Activity', write: false, run: (u) => u.agent.get(`${r}/activity`) },
    {
      what: 'edit the draft',
      write: true,
      run: (u) => u.agent.put(`${r}/decision`).send({ chosenCandidateId: candidateId, rationale: 'Mine now.' }),
    },
    { what: 'sign', write: true, run: (u) => u.agent.post(`${r}/decision/sign`).send({}) },
    { what: 'reopen', write: true, run: (u) => u.agent.post(`${r}/decision/reopen`).send({}) },
  ];
}

describe('another Team', () => {
  it('every route answers 404 for a Review of another Team, to each of our roles, and changes nothing', async () => {
    for (const call of callsOn(them.reviewId, them.candidates[0]!)) {
      for (const who of [t.owner, t.lead, t.observer]) {
        const res = await expectUnchanged(() => call.run(who), 404);
        expect(JSON.stringify(res.body), call.what).not.toContain('secret');
      }
    }
  });

  it('a review id that is no uuid, or of no review, is 404 too', async () => {
    await expectUnchanged(() => t.lead.agent.get('/api/reviews/not-a-review/decision'), 404);
    await expectUnchanged(
      () => t.lead.agent.put('/api/reviews/00000000-0000-4000-8000-000000000000/decision').send({ rationale: 'x' }),
      404,
    );
  });
});

describe('roles', () => {
  it('Engineer, Reviewer and Observer read but may not edit, sign or reopen (403)', async () => {
    for (const call of callsOn(t.reviewId, t.candidates[0]!)) {
      for (const who of [t.engineer, t.reviewer, t.observer]) {
        if (call.write) {
          const res = await expectUnchanged(() => call.run(who), 403);
          expect(res.body.error.code, `${call.what} as ${who.name}`).toBe('forbidden');
        } else {
          expect((await call.run(who)).status, `${call.what} as ${who.name}`).toBe(200);
        }
      }
    }
  });
});

describe('no session, another site', () => {
  it('without a session every route is 401', async () => {
    const anon = supertest.agent(ctx.app).set('Origin', testOrigin);
    for (const call of callsOn(t.reviewId, t.candidates[0]!)) {
      await expectUnchanged(() => call.run({ agent: anon } as TestUser), 401);
    }
  });

  it('a write from a foreign Origin is refused with 403, even with the Lead’s cookie', async () => {
    const foreign = supertest(ctx.app);
    const cookie = t.lead.cookie;
    const r = `/api/reviews/${t.reviewId}/decision`;
    await expectUnchanged(
      () => foreign.put(r).set('Cookie', cookie).set('Origin', 'https://evil.example').send({ rationale: 'Pwned.' }),
      403,
    );
    await expectUnchanged(
      () => foreign.post(`${r}/sign`).set('Cookie', cookie).set('Origin', 'https://evil.example').send({}),
      403,
    );
    await expectUnchanged(
      () => foreign.post(`${r}/reopen`).set('Cookie', cookie).set('Origin', 'https://evil.example').send({}),
      403,
    );
  });
});

describe('bad input', () => {
  const put = (body: unknown) => t.lead.agent.put(`/api/reviews/${t.reviewId}/decision`).send(body as object);

  it('malformed JSON is 400; an oversized body 413', async () => {
    await expectUnchanged(
      () =>
        t.lead.agent
          .put(`/api/reviews/${t.reviewId}/decision`)
          .set('Content-Type', 'application/json')
          .send('{"rationale": "unfinished'),
      400,
    );
    await expectUnchanged(() => put({ rationale: 'x'.repeat(300_000) }), 413);
  });

  it('each wrong field is 422 naming it', async () => {
    const cases: Array<[unknown, string]> = [
      [{}, '(body)'],
      [{ rationale: 'x'.repeat(4001) }, 'rationale'],
      [{ rationale: 42 }, 'rationale'],
      [{ assumptions: 'a\u0000b' }, 'assumptions'],
      [{ chosenCandidateId: 7 }, 'chosenCandidateId'],
      [{ rejected: 'all of them' }, 'rejected'],
      [{ rejected: [{ candidateId: t.candidates[1], reason: '' }] }, 'rejected.0.reason'],
      [{ rejected: [{ candidateId: t.candidates[1], reason: 'r'.repeat(501) }] }, 'rejected.0.reason'],
      [{ rejected: Array.from({ length: 9 }, (_, i) => ({ candidateId: `c${i}`, reason: 'r' })) }, 'rejected'],
      [{ dissent: [{ name: 'Ann' }] }, 'dissent.0.text'],
      [{ dissent: [{ name: 'Ann', text: 'No.', extra: 1 }] }, 'dissent.0.extra'],
      [{ actions: [{ text: 'Do', owner: 'Bo', due: 'tomorrow' }] }, 'actions.0.due'],
      [{ actions: [{ text: 'Do', owner: 'Bo', due: '2027-13-01' }] }, 'actions.0.due'],
      [{ actions: Array.from({ length: 31 }, () => ({ text: 'Do', owner: 'Bo', due: '2027-01-01' })) }, 'actions'],
      [{ signedBy: 'me' }, 'signedBy'],
      [{ status: 'signed' }, 'status'],
    ];
    for (const [body, field] of cases) {
      const res = await expectUnchanged(() => put(body), 422);
      expect(res.body.error.field, JSON.stringify(body)).toBe(field);
    }
  });

  it('a chosen or rejected candidate of another review is 422 at its field', async () => {
    const chosen = await expectUnchanged(() => put({ chosenCandidateId: them.candidates[0] }), 422);
    expect(chosen.body.error.field).toBe('chosenCandidateId');
    expect(chosen.body.error.message).toMatch(/not a candidate of this Review/);
    const rejected = await expectUnchanged(
      () => put({ rejected: [{ candidateId: them.candidates[1], reason: 'Theirs.' }] }),
      422,
    );
    expect(rejected.body.error.field).toBe('rejected.0.candidateId');
    await expectUnchanged(() => put({ chosenCandidateId: 'not-an-id' }), 422);
  });

  it('sign and reopen take no fields; the PDF and Activity queries are checked', async () => {
    const r = `/api/reviews/${t.reviewId}`;
    const sign = await expectUnchanged(() => t.lead.agent.post(`${r}/decision/sign`).send({ signedBy: 'x' }), 422);
    expect(sign.body.error.field).toBe('signedBy');
    await expectUnchanged(() => t.lead.agent.post(`${r}/decision/reopen`).send({ number: 5 }), 422);
    expect((await t.lead.agent.get(`${r}/decision.pdf?revision=-1`)).body.error.field).toBe('revision');
    expect((await t.lead.agent.get(`${r}/decision.pdf?other=1`)).status).toBe(422);
    expect((await t.lead.agent.get(`${r}/activity?limit=100000`)).body.error.field).toBe('limit');
    expect((await t.lead.agent.get(`${r}/activity?before=nope`)).body.error.field).toBe('before');
    // An entry of another review is no cursor here.
    const [theirs] = await ctx.db.select().from(activity).where(eq(activity.reviewId, them.reviewId)).limit(1);
    expect((await t.lead.agent.get(`${r}/activity?before=${theirs!.id}`)).status).toBe(422);
  });
});
