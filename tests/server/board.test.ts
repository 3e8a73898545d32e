import { and, eq } from 'drizzle-orm';
import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';

import { activity, candidate, designBasis, review, user } from '@/db/schema';
import {
  boardSchema,
  candidateColours,
  candidatePresets,
  candidateSchema,
  type CandidateWire,
} from '@/server/contracts/board';
import { reviewNews } from '@/server/contracts/news';
import type { TeamRole } from '@/server/contracts/roles';
import { migrateDatabase } from '@/server/ops/migrate';
import { ensureCluster, ensureDatabase } from '@/server/ops/postgres';
import { demoPassword, demoReviews, demoUsers, seedDemo } from '@/server/ops/seed';

import { createTeam, createTestApp, signUp, testOrigin, type TestUser } from '../helpers/api';

const ctx = createTestApp();
let owner: TestUser;
let lead: TestUser;
let engineer: TestUser;
let reviewer: TestUser;
let observer: TestUser;
let teamId: string;

beforeAll(async () => {
  [owner, lead, engineer, reviewer, observer] = await Promise.all([
    signUp(ctx.app, 'Oskar Owner'),
    signUp(ctx.app, 'Lina Lead'),
    signUp(ctx.app, 'Emil Engineer'),
    signUp(ctx.app, 'Rita Reviewer'),
    signUp(ctx.app, 'Olle Observer'),
  ]);
  teamId = await createTeam(ctx, owner, [
    { user: lead, role: 'lead' },
    { user: engineer, role: 'engineer' },
    { user: reviewer, role: 'reviewer' },
    { user: observer, role: 'observer' },
  ]);
});
afterAll(() => ctx.close());

let reviewCount = 0;
async function newReview(name = `Board review ${++reviewCount}`) {
  const res = await lead.agent.post(`/api/teams/${teamId}/reviews`).send({ name });
  expect(res.status).toBe(201);
  return res.body.id as string;
}

async function add(reviewId: string, body: Record<string, unknown>, who = engineer): Promise<CandidateWire> {
  const res = await who.agent.post(`/api/reviews/${reviewId}/candidates`).send(body);
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body;
}

/** What the evaluate route itself answers for a stored engine input. */
async function evaluated(input: object) {
  const res = await engineer.agent.post('/api/cycles/evaluate').send(input);
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body;
}

const board = async (reviewId: string, who = lead) => {
  const res = await who.agent.get(`/api/reviews/${reviewId}/board`);
  expect(res.status).toBe(200);
  return boardSchema.parse(res.body);
};

const sentFor = (reviewId: string) => ctx.sent.filter((s) => s.reviewId === reviewId);

const basisBody = (b: Awaited<ReturnType<typeof board>>['designBasis']) => {
  const { revision: _r, updatedAt: _u, ...rest } = b;
  return structuredClone(rest);
};

describe('GET board', () => {
  it('shows every member the same board with their own role, and the default basis before anyone writes', async () => {
    const reviewId = await newReview();
    for (const [who, role] of [
      [owner, 'owner'],
      [lead, 'lead'],
      [engineer, 'engineer'],
      [reviewer, 'reviewer'],
      [observer, 'observer'],
    ] as const) {
      const b = await board(reviewId, who);
      expect(b.myRole).toBe(role);
      expect(b.review.id).toBe(reviewId);
      expect(b.candidates).toEqual([]);
      expect(b.round).toBeNull();
      expect(b.commentCounts).toEqual({});
      expect(b.gathering).toBeNull();
      expect(b.designBasis).toMatchObject({
        ambient: { temperatureK: 288.15, pressureKPa: 101.325, relativeHumidity: 0.6 },
        fuel: { hydrogenVolumeFraction: 0, temperatureK: 298.15 },
        fluid: 'combustion',
        netPowerKW: 50_000,
        generatorEfficiency: 0.985,
        limits: { maxTurbineInletTemperatureK: 1700, exhaustTemperatureMinK: 700, exhaustTemperatureMaxK: 900 },
        revision: 1,
      });
      expect(b.designBasis.criteria.map((c) => [c.name, c.measure])).toEqual([
        ['Efficiency', 'thermalEfficiency'],
        ['Specific work', 'netWorkKJPerKg'],
        ['CO2', 'co2KgPerMWh'],
        ['Complexity', null],
        ['Maintainability', null],
        ['First-cost class', null],
      ]);
      expect(b.designBasis.criteria.reduce((sum, c) => sum + c.weight, 0)).toBe(100);
    }
    // Reading stores nothing; the default is stored by the first write.
    expect(await ctx.db.select().from(designBasis).where(eq(designBasis.reviewId, reviewId))).toEqual([]);
  });
});

