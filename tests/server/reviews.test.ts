import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { activity, review } from '@/db/schema';

import { createTeam, createTestApp, signUp, type TestUser } from '../helpers/api';

const ctx = createTestApp();
let owner: TestUser;
let lead: TestUser;
let observer: TestUser;
let outsider: TestUser;
let teamId: string;

beforeAll(async () => {
  owner = await signUp(ctx.app, 'Olga Owner');
  lead = await signUp(ctx.app, 'Lars Lead');
  observer = await signUp(ctx.app, 'Otto Observer');
  outsider = await signUp(ctx.app, 'Ursula Outsider');
  teamId = await createTeam(ctx, owner, [
    { user: lead, role: 'lead' },
    { user: observer, role: 'observer' },
  ]);
  await createTeam(ctx, outsider);
});
afterAll(() => ctx.close());

describe('reviews of a team', () => {
  it('lets a Lead create a review, records it in Activity and tells the team room', async () => {
    const res = await lead.agent.post(`/api/teams/${teamId}/reviews`).send({ name: '  Peaking unit cycle  ' });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ teamId, name: 'Peaking unit cycle', summary: '', status: 'active' });
    expect(res.body.createdBy).toEqual({ id: lead.id, name: lead.name });
    const logged = await ctx.db.select().from(activity).where(eq(activity.reviewId, res.body.id));
    expect(logged.map((a) => a.kind)).toEqual(['review:created']);
    expect(ctx.sent.at(-1)).toMatchObject({ teamId, event: 'review:created' });
  });

  it('lists the team reviews to every member, archived ones only when asked', async () => {
    const created = await owner.agent.post(`/api/teams/${teamId}/reviews`).send({ name: 'To be archived' });
    await owner.agent.patch(`/api/reviews/${created.body.id}`).send({ status: 'archived' }).expect(200);
    const active = await observer.agent.get(`/api/teams/${teamId}/reviews`);
    expect(active.status).toBe(200);
    expect(active.body.map((r: { name: string }) => r.name)).toContain('Peaking unit cycle');
    expect(active.body.map((r: { name: string }) => r.name)).not.toContain('To be archived');
    const archived = await observer.agent.get(`/api/teams/${teamId}/reviews?status=archived`);
    expect(archived.body.map((r: { name: string }) => r.name)).toEqual(['To be archived']);
    expect(archived.body[0].archivedAt).not.toBeNull();
  });

  it('renames a review and logs the old and new name', async () => {
    const created = await lead.agent.post(`/api/teams/${teamId}/reviews`).send({ name: 'Old name' });
    const res = await lead.agent.patch(`/api/reviews/${created.body.id}`).send({ name: 'New name' });
    expect(res.status).toBe(200);
    expect(res.body.name).toBe('New name');
    const logged = await ctx.db.select().from(activity).where(eq(activity.reviewId, created.body.id));
    expect(logged.find((a) => a.kind === 'review:renamed')?.detail).toEqual({ from: 'Old name', to: 'New name' });
  });

  it('answers 409 naming the field when the name is taken in the team (any letter case)', async () => {
    const res = await lead.agent.post(`/api/teams/${teamId}/reviews`).send({ name: 'PEAKING UNIT CYCLE' });
    expect(res.status).toBe(409);
    expect(res.body.error).toMatchObject({ code: 'conflict', field: 'name' });
  });

  it('rejects bad input with 422 and field errors, writing nothing', async () => {
    const before = await ctx.db.select().from(review).where(eq(review.teamId, teamId));
    const short = await lead.agent.post(`/api/teams/${teamId}/reviews`).send({ name: 'ab' });
    expect(short.status).toBe(422);
    expect(short.body.error.field).toBe('name');
    expect(short.body.error.fieldErrors.name[0]).toMatch(/at least 3/);
    const wrongType = await lead.agent.post(`/api/teams/${teamId}/reviews`).send({ name: 42 });
    expect(wrongType.status).toBe(422);
    const extra = await lead.agent.post(`/api/teams/${teamId}/reviews`).send({ name: 'Fine name', owner: 'x' });
    expect(extra.status).toBe(422);
    const after = await ctx.db.select().from(review).where(eq(review.teamId, teamId));
    expect(after.length).toBe(before.length);
  });
});

describe('roles and teams', () => {
  it('does not let an Observer create or rename a review', async () => {
    const create = await observer.agent.post(`/api/teams/${teamId}/reviews`).send({ name: 'Observer review' });
    expect(create.status).toBe(403);
    expect(create.body.error.code).toBe('forbidden');
    const [existing] = await ctx.db.select().from(review).where(eq(review.teamId, teamId)).limit(1);
    const rename = await observer.agent.patch(`/api/reviews/${existing.id}`).send({ name: 'Renamed by observer' });
    expect(rename.status).toBe(403);
    const [unchanged] = await ctx.db.select().from(review).where(eq(review.id, existing.id));
    expect(unchanged.name).toBe(existing.name);
  });

  it("answers 404 to a member of another team for this team's review and reviews", async () => {
    const [existing] = await ctx.db.select().from(review).where(eq(review.teamId, teamId)).limit(1);
    const one = await outsider.agent.get(`/api/reviews/${existing.id}`);
    expect(one.status).toBe(404);
    expect(one.body.error.code).toBe('not_found');
    expect((await outsider.agent.get(`/api/teams/${teamId}/reviews`)).status).toBe(404);
    expect((await outsider.agent.patch(`/api/reviews/${existing.id}`).send({ name: 'Hijacked' })).status).toBe(404);
    expect((await outsider.agent.post(`/api/teams/${teamId}/reviews`).send({ name: 'Intruder' })).status).toBe(404);
  });

  it('answers 401 without a session', async () => {
    const { default: supertest } = await import('supertest');
    const res = await supertest(ctx.app).get(`/api/teams/${teamId}/reviews`);
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('unauthorized');
  });

  it("reports the user's teams and roles", async () => {
    const me = await lead.agent.get('/api/me');
    expect(me.status).toBe(200);
    expect(me.body.teams).toEqual([expect.objectContaining({ id: teamId, role: 'lead' })]);
    const team = await observer.agent.get(`/api/teams/${teamId}`);
    expect(team.body.myRole).toBe('observer');
    expect(team.body.members.map((m: { role: string }) => m.role).sort()).toEqual(['lead', 'observer', 'owner']);
  });
});
