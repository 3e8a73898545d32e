import { eq } from 'drizzle-orm';
import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { activity, candidate, designBasis } from '@/db/schema';

import { createTeam, createTestApp, signUp, testOrigin, type TestUser } from '../helpers/api';

/**
 * The board's routes as an attacker tries them: another Team's ids, lower roles, no
 * session, another site's page, oversized, malformed and ill-typed bodies. Each refusal
 * must change nothing: the candidate rows, the basis and the Activity are compared whole.
 */

const ctx = createTestApp();
let lead: TestUser;
let engineer: TestUser;
let reviewer: TestUser;
let observer: TestUser;
let outsider: TestUser;
let reviewId: string;
let candidateId: string;
let outsiderReviewId: string;
let outsiderCandidateId: string;
let siblingReviewId: string;
let basisBody: Record<string, unknown>;

beforeAll(async () => {
  [lead, engineer, reviewer, observer, outsider] = await Promise.all([
    signUp(ctx.app, 'Lea Lead'),
    signUp(ctx.app, 'Erik Engineer'),
    signUp(ctx.app, 'Runa Reviewer'),
    signUp(ctx.app, 'Oda Observer'),
    signUp(ctx.app, 'Mallory Outsider'),
  ]);
  const teamId = await createTeam(ctx, lead, [
    { user: engineer, role: 'engineer' },
    { user: reviewer, role: 'reviewer' },
    { user: observer, role: 'observer' },
  ]);
  reviewId = (await lead.agent.post(`/api/teams/${teamId}/reviews`).send({ name: 'Guarded board' }).expect(201)).body
    .id;
  siblingReviewId = (await lead.agent.post(`/api/teams/${teamId}/reviews`).send({ name: 'Sibling board' }).expect(201))
    .body.id;
  candidateId = (
    await engineer.agent
      .post(`/api/reviews/${reviewId}/candidates`)
      .send({ name: 'Guarded', preset: 'simple' })
      .expect(201)
  ).body.id;
  const board = await lead.agent.get(`/api/reviews/${reviewId}/board`).expect(200);
  const { revision: _r, updatedAt: _u, ...rest } = board.body.designBasis;
  basisBody = rest;

  const otherTeam = await createTeam(ctx, outsider);
  outsiderReviewId = (
    await outsider.agent.post(`/api/teams/${otherTeam}/reviews`).send({ name: 'Mallory board' }).expect(201)
  ).body.id;
  outsiderCandidateId = (
    await outsider.agent
      .post(`/api/reviews/${outsiderReviewId}/candidates`)
      .send({ name: 'Mallory own', preset: 'simple' })
      .expect(201)
  ).body.id;
});
afterAll(() => ctx.close());

/** Everything a refused request could have touched in the guarded review. */
async function snapshot() {
  const [candidates, basis, log] = await Promise.all([
    ctx.db.select().from(candidate).where(eq(candidate.reviewId, reviewId)),
    ctx.db.select().from(designBasis).where(eq(designBasis.reviewId, reviewId)),
    ctx.db.select().from(activity).where(eq(activity.reviewId, reviewId)),
  ]);
  return { candidates, basis, log: log.length };
}

const patchBody = { parameters: { compressor: { pressureRatio: 11 } } };
const url = {
  board: () => `/api/reviews/${reviewId}/board`,
  basis: () => `/api/reviews/${reviewId}/design-basis`,
  candidates: () => `/api/reviews/${reviewId}/candidates`,
  candidate: () => `/api/reviews/${reviewId}/candidates/${candidateId}`,
};

describe('another Team', () => {
  it('finds none of the review’s routes (404) and changes nothing', async () => {
    const before = await snapshot();
    const tries = [
      outsider.agent.get(url.board()),
      outsider.agent.put(url.basis()).send(basisBody),
      outsider.agent.post(url.candidates()).send({ name: 'Planted', preset: 'simple' }),
      outsider.agent.patch(url.candidate()).send(patchBody),
      outsider.agent.patch(url.candidate()).send({ name: 'Renamed by Mallory' }),
    ];
    for (const res of await Promise.all(tries)) {
      expect(res.status).toBe(404);
      expect(res.body.error.code).toBe('not_found');
      expect(JSON.stringify(res.body)).not.toContain('Guarded');
    }
    expect(await snapshot()).toEqual(before);
  });

  it('cannot reach a victim’s candidate through its own review (404), nor copy it', async () => {
    const before = await snapshot();
    const through = await outsider.agent
      .patch(`/api/reviews/${outsiderReviewId}/candidates/${candidateId}`)
      .send({ name: 'Stolen' });
    expect(through.status).toBe(404);
    const copy = await outsider.agent
      .post(`/api/reviews/${outsiderReviewId}/candidates`)
      .send({ name: 'Copied secret', copyOf: candidateId });
    expect(copy.status).toBe(404);
    expect(copy.body.error.field).toBe('copyOf');
    expect(await ctx.db.select().from(candidate).where(eq(candidate.reviewId, outsiderReviewId))).toHaveLength(1);
    expect(await snapshot()).toEqual(before);
  });
});

