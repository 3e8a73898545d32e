import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { createTeam, createTestApp, signUp, type TestUser } from '../helpers/api';
import { uniqueEmail, waitForMail } from '../helpers/test-server';

const ctx = createTestApp();
let owner: TestUser;
let reviewer: TestUser;
let teamId: string;

beforeAll(async () => {
  owner = await signUp(ctx.app, 'Ines Owner');
  reviewer = await signUp(ctx.app, 'Rolf Reviewer');
  teamId = await createTeam(ctx, owner, [{ user: reviewer, role: 'reviewer' }]);
});
afterAll(() => ctx.close());

describe('invitations', () => {
  it('e-mails an invitation link that a new user accepts after signing up', async () => {
    const email = uniqueEmail('newcomer');
    const invite = await owner.agent
      .post('/api/auth/organization/invite-member')
      .send({ email, role: 'engineer', organizationId: teamId });
    expect(invite.status).toBe(200);

    const mail = await waitForMail(email);
    expect(mail.subject).toContain('Ines Owner invited you');
    const link = mail.text.match(/https?:\/\/\S+\/invitation\/([\w-]+)/);
    expect(link).not.toBeNull();
    const invitationId = link![1];
    expect(invitationId).toBe(invite.body.id);

    // The link holder sees who invited whom before signing in.
    const preview = await supertest(ctx.app).get(`/api/invitations/${invitationId}`);
    expect(preview.status).toBe(200);
    expect(preview.body).toMatchObject({ email, role: 'engineer', inviterName: 'Ines Owner', status: 'pending' });

    const { agent } = await signUp(ctx.app, 'New Comer', email);
    const accepted = await agent.post('/api/auth/organization/accept-invitation').send({ invitationId });
    expect(accepted.status).toBe(200);

    const me = await agent.get('/api/me');
    expect(me.body.teams).toEqual([expect.objectContaining({ id: teamId, role: 'engineer' })]);
    const after = await supertest(ctx.app).get(`/api/invitations/${invitationId}`);
    expect(after.body.status).toBe('accepted');
  });

  it('does not let a Reviewer invite anyone', async () => {
    const res = await reviewer.agent
      .post('/api/auth/organization/invite-member')
      .send({ email: uniqueEmail('nobody'), role: 'owner', organizationId: teamId });
    expect(res.status).toBe(403);
  });

  it('does not let someone with another e-mail accept the invitation', async () => {
    const email = uniqueEmail('intended');
    const invite = await owner.agent
      .post('/api/auth/organization/invite-member')
      .send({ email, role: 'observer', organizationId: teamId });
    const stranger = await signUp(ctx.app, 'Sly Stranger');
    const res = await stranger.agent
      .post('/api/auth/organization/accept-invitation')
      .send({ invitationId: invite.body.id });
    expect(res.status).toBeGreaterThanOrEqual(400);
    expect(res.status).toBeLessThan(500);
    expect((await stranger.agent.get('/api/me')).body.teams).toEqual([]);
  });

  it('answers 404 for an unknown invitation', async () => {
    const res = await supertest(ctx.app).get('/api/invitations/not-a-real-id');
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('not_found');
  });

  it('lists pending invitations on the team page', async () => {
    const team = await owner.agent.get(`/api/teams/${teamId}`);
    expect(team.body.invitations.some((i: { role: string }) => i.role === 'observer')).toBe(true);
  });
});