describe('candidates from presets', () => {
  it('computes each preset on the default basis with results and no error, in colours of the series in order', async () => {
    const reviewId = await newReview();
    const made: CandidateWire[] = [];
    for (const preset of candidatePresets) made.push(await add(reviewId, { name: `From ${preset}`, preset }));
    for (const [i, c] of made.entries()) {
      candidateSchema.parse(c);
      expect(c).toMatchObject({ reviewId, preset: candidatePresets[i], status: 'proposed', revision: 1, error: null });
      expect(c.colour).toBe(candidateColours[i]);
      expect(c.updatedBy).toEqual({ id: engineer.id, name: engineer.name });
      expect(c.results).not.toBeNull();
      // The stored results are exactly what the evaluate route answers for the stored input.
      expect(c.results).toEqual(await evaluated(c.input));
      expect(Object.keys(c.input).sort()).toEqual(
        [
          'ambient',
          'combustorPressureLoss',
          'compressor',
          'fluid',
          'fuel',
          'generatorEfficiency',
          'limits',
          'netPowerKW',
          'regenerator',
          'turbine',
        ].sort(),
      );
      expect((c.results as { paths: unknown[] }).paths.length).toBeGreaterThan(0);
    }
    // The first write stored the default basis.
    const [stored] = await ctx.db.select().from(designBasis).where(eq(designBasis.reviewId, reviewId));
    expect(stored.revision).toBe(1);
    const logged = await ctx.db.select().from(activity).where(eq(activity.reviewId, reviewId));
    expect(logged.filter((a) => a.kind === 'candidate:added').map((a) => a.detail.name)).toEqual(
      candidatePresets.map((p) => `From ${p}`),
    );
    const added = sentFor(reviewId).filter((s) => s.event === 'candidate:added');
    expect(added).toHaveLength(5);
    for (const s of added) reviewNews['candidate:added'].parse(s.payload);
    const b = await board(reviewId, observer);
    expect(b.candidates.map((c) => c.id)).toEqual(made.map((c) => c.id));
  });

  it('copies a candidate of the same review: same parameters and results, its own colour and name', async () => {
    const reviewId = await newReview();
    const source = await add(reviewId, { name: 'Intercooled base', preset: 'intercooled' });
    const copy = await add(reviewId, { name: 'Intercooled variant', copyOf: source.id });
    expect(copy.id).not.toBe(source.id);
    expect(copy.preset).toBe('intercooled');
    expect(copy.parameters).toEqual(source.parameters);
    expect(copy.results).toEqual(source.results);
    expect(copy.colour).toBe(candidateColours[1]);
  });

  it('refuses a copy of a candidate of another review with 404 and stores nothing', async () => {
    const here = await newReview();
    const there = await newReview();
    const foreign = await add(there, { name: 'Elsewhere', preset: 'simple' });
    const res = await engineer.agent.post(`/api/reviews/${here}/candidates`).send({ name: 'Copy', copyOf: foreign.id });
    expect(res.status).toBe(404);
    expect(res.body.error.field).toBe('copyOf');
    const res2 = await engineer.agent.post(`/api/reviews/${here}/candidates`).send({ name: 'Copy', copyOf: 'nope' });
    expect(res2.status).toBe(404);
    expect(await ctx.db.select().from(candidate).where(eq(candidate.reviewId, here))).toEqual([]);
  });

  it('keeps names unique per review in any letter case (409 naming name), on create and on rename', async () => {
    const reviewId = await newReview();
    await add(reviewId, { name: 'Recuperated', preset: 'regenerative' });
    const other = await add(reviewId, { name: 'Plain', preset: 'simple' });
    const dup = await engineer.agent
      .post(`/api/reviews/${reviewId}/candidates`)
      .send({ name: 'RECUPERATED', preset: 'simple' });
    expect(dup.status).toBe(409);
    expect(dup.body.error.field).toBe('name');
    const rename = await engineer.agent
      .patch(`/api/reviews/${reviewId}/candidates/${other.id}`)
      .send({ name: 'recuperated' });
    expect(rename.status).toBe(409);
    expect(rename.body.error.field).toBe('name');
    expect((await board(reviewId)).candidates.map((c) => c.name)).toEqual(['Recuperated', 'Plain']);
  });

  it('gives the next free colour, keeps colours after another candidate is gone, and refuses a ninth', async () => {
    const reviewId = await newReview();
    const a = await add(reviewId, { name: 'Alpha', preset: 'simple' });
    const b = await add(reviewId, { name: 'Bravo', preset: 'simple' });
    const c = await add(reviewId, { name: 'Charlie', preset: 'simple' });
    expect([a.colour, b.colour, c.colour]).toEqual(candidateColours.slice(0, 3));
    await ctx.db.delete(candidate).where(eq(candidate.id, b.id));
    const d = await add(reviewId, { name: 'Delta', preset: 'simple' });
    expect(d.colour).toBe(candidateColours[1]);
    const after = await board(reviewId);
    expect(Object.fromEntries(after.candidates.map((x) => [x.name, x.colour]))).toEqual({
      Alpha: candidateColours[0],
      Charlie: candidateColours[2],
      Delta: candidateColours[1],
    });
    for (const name of ['Echo', 'Foxtrot', 'Golf', 'Hotel', 'India']) await add(reviewId, { name, preset: 'simple' });
    const colours = (await board(reviewId)).candidates.map((x) => x.colour);
    expect(new Set(colours).size).toBe(8);
    const ninth = await engineer.agent
      .post(`/api/reviews/${reviewId}/candidates`)
      .send({ name: 'Juliett', preset: 'simple' });
    expect(ninth.status).toBe(409);
    expect(ninth.body.error.code).toBe('candidate_limit');
    expect((await board(reviewId)).candidates).toHaveLength(8);
  });

  it('gives the same colour to no two candidates created at once', async () => {
    const reviewId = await newReview();
    const results = await Promise.all(
      ['One', 'Two', 'Three', 'Four'].map((name) =>
        engineer.agent.post(`/api/reviews/${reviewId}/candidates`).send({ name, preset: 'simple' }),
      ),
    );
    expect(results.map((r) => r.status)).toEqual([201, 201, 201, 201]);
    expect(new Set(results.map((r) => r.body.colour)).size).toBe(4);
  });
});