describe('a candidate id of another review in the path', () => {
  it('is not found, even within the same Team, and the candidate is left as it was', async () => {
    const before = await snapshot();
    const res = await lead.agent.patch(`/api/reviews/${siblingReviewId}/candidates/${candidateId}`).send(patchBody);
    expect(res.status).toBe(404);
    const foreign = await lead.agent
      .patch(`/api/reviews/${reviewId}/candidates/${outsiderCandidateId}`)
      .send(patchBody);
    expect(foreign.status).toBe(404);
    for (const id of ['not-a-uuid', '00000000-0000-0000-0000-000000000000', "1' or '1'='1"]) {
      const odd = await lead.agent
        .patch(`/api/reviews/${reviewId}/candidates/${encodeURIComponent(id)}`)
        .send(patchBody);
      expect(odd.status, id).toBe(404);
    }
    expect(await snapshot()).toEqual(before);
  });
});

describe('lower roles', () => {
  for (const who of ['reviewer', 'observer'] as const) {
    it(`refuses the ${who} every change (403) and lets them read the board`, async () => {
      const user = who === 'reviewer' ? reviewer : observer;
      const before = await snapshot();
      const tries = [
        user.agent.put(url.basis()).send(basisBody),
        user.agent.post(url.candidates()).send({ name: `By ${who}`, preset: 'simple' }),
        user.agent.patch(url.candidate()).send(patchBody),
        user.agent.patch(url.candidate()).send({ status: 'chosen' }),
      ];
      for (const res of await Promise.all(tries)) {
        expect(res.status).toBe(403);
        expect(res.body.error.code).toBe('forbidden');
      }
      expect(await snapshot()).toEqual(before);
      const read = await user.agent.get(url.board());
      expect(read.status).toBe(200);
      expect(read.body.myRole).toBe(who);
    });
  }

  it('refuses an Engineer the design basis (403) but not the candidates', async () => {
    const before = await snapshot();
    const res = await engineer.agent.put(url.basis()).send(basisBody);
    expect(res.status).toBe(403);
    expect(await snapshot()).toEqual(before);
  });
});

describe('no session', () => {
  it('answers 401 on every board route and changes nothing', async () => {
    const before = await snapshot();
    const anon = supertest(ctx.app);
    const tries = [
      anon.get(url.board()).set('Origin', testOrigin),
      anon.put(url.basis()).set('Origin', testOrigin).send(basisBody),
      anon.post(url.candidates()).set('Origin', testOrigin).send({ name: 'Anonymous', preset: 'simple' }),
      anon.patch(url.candidate()).set('Origin', testOrigin).send(patchBody),
      anon
        .patch(url.candidate())
        .set('Origin', testOrigin)
        .set('Cookie', 'better-auth.session_token=forged')
        .send(patchBody),
    ];
    for (const res of await Promise.all(tries)) expect(res.status).toBe(401);
    expect(await snapshot()).toEqual(before);
  });
});

describe('another site’s page', () => {
  for (const origin of ['https://evil.example', 'http://127.0.0.1:3999.evil.example', 'null']) {
    it(`refuses cookie-bearing changes from Origin ${origin} (403 foreign_origin)`, async () => {
      const before = await snapshot();
      const send = (req: supertest.Test) => req.set('Cookie', lead.cookie).set('Origin', origin);
      const tries = [
        send(supertest(ctx.app).put(url.basis())).send(basisBody),
        send(supertest(ctx.app).post(url.candidates())).send({ name: 'From elsewhere', preset: 'simple' }),
        send(supertest(ctx.app).patch(url.candidate())).send(patchBody),
      ];
      for (const res of await Promise.all(tries)) {
        expect(res.status).toBe(403);
        expect(res.body.error.code).toBe('foreign_origin');
      }
      expect(await snapshot()).toEqual(before);
    });
  }

  it('refuses a cookie-bearing change without any Origin', async () => {
    const before = await snapshot();
    const res = await supertest(ctx.app).patch(url.candidate()).set('Cookie', lead.cookie).send(patchBody);
    expect(res.status).toBe(403);
    expect(await snapshot()).toEqual(before);
  });
});

