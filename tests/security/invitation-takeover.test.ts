import { eq } from 'drizzle-orm';
import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { invitation, member, user } from '@/db/schema';

import { createTeam, createTestApp, signUp, testOrigin, testPassword, type TestUser } from '../helpers/api';
import { mailsTo, uniqueEmail, verificationLink, waitForMail } from '../helpers/test-server';

/**
 * Finding 1 (high) and 11: an Observer read the id of a pending Owner invitation from the
 * Team page, signed up as the invited address (no proof of owning it), accepted, and
 * removed the real Owner. Each link of that chain is tried here, against the real app.
 */

const ctx = createTestApp();
let owner: TestUser;
const members: Record<'lead' | 'engineer' | 'reviewer' | 'observer', TestUser> = {} as never;
let teamId: string;

const agentFor = () => supertest.agent(ctx.app).set('Origin', testOrigin);
const cookieOf = (res: supertest.Response) => (res.headers['set-cookie'] as unknown as string[] | undefined) ?? [];

beforeAll(async () => {
  owner = await signUp(ctx.app, 'Olga Owner');
  for (const role of ['lead', 'engineer', 'reviewer', 'observer'] as const) {
    members[role] = await signUp(ctx.app, `${role[0].toUpperCase()}${role.slice(1)} Member`);
  }
  teamId = await createTeam(
    ctx,
    owner,
    Object.entries(members).map(([role, u]) => ({ user: u, role })),
  );
});
afterAll(() => ctx.close());

async function invite(email: string, role: string) {
  const res = await owner.agent
    .post('/api/auth/organization/invite-member')
    .send({ email, role, organizationId: teamId });
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body.id as string;
}

describe('reading pending invitations off the Team page', () => {
  it('an Observer, Reviewer, Engineer or Lead is shown no pending invitation and no invitation id', async () => {
    const ownerInvitationId = await invite(uniqueEmail('next-owner'), 'owner');
    await invite(uniqueEmail('next-engineer'), 'engineer');
    for (const [role, u] of Object.entries(members)) {
      const res = await u.agent.get(`/api/teams/${teamId}`);
      expect(res.status, role).toBe(200);
      expect(res.body.invitations, role).toEqual([]);
      expect(JSON.stringify(res.body), role).not.toContain(ownerInvitationId);
    }
  });

  it('the Owner sees each pending invitation with the id that cancelling needs', async () => {
    const id = await invite(uniqueEmail('seen-by-owner'), 'owner');
    const res = await owner.agent.get(`/api/teams/${teamId}`);
    expect(res.body.invitations).toContainEqual(expect.objectContaining({ id, role: 'owner' }));
  });

  it('better-auth routes that list a Team with its invitations are not served at all', async () => {
    const observer = members.observer.agent;
    for (const path of [
      `/api/auth/organization/get-full-organization?organizationId=${teamId}`,
      `/api/auth/organization/list-invitations?organizationId=${teamId}`,
      `/api/auth/organization/list-members?organizationId=${teamId}`,
      '/api/auth/organization/get-invitation?id=x',
    ]) {
      const res = await observer.get(path);
      expect(res.status, path).toBe(404);
      expect(res.body.error.code, path).toBe('route_not_found');
    }
    const setActive = await observer.post('/api/auth/organization/set-active').send({ organizationId: teamId });
    expect(setActive.status).toBe(404);
  });
});