describe('PATCH a candidate', () => {
  it('merges a partial parameter change, recomputes, logs and tells the room', async () => {
    const reviewId = await newReview();
    const before = await add(reviewId, { name: 'Merge me', preset: 'simple' });
    const res = await engineer.agent
      .patch(`/api/reviews/${reviewId}/candidates/${before.id}`)
      .send({ parameters: { compressor: { pressureRatio: 12 } }, ifRevision: 1 });
    expect(res.status).toBe(200);
    const after: CandidateWire = res.body;
    const p0 = before.parameters as any;
    const p1 = after.parameters as any;
    expect(p1.compressor).toEqual({ ...p0.compressor, pressureRatio: 12 });
    expect(p1.turbine).toEqual(p0.turbine);
    expect(p1.regenerator).toBeNull();
    expect(after.revision).toBe(2);
    expect((after.input as any).compressor.pressureRatio).toBe(12);
    expect(after.results).toEqual(await evaluated(after.input));
    expect((after.results as any).thermalEfficiency).not.toBe((before.results as any).thermalEfficiency);
    const [log] = await ctx.db
      .select()
      .from(activity)
      .where(and(eq(activity.reviewId, reviewId), eq(activity.kind, 'candidate:recomputed')));
    expect(log.detail).toMatchObject({ name: 'Merge me', fields: ['compressor.pressureRatio'] });
    const last = sentFor(reviewId).at(-1)!;
    expect(last.event).toBe('candidate:recomputed');
    expect(reviewNews['candidate:recomputed'].parse(last.payload).candidate).toEqual(after);
  });

  it('adds a regenerator only with all its fields, and removes it with null', async () => {
    const reviewId = await newReview();
    const c = await add(reviewId, { name: 'Grows a regenerator', preset: 'simple' });
    const url = `/api/reviews/${reviewId}/candidates/${c.id}`;
    const half = await engineer.agent.patch(url).send({ parameters: { regenerator: { effectiveness: 0.85 } } });
    expect(half.status).toBe(422);
    expect(half.body.error.field).toMatch(/^parameters\.regenerator\.(air|gas)SidePressureLoss$/);
    const whole = await engineer.agent.patch(url).send({
      parameters: {
        compressor: { pressureRatio: 8 },
        regenerator: { effectiveness: 0.85, airSidePressureLoss: 0.03, gasSidePressureLoss: 0.03 },
      },
    });
    expect(whole.status).toBe(200);
    expect(whole.body.revision).toBe(2);
    expect((whole.body.results as any).regeneratorDutyKJPerKg).toBeGreaterThan(0);
    const tuned = await engineer.agent.patch(url).send({ parameters: { regenerator: { effectiveness: 0.9 } } });
    expect(tuned.body.parameters.regenerator).toEqual({
      effectiveness: 0.9,
      airSidePressureLoss: 0.03,
      gasSidePressureLoss: 0.03,
    });
    const removed = await engineer.agent.patch(url).send({ parameters: { regenerator: null } });
    expect(removed.status).toBe(200);
    expect(removed.body.parameters.regenerator).toBeNull();
    expect(removed.body.input.regenerator).toBeNull();
    expect(removed.body.results).toEqual(await evaluated(removed.body.input));
  });

  it('refuses a bad merged value with 422 at parameters.<group>.<field> and changes nothing', async () => {
    const reviewId = await newReview();
    const c = await add(reviewId, { name: 'Stays put', preset: 'simple' });
    const res = await engineer.agent
      .patch(`/api/reviews/${reviewId}/candidates/${c.id}`)
      .send({ parameters: { compressor: { pressureRatio: 0.5 } } });
    expect(res.status).toBe(422);
    expect(res.body.error.field).toBe('parameters.compressor.pressureRatio');
    const [row] = await ctx.db.select().from(candidate).where(eq(candidate.id, c.id));
    expect(row.revision).toBe(1);
    expect(row.parameters).toEqual(c.parameters);
  });

  it('stores an engine refusal as the candidate’s error at the parameter, and recovers when mended', async () => {
    const reviewId = await newReview();
    const c = await add(reviewId, { name: 'Too cool', preset: 'simple' });
    const url = `/api/reviews/${reviewId}/candidates/${c.id}`;
    const refused = await engineer.agent.patch(url).send({ parameters: { turbine: { inletTemperatureK: 650 } } });
    expect(refused.status).toBe(200);
    expect(refused.body.results).toBeNull();
    expect(refused.body.error).toEqual({
      field: 'parameters.turbine.inletTemperatureK',
      message: expect.stringContaining('compressor delivery temperature'),
    });
    expect(refused.body.parameters.turbine.inletTemperatureK).toBe(650);
    // The same input at the engine route is the engine's 422 at the engine's field.
    const direct = await engineer.agent.post('/api/cycles/evaluate').send(refused.body.input);
    expect(direct.status).toBe(422);
    expect(direct.body.error.field).toBe('turbine.inletTemperatureK');
    const b = await board(reviewId);
    expect(b.candidates[0].error?.field).toBe('parameters.turbine.inletTemperatureK');
    const mended = await engineer.agent.patch(url).send({ parameters: { turbine: { inletTemperatureK: 1550 } } });
    expect(mended.status).toBe(200);
    expect(mended.body.error).toBeNull();
    expect(mended.body.results).toEqual(await evaluated(mended.body.input));
  });

  it('warns, and does not refuse, a turbine inlet above the basis limit', async () => {
    const reviewId = await newReview();
    const c = await add(reviewId, { name: 'Hot', preset: 'simple' });
    const res = await engineer.agent
      .patch(`/api/reviews/${reviewId}/candidates/${c.id}`)
      .send({ parameters: { turbine: { inletTemperatureK: 1750 } } });
    expect(res.status).toBe(200);
    expect(res.body.error).toBeNull();
    expect(res.body.results.warnings.map((w: { code: string }) => w.code)).toContain('turbine-inlet-above-limit');
  });

  it('renames and changes the status with one Activity line each, still as candidate:recomputed', async () => {
    const reviewId = await newReview();
    const c = await add(reviewId, { name: 'Old name', preset: 'reheat' });
    const res = await lead.agent
      .patch(`/api/reviews/${reviewId}/candidates/${c.id}`)
      .send({ name: 'New name', status: 'shortlisted' });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ name: 'New name', status: 'shortlisted', revision: 2 });
    expect(res.body.results).toEqual(c.results);
    const logged = await ctx.db.select().from(activity).where(eq(activity.reviewId, reviewId));
    expect(logged.find((a) => a.kind === 'candidate:renamed')?.detail).toMatchObject({
      from: 'Old name',
      to: 'New name',
    });
    expect(logged.find((a) => a.kind === 'candidate:status-changed')?.detail).toMatchObject({
      name: 'New name',
      statusLabel: 'Shortlisted',
    });
    expect(sentFor(reviewId).at(-1)?.event).toBe('candidate:recomputed');
    // The same values again change nothing: no new revision, no news.
    const count = sentFor(reviewId).length;
    const same = await lead.agent.patch(`/api/reviews/${reviewId}/candidates/${c.id}`).send({ name: 'New name' });
    expect(same.body.revision).toBe(2);
    expect(sentFor(reviewId)).toHaveLength(count);
  });

  it('answers a stale ifRevision with 409 and the current candidate, naming who changed it', async () => {
    const reviewId = await newReview();
    const c = await add(reviewId, { name: 'Contested', preset: 'simple' });
    const url = `/api/reviews/${reviewId}/candidates/${c.id}`;
    await lead.agent
      .patch(url)
      .send({ parameters: { compressor: { pressureRatio: 16 } }, ifRevision: 1 })
      .expect(200);
    const stale = await engineer.agent
      .patch(url)
      .send({ parameters: { compressor: { pressureRatio: 22 } }, ifRevision: 1 });
    expect(stale.status).toBe(409);
    expect(stale.body.error.code).toBe('conflict');
    expect(stale.body.error.message).toContain(lead.name);
    expect(candidateSchema.parse(stale.body.candidate)).toMatchObject({
      id: c.id,
      revision: 2,
      updatedBy: { id: lead.id, name: lead.name },
    });
    expect(stale.body.candidate.parameters.compressor.pressureRatio).toBe(16);
    const [row] = await ctx.db.select().from(candidate).where(eq(candidate.id, c.id));
    expect(row.revision).toBe(2);
    expect((row.parameters as any).compressor.pressureRatio).toBe(16);
  });

  it('lets exactly one of two PATCHes made on the same revision through', async () => {
    const reviewId = await newReview();
    const c = await add(reviewId, { name: 'Raced', preset: 'intercooled-reheat-regenerative' });
    const url = `/api/reviews/${reviewId}/candidates/${c.id}`;
    for (let round = 0; round < 4; round++) {
      const revision = round + 1;
      const [a, b] = await Promise.all([
        engineer.agent
          .patch(url)
          .send({ parameters: { compressor: { pressureRatio: 9 + round } }, ifRevision: revision }),
        lead.agent.patch(url).send({ parameters: { compressor: { pressureRatio: 14 + round } }, ifRevision: revision }),
      ]);
      expect([a.status, b.status].sort()).toEqual([200, 409]);
      const winner = a.status === 200 ? a : b;
      const [row] = await ctx.db.select().from(candidate).where(eq(candidate.id, c.id));
      expect(row.revision).toBe(revision + 1);
      expect(row.parameters).toEqual(winner.body.parameters);
    }
  });

  it('keeps every one of several PATCHes sent at once without ifRevision: none is lost, each logged', async () => {
    const reviewId = await newReview();
    const c = await add(reviewId, { name: 'Crowded', preset: 'reheat' });
    const url = `/api/reviews/${reviewId}/candidates/${c.id}`;
    const changes = [
      { parameters: { compressor: { pressureRatio: 17 } } },
      { parameters: { turbine: { inletTemperatureK: 1480 } } },
      { parameters: { turbine: { reheatTemperatureK: 1420 } } },
      { name: 'Crowded, renamed' },
      { status: 'shortlisted' },
    ];
    const answers = await Promise.all(changes.map((body, i) => (i % 2 ? lead : engineer).agent.patch(url).send(body)));
    for (const a of answers) expect(a.status, JSON.stringify(a.body)).toBe(200);
    const [row] = await ctx.db.select().from(candidate).where(eq(candidate.id, c.id));
    expect(row.revision).toBe(1 + changes.length);
    expect(row).toMatchObject({ name: 'Crowded, renamed', status: 'shortlisted' });
    const p = row.parameters as any;
    expect([p.compressor.pressureRatio, p.turbine.inletTemperatureK, p.turbine.reheatTemperatureK]).toEqual([
      17, 1480, 1420,
    ]);
    expect(row.results).toEqual(await evaluated(row.input));
    const logged = await ctx.db.select().from(activity).where(eq(activity.reviewId, reviewId));
    expect(logged.filter((l) => l.kind === 'candidate:recomputed')).toHaveLength(3);
    expect(logged.filter((l) => l.kind === 'candidate:renamed')).toHaveLength(1);
    expect(logged.filter((l) => l.kind === 'candidate:status-changed')).toHaveLength(1);
    // Every revision the room heard is a distinct one, and the last is the stored row.
    const heard = sentFor(reviewId)
      .filter((s) => s.event === 'candidate:recomputed')
      .map((s) => (s.payload as { candidate: CandidateWire }).candidate.revision);
    expect(new Set(heard).size).toBe(changes.length);
    expect(Math.max(...heard)).toBe(row.revision);
  });

  it('leaves a candidate edited during a basis change computed with the basis it ends on', async () => {
    for (let round = 0; round < 3; round++) {
      const reviewId = await newReview();
      const c = await add(reviewId, { name: `Racing the basis ${round}`, preset: 'regenerative' });
      const url = `/api/reviews/${reviewId}/candidates/${c.id}`;
      const body = basisBody((await board(reviewId)).designBasis);
      body.ambient = { ...body.ambient, temperatureK: 300.15 + round };
      const [put, ...edits] = await Promise.all([
        lead.agent.put(`/api/reviews/${reviewId}/design-basis`).send(body),
        engineer.agent.patch(url).send({ parameters: { compressor: { pressureRatio: 7 + round } } }),
        lead.agent.patch(url).send({ parameters: { turbine: { inletTemperatureK: 1400 + round } } }),
      ]);
      expect(put.status, JSON.stringify(put.body)).toBe(200);
      for (const e of edits) expect(e.status, JSON.stringify(e.body)).toBe(200);
      const [row] = await ctx.db.select().from(candidate).where(eq(candidate.id, c.id));
      const input = row.input as any;
      expect(input.ambient.temperatureK).toBe(300.15 + round);
      expect(input.compressor.pressureRatio).toBe(7 + round);
      expect(input.turbine.inletTemperatureK).toBe(1400 + round);
      expect(row.results).toEqual(await evaluated(row.input));
    }
  });
});

