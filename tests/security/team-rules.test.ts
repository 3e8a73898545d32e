import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { invitation, member, organization } from '@/db/schema';

import { createTeam, createTestApp, signUp, type TestUser } from '../helpers/api';
import { uniqueEmail } from '../helpers/test-server';

/**
 * Findings 8 and 9: better-auth's own routes took roles and Team fields the product never
 * allows — a role list that the screens showed as Observer while better-auth let the
 * member act as Owner, better-auth's `admin`, one-letter or 100 000-character names, slugs
 * with `../` and HTML, a `javascript:` logo, and NUL or deeply nested metadata (500s).
 */

const ctx = createTestApp();
let owner: TestUser;
let engineer: TestUser;
let teamId: string;
let engineerMemberId: string;

beforeAll(async () => {
  owner = await signUp(ctx.app, 'Rhea Roles');
  engineer = await signUp(ctx.app, 'Eli Engineer');
  teamId = await createTeam(ctx, owner, [{ user: engineer, role: 'engineer' }]);
  const [row] = await ctx.db.select().from(member).where(eq(member.userId, engineer.id));
  engineerMemberId = row.id;
});
afterAll(() => ctx.close());

const pendingInvitations = async () =>
  (await ctx.db.select().from(invitation).where(eq(invitation.organizationId, teamId))).length;

describe('roles outside our five (finding 8)', () => {
  for (const role of [['observer', 'owner'], 'admin', 'observer,owner', 'Owner', '', ['owner']] as unknown[]) {
    it(`an Owner cannot invite with role ${JSON.stringify(role)}`, async () => {
      const before = await pendingInvitations();
      const res = await owner.agent
        .post('/api/auth/organization/invite-member')
        .send({ email: uniqueEmail('odd-role'), role, organizationId: teamId });
      expect(res.status).toBe(422);
      expect(res.body.error.field).toBe('role');
      expect(res.body.error.message).toContain('Pick one of Owner, Lead, Engineer, Reviewer, Observer');
      expect(await pendingInvitations()).toBe(before);
    });

    it(`an Owner cannot change a member's role to ${JSON.stringify(role)}`, async () => {
      const res = await owner.agent
        .post('/api/auth/organization/update-member-role')
        .send({ memberId: engineerMemberId, role, organizationId: teamId });
      expect(res.status).toBe(422);
      expect(res.body.error.field).toBe('role');
      const [row] = await ctx.db.select().from(member).where(eq(member.id, engineerMemberId));
      expect(row.role).toBe('engineer');
    });
  }

  it('one of ours is still accepted', async () => {
    const res = await owner.agent
      .post('/api/auth/organization/update-member-role')
      .send({ memberId: engineerMemberId, role: 'reviewer', organizationId: teamId });
    expect(res.status).toBe(200);
    const [row] = await ctx.db.select().from(member).where(eq(member.id, engineerMemberId));
    expect(row.role).toBe('reviewer');
  });
});

describe('Team creation through better-auth’s route (finding 9)', () => {
  const teamsOf = async (who: TestUser) => (await ctx.db.select().from(member).where(eq(member.userId, who.id))).length;
  const create = (body: unknown) => engineer.agent.post('/api/auth/organization/create').send(body as object);
  const nested = (depth: number) => {
    let v: unknown = 'x';
    for (let i = 0; i < depth; i++) v = { a: v };
    return v;
  };
  const cases: Array<[string, Record<string, unknown>, string, number?]> = [
    ['a one-letter name', { name: 'A', slug: 'a-team' }, 'name'],
    ['an 81-character name', { name: 'n'.repeat(81), slug: 'long-team' }, 'name'],
    ['a NUL in the name', { name: 'Fjell\u0000vik', slug: 'nul-team' }, 'name'],
    ['a lone surrogate in the name', { name: 'Fjell\uD800vik', slug: 'surrogate-team' }, 'name'],
    ['a slug with ../ and HTML', { name: 'Slug Team', slug: '../<b>x</b>' }, 'slug'],
    ['a slug with upper case', { name: 'Slug Team', slug: 'Slug-Team' }, 'slug'],
    ['a javascript: logo', { name: 'Logo Team', slug: 'logo-team', logo: 'javascript:alert(1)' }, 'logo'],
    ['metadata', { name: 'Meta Team', slug: 'meta-team', metadata: { note: 'x' } }, 'metadata'],
    ['metadata nested 1500 deep', { name: 'Deep Team', slug: 'deep-team', metadata: nested(1500) }, 'metadata'],
  ];
  for (const [what, body, field] of cases) {
    it(`refuses ${what} with 422 naming ${field}, creating nothing`, async () => {
      const before = await teamsOf(engineer);
      const res = await create(body);
      expect(res.status).toBe(422);
      expect(res.body.error.field).toBe(field);
      expect(await teamsOf(engineer)).toBe(before);
    });
  }

  it('refuses a 100 000-character name before reading it (413)', async () => {
    const res = await create({ name: 'n'.repeat(100_000), slug: 'huge-team' });
    expect(res.status).toBe(413);
  });

  // Sent as raw text: a JSON encoder cannot even write 5000 levels without overflowing its stack.
  const deepBody = (depth: number) =>
    `{"name":"Deep Team","slug":"deep-team","metadata":${'{"a":'.repeat(depth)}"x"${'}'.repeat(depth)}}`;

  it('metadata nested 5000 deep is refused as too large, not a 500', async () => {
    const res = await engineer.agent
      .post('/api/auth/organization/create')
      .set('content-type', 'application/json')
      .send(deepBody(5000));
    expect(res.status, JSON.stringify(res.body)).toBe(413);
  });

  it('metadata nested 2500 deep, under the size cap, is refused by field, not a 500', async () => {
    const res = await engineer.agent
      .post('/api/auth/organization/create')
      .set('content-type', 'application/json')
      .send(deepBody(2500));
    expect(res.status, JSON.stringify(res.body)).toBe(422);
    expect(res.body.error.field).toBe('metadata');
  });

  it('creates a Team from a good name and slug, stored as sent', async () => {
    const slug = `good-team-${Date.now().toString(36)}`;
    const res = await create({ name: '  Fjellvik peaking  ', slug });
    expect(res.status).toBe(200);
    const [row] = await ctx.db.select().from(organization).where(eq(organization.id, res.body.id));
    expect(row).toMatchObject({ name: 'Fjellvik peaking', slug, logo: null, metadata: null });
  });
});