describe('signing up as an address one does not own', () => {
  it('sign-up alone gives no session: the account is usable only after the mailed link is opened', async () => {
    const email = uniqueEmail('invited-owner');
    const invitationId = await invite(email, 'owner');
    const attacker = agentFor();
    const res = await attacker
      .post('/api/auth/sign-up/email')
      .send({ name: 'Not Them', email, password: testPassword });
    expect(res.status).toBe(200);
    expect(res.body.token).toBeNull();
    expect(cookieOf(res).some((c) => c.includes('session_token'))).toBe(false);

    const signIn = await attacker.post('/api/auth/sign-in/email').send({ email, password: testPassword });
    expect(signIn.status).toBe(403);
    expect(signIn.body.code).toBe('EMAIL_NOT_VERIFIED');
    const accept = await attacker.post('/api/auth/organization/accept-invitation').send({ invitationId });
    expect(accept.status).toBe(401);

    // Nothing changed: the invitation still waits, the Owner is still the only Owner.
    const [row] = await ctx.db.select().from(invitation).where(eq(invitation.id, invitationId));
    expect(row.status).toBe('pending');
    const owners = (await ctx.db.select().from(member).where(eq(member.organizationId, teamId))).filter(
      (m) => m.role === 'owner',
    );
    expect(owners.map((m) => m.userId)).toEqual([owner.id]);
  });

  it('a session whose address is not confirmed cannot accept an invitation', async () => {
    // An account from before confirmation was required still has a session; it must not accept.
    const email = uniqueEmail('unconfirmed');
    const person = await signUp(ctx.app, 'Una Confirmed', email);
    await ctx.db.update(user).set({ emailVerified: false }).where(eq(user.id, person.id));
    const invitationId = await invite(email, 'owner');
    const accept = await person.agent.post('/api/auth/organization/accept-invitation').send({ invitationId });
    expect(accept.status).toBe(403);
    expect(accept.body.code).toBe('EMAIL_VERIFICATION_REQUIRED_BEFORE_ACCEPTING_OR_REJECTING_INVITATION');
    expect((await person.agent.get('/api/me')).body.teams).toEqual([]);
  });

  it('the owner of the address confirms through the link, which signs them in, and can then accept', async () => {
    const email = uniqueEmail('rightful');
    const invitationId = await invite(email, 'engineer');
    const person = agentFor();
    await person
      .post('/api/auth/sign-up/email')
      .send({ name: 'Rightful Person', email, password: testPassword, callbackURL: `/invitation/${invitationId}` })
      .expect(200);
    const link = new URL(await verificationLink(email));
    expect(link.searchParams.get('callbackURL')).toBe(`/invitation/${invitationId}`);
    const opened = await person.get(link.pathname + link.search);
    expect(opened.status).toBe(302);
    expect(opened.headers.location).toBe(`/invitation/${invitationId}`);
    await person.post('/api/auth/organization/accept-invitation').send({ invitationId }).expect(200);
    expect((await person.get('/api/me')).body.teams).toEqual([
      expect.objectContaining({ id: teamId, role: 'engineer' }),
    ]);
  });

  it('a forged or tampered confirmation link confirms nothing', async () => {
    const email = uniqueEmail('tampered');
    await agentFor().post('/api/auth/sign-up/email').send({ name: 'Tam Pered', email, password: testPassword });
    const link = new URL(await verificationLink(email));
    const token = link.searchParams.get('token')!;
    const forged = await agentFor().get(`/api/auth/verify-email?token=${token.slice(0, -4)}abcd`);
    expect(forged.status).toBeGreaterThanOrEqual(400);
    expect(cookieOf(forged).some((c) => c.includes('session_token'))).toBe(false);
    const [row] = await ctx.db.select().from(user).where(eq(user.email, email));
    expect(row.emailVerified).toBe(false);
  });
});

describe('finding out who has an account (finding 11)', () => {
  it('sign-up answers a known address exactly as a new one, and mails the known address’s owner instead', async () => {
    const known = await signUp(ctx.app, 'Known Person');
    const confirmations = async () =>
      (await mailsTo(known.email)).filter((m) => m.subject.startsWith('Confirm')).length;
    expect(await confirmations()).toBe(1);
    const fresh = uniqueEmail('fresh');
    const a = await agentFor()
      .post('/api/auth/sign-up/email')
      .send({ name: 'X', email: known.email, password: testPassword });
    const b = await agentFor()
      .post('/api/auth/sign-up/email')
      .send({ name: 'X', email: fresh, password: testPassword });
    expect(a.status).toBe(b.status);
    expect(Object.keys(a.body).sort()).toEqual(Object.keys(b.body).sort());
    expect(Object.keys(a.body.user).sort()).toEqual(Object.keys(b.body.user).sort());
    expect(a.body.token).toBeNull();
    expect(cookieOf(a)).toEqual(cookieOf(b));
    // The known account's owner hears about it; their password still works, nothing was changed.
    const warned = await waitForMail(known.email, /tried to create a Cyclemoot account/);
    expect(warned.text).toContain('Nothing was changed');
    expect(await confirmations()).toBe(1);
    await agentFor().post('/api/auth/sign-in/email').send({ email: known.email, password: testPassword }).expect(200);
  });
});