describe('PUT design basis', () => {
  it('recomputes every candidate in one change: new revisions, numbers equal to the evaluate route, news after', async () => {
    const reviewId = await newReview();
    const made: CandidateWire[] = [];
    for (const preset of candidatePresets) made.push(await add(reviewId, { name: `Basis ${preset}`, preset }));
    const b = await board(reviewId);
    const body = basisBody(b.designBasis);
    body.ambient = { temperatureK: 258.15, elevationM: 310, relativeHumidity: 0.8 };
    body.fuel = { hydrogenVolumeFraction: 0.2, temperatureK: 283.15 };
    body.netPowerKW = 40_000;
    // Keep the first five criteria, drop the sixth, add one.
    body.criteria = [
      ...body.criteria.slice(0, 5).map((c) => ({ ...c, weight: 18 })),
      { name: 'Start time', weight: 10, measure: null } as never,
    ];
    const before = sentFor(reviewId).length;
    const res = await lead.agent.put(`/api/reviews/${reviewId}/design-basis`).send(body);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.designBasis).toMatchObject({
      ambient: body.ambient,
      fuel: body.fuel,
      netPowerKW: 40_000,
      revision: 2,
    });
    const ids = b.designBasis.criteria.map((c) => c.id);
    expect(res.body.designBasis.criteria.slice(0, 5).map((c: { id: string }) => c.id)).toEqual(ids.slice(0, 5));
    expect(res.body.designBasis.criteria[5].id).toMatch(/^[0-9a-f-]{36}$/);
    expect(res.body.designBasis.criteria.map((c: { id: string }) => c.id)).not.toContain(ids[5]);
    expect(res.body.candidates).toHaveLength(5);
    for (const [i, c] of (res.body.candidates as CandidateWire[]).entries()) {
      expect(c.id).toBe(made[i].id);
      expect(c.revision).toBe(2);
      expect(c.updatedBy?.id).toBe(lead.id);
      expect(c.input).toMatchObject({ ambient: body.ambient, fuel: body.fuel, netPowerKW: 40_000 });
      expect(c.parameters).toEqual(made[i].parameters);
      expect(c.error).toBeNull();
      expect(c.results).toEqual(await evaluated(c.input));
      expect((c.results as any).airMassFlowKgPerS).not.toBe((made[i].results as any).airMassFlowKgPerS);
    }
    const news = sentFor(reviewId).slice(before);
    expect(news.map((s) => s.event)).toEqual(['basis:updated', ...Array(5).fill('candidate:recomputed')]);
    reviewNews['basis:updated'].parse(news[0].payload);
    const logged = await ctx.db
      .select()
      .from(activity)
      .where(and(eq(activity.reviewId, reviewId), eq(activity.kind, 'basis:updated')));
    expect(logged).toHaveLength(1);
    expect(logged[0].detail).toMatchObject({ recomputed: 5 });
    expect(logged[0].detail.changed).toEqual(['ambient', 'fuel', 'netPowerKW', 'criteria']);
    const stored = await board(reviewId, observer);
    expect(stored.designBasis).toEqual(res.body.designBasis);
    expect(stored.candidates).toEqual(res.body.candidates);
  });

  it('changes only the criteria without recomputing any candidate', async () => {
    const reviewId = await newReview();
    const c = await add(reviewId, { name: 'Untouched', preset: 'simple' });
    const body = basisBody((await board(reviewId)).designBasis);
    body.criteria[0] = { ...body.criteria[0], name: 'Thermal efficiency', weight: 40 };
    const res = await owner.agent.put(`/api/reviews/${reviewId}/design-basis`).send(body);
    expect(res.status).toBe(200);
    expect(res.body.designBasis.criteria[0]).toMatchObject({
      id: 'efficiency',
      name: 'Thermal efficiency',
      weight: 40,
    });
    expect(res.body.candidates[0].revision).toBe(c.revision);
    expect(sentFor(reviewId).at(-1)?.event).toBe('basis:updated');
  });

  it('stores a combination the engine refuses as the candidate’s error, and mends it when the basis allows', async () => {
    const reviewId = await newReview();
    const c = await add(reviewId, { name: 'Low inlet', preset: 'simple' });
    const refused = await engineer.agent
      .patch(`/api/reviews/${reviewId}/candidates/${c.id}`)
      .send({ parameters: { turbine: { inletTemperatureK: 650 } } });
    expect(refused.body.error?.field).toBe('parameters.turbine.inletTemperatureK');
    const body = basisBody((await board(reviewId)).designBasis);
    // A colder site delivers colder air: 650 K is then above the compressor delivery.
    body.ambient = { temperatureK: 230, pressureKPa: 101.325, relativeHumidity: 0.6 };
    const cold = await lead.agent.put(`/api/reviews/${reviewId}/design-basis`).send(body);
    expect(cold.status).toBe(200);
    expect(cold.body.candidates[0].error).toBeNull();
    expect(cold.body.candidates[0].results).toEqual(await evaluated(cold.body.candidates[0].input));
    body.ambient = { temperatureK: 288.15, pressureKPa: 101.325, relativeHumidity: 0.6 };
    const iso = await lead.agent.put(`/api/reviews/${reviewId}/design-basis`).send(body);
    expect(iso.status).toBe(200);
    expect(iso.body.candidates[0]).toMatchObject({
      results: null,
      error: { field: 'parameters.turbine.inletTemperatureK' },
      revision: 4,
    });
  });

  it('refuses a basis the engine cannot compute at all with 422 at its own field, and stores nothing', async () => {
    const reviewId = await newReview();
    const c = await add(reviewId, { name: 'Humid', preset: 'simple' });
    const body = basisBody((await board(reviewId)).designBasis);
    body.ambient = { temperatureK: 700, pressureKPa: 101.325, relativeHumidity: 0.6 };
    const res = await lead.agent.put(`/api/reviews/${reviewId}/design-basis`).send(body);
    expect(res.status).toBe(422);
    expect(res.body.error.field).toBe('ambient.temperatureK');
    expect(res.body.error.message).toContain('Humid air');
    const b = await board(reviewId);
    expect(b.designBasis.ambient.temperatureK).toBe(288.15);
    expect(b.candidates[0].revision).toBe(c.revision);
  });

  it('refuses a bad basis with 422 naming the field and changes nothing', async () => {
    const reviewId = await newReview();
    const c = await add(reviewId, { name: 'Steady', preset: 'simple' });
    const body = basisBody((await board(reviewId)).designBasis);
    for (const [mutate, field] of [
      [(x: any) => (x.ambient.relativeHumidity = 1.5), 'ambient.relativeHumidity'],
      [(x: any) => (x.limits.exhaustTemperatureMaxK = 600), 'limits.exhaustTemperatureMaxK'],
      [(x: any) => (x.criteria = []), 'criteria'],
      [(x: any) => (x.criteria[1].name = x.criteria[0].name), 'criteria.1.name'],
      [(x: any) => (x.netPowerKW = -5), 'netPowerKW'],
      [(x: any) => delete x.fuel, 'fuel'],
    ] as const) {
      const bad = structuredClone(body);
      mutate(bad);
      const res = await lead.agent.put(`/api/reviews/${reviewId}/design-basis`).send(bad);
      expect(res.status, field).toBe(422);
      expect(res.body.error.field).toBe(field);
    }
    const [row] = await ctx.db.select().from(candidate).where(eq(candidate.id, c.id));
    expect(row.revision).toBe(1);
    const [basis] = await ctx.db.select().from(designBasis).where(eq(designBasis.reviewId, reviewId));
    expect(basis.revision).toBe(1);
  });
});