describe('bad bodies', () => {
  it('answers an oversized body with 413', async () => {
    const before = await snapshot();
    const huge = { name: 'Big', preset: 'simple', padding: 'x'.repeat(300 * 1024) };
    for (const res of [
      await lead.agent.post(url.candidates()).send(huge),
      await lead.agent.patch(url.candidate()).send(huge),
      await lead.agent.put(url.basis()).send({ ...basisBody, padding: 'x'.repeat(300 * 1024) }),
    ]) {
      expect(res.status).toBe(413);
      expect(res.body.error.code).toBe('body_too_large');
    }
    expect(await snapshot()).toEqual(before);
  });

  it('answers malformed JSON with 400', async () => {
    const before = await snapshot();
    for (const res of [
      await lead.agent.patch(url.candidate()).set('Content-Type', 'application/json').send('{"name": "Half'),
      await lead.agent.put(url.basis()).set('Content-Type', 'application/json').send('{ambient: 1}'),
      await lead.agent.post(url.candidates()).set('Content-Type', 'application/json').send('[1,'),
    ]) {
      expect(res.status).toBe(400);
      expect(res.body.error.code).toBe('malformed_json');
    }
    expect(await snapshot()).toEqual(before);
  });

  it('answers wrong types and unknown fields with 422 naming the field', async () => {
    const before = await snapshot();
    const cases: Array<[() => supertest.Test, string]> = [
      [() => lead.agent.post(url.candidates()).send({ name: 7, preset: 'simple' }), 'name'],
      [() => lead.agent.post(url.candidates()).send({ name: 'Jet', preset: 'jet' }), 'preset'],
      [
        () => lead.agent.post(url.candidates()).send({ name: 'Painted', preset: 'simple', colour: '#FF0000' }),
        'colour',
      ],
      [() => lead.agent.post(url.candidates()).send({ name: 'Both', preset: 'simple', copyOf: candidateId }), 'copyOf'],
      [() => lead.agent.post(url.candidates()).send({ name: 'Neither' }), 'preset'],
      [() => lead.agent.post(url.candidates()).send({ name: 'X', preset: 'simple' }), 'name'],
      [
        () => lead.agent.patch(url.candidate()).send({ parameters: { compressor: { pressureRatio: '12' } } }),
        'parameters.compressor.pressureRatio',
      ],
      [
        () => lead.agent.patch(url.candidate()).send({ parameters: { turbine: { blades: 40 } } }),
        'parameters.turbine.blades',
      ],
      [
        () => lead.agent.patch(url.candidate()).send({ parameters: { fuel: { hydrogenVolumeFraction: 1 } } }),
        'parameters.fuel',
      ],
      [() => lead.agent.patch(url.candidate()).send({ parameters: { compressor: [12] } }), 'parameters.compressor'],
      [
        () => lead.agent.patch(url.candidate()).send({ parameters: { combustorPressureLoss: null } }),
        'parameters.combustorPressureLoss',
      ],
      [
        () => lead.agent.patch(url.candidate()).send({ parameters: { turbine: { stages: 1.5 } } }),
        'parameters.turbine.stages',
      ],
      [() => lead.agent.patch(url.candidate()).send({ status: 'won' }), 'status'],
      [() => lead.agent.patch(url.candidate()).send({ ifRevision: 'one', name: 'Sure' }), 'ifRevision'],
      [() => lead.agent.patch(url.candidate()).send({ revision: 9, name: 'Forced' }), 'revision'],
      [() => lead.agent.patch(url.candidate()).send({ results: { thermalEfficiency: 0.99 } }), 'results'],
      [() => lead.agent.patch(url.candidate()).send({ name: 'Bad\u0000name' }), 'name'],
      [() => lead.agent.put(url.basis()).send({ ...basisBody, netPowerKW: 'lots' }), 'netPowerKW'],
      [() => lead.agent.put(url.basis()).send({ ...basisBody, revision: 99 }), 'revision'],
      [
        () =>
          lead.agent.put(url.basis()).send({ ...basisBody, ambient: { temperatureK: 288.15, relativeHumidity: 0.6 } }),
        'ambient.pressureKPa',
      ],
      [
        () =>
          lead.agent
            .put(url.basis())
            .send({ ...basisBody, criteria: [{ name: 'Noise', weight: 10, measure: 'loudness' }] }),
        'criteria.0.measure',
      ],
      [
        () => lead.agent.put(url.basis()).send({ ...basisBody, criteria: [{ name: 'Noise', weight: 10, colour: 1 }] }),
        'criteria.0.colour',
      ],
      [() => lead.agent.put(url.basis()).send({ ...basisBody, criteria: 'all' }), 'criteria'],
      [() => lead.agent.put(url.basis()).send({ ...basisBody, fluid: 'steam' }), 'fluid'],
    ];
    for (const [send, field] of cases) {
      const res = await send();
      expect(res.status, field).toBe(422);
      expect(res.body.error.field, JSON.stringify(res.body)).toBe(field);
    }
    expect(await snapshot()).toEqual(before);
  });

  it('lets no key of a parameters change reach an object’s prototype', async () => {
    const raw = '{"parameters":{"compressor":{"__proto__":{"polluted":true},"pressureRatio":13}}}';
    const res = await lead.agent.patch(url.candidate()).set('Content-Type', 'application/json').send(raw);
    expect(res.status).toBe(200);
    expect(res.body.parameters.compressor.pressureRatio).toBe(13);
    expect(Object.keys(res.body.parameters.compressor)).not.toContain('polluted');
    expect(({} as Record<string, unknown>).polluted).toBeUndefined();
  });
});