describe('payload size', () => {
  it('keeps a five-candidate board and one candidate event compact', async () => {
    const reviewId = await newReview();
    for (const preset of candidatePresets) await add(reviewId, { name: `Size ${preset}`, preset });
    const res = await lead.agent.get(`/api/reviews/${reviewId}/board`);
    const boardBytes = Buffer.byteLength(JSON.stringify(res.body));
    const event = sentFor(reviewId).at(-1)!;
    const eventBytes = Buffer.byteLength(JSON.stringify(event.payload));
    console.info(`[size] board with 5 candidates: ${boardBytes} B; one candidate:added event: ${eventBytes} B`);
    expect(boardBytes).toBeLessThan(64 * 1024);
    expect(eventBytes).toBeLessThan(16 * 1024);
  });
});

describe('demo board', () => {
  it('gives the first demo review its basis and five computed candidates, one per preset, that the discussion builds on', async () => {
    // A database of its own: the demo people's fixed addresses never meet other tests' rows.
    const url = await ensureDatabase(await ensureCluster(), `cyclemoot_${inject('runId')}_demo_board`, { fresh: true });
    await migrateDatabase(url);
    const demo = createTestApp(url);
    try {
      const { teamId } = await seedDemo(demo.db);
      const people = await demo.db.select().from(user);
      const ids = Object.fromEntries(
        demoUsers.map((u) => [u.role, people.find((p) => p.email === u.email)!.id]),
      ) as Record<TeamRole, string>;
      // seedDemo itself writes the first review's board and discussion.
      void teamId;
      void ids;
      const [first] = await demo.db.select({ id: review.id }).from(review).where(eq(review.name, demoReviews[0].name));
      const reviewId = first!.id;
      const agent = supertest.agent(demo.app).set('Origin', testOrigin);
      const leadUser = demoUsers.find((u) => u.role === 'lead')!;
      await agent.post('/api/auth/sign-in/email').send({ email: leadUser.email, password: demoPassword }).expect(200);
      const b = boardSchema.parse((await agent.get(`/api/reviews/${reviewId}/board`).expect(200)).body);
      expect(b.designBasis).toMatchObject({ ambient: { temperatureK: 258.15, elevationM: 310 }, netPowerKW: 40_000 });
      expect(b.candidates.map((c) => c.preset)).toEqual([...candidatePresets]);
      for (const c of b.candidates) {
        expect(c.error, c.name).toBeNull();
        const direct = await agent.post('/api/cycles/evaluate').send(c.input).expect(200);
        expect(c.results).toEqual(direct.body);
      }
      expect(b.candidates.map((c) => c.status)).toEqual([
        'shortlisted',
        'shortlisted',
        'proposed',
        'set-aside',
        'proposed',
      ]);
      expect(b.round).toMatchObject({ status: 'closed', voters: 3 });
      expect(Object.values(b.commentCounts).reduce((a, n) => a + n, 0)).toBe(5);
    } finally {
      await demo.close();
    }
  });
});
