import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';

import { eq } from 'drizzle-orm';
import { migrate } from 'drizzle-orm/node-postgres/migrator';
import { Client, type DatabaseError } from 'pg';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';

import { createDatabase } from '@/db/client';
import { isTeamOwnerRuleViolation } from '@/db/constraints';
import { invitation, member, organization } from '@/db/schema';
import { migrateDatabase } from '@/server/ops/migrate';
import { repoRoot } from '@/server/ops/paths';
import { ensureCluster, ensureDatabase } from '@/server/ops/postgres';

import { createTeam, createTestApp, signUp, type TestUser } from '../helpers/api';
import { uniqueEmail } from '../helpers/test-server';

const ctx = createTestApp();
const query = (text: string, values: unknown[] = []) => ctx.db.$client.query(text, values);

// A race shows only in some runs: without the rule, 6 to 10 of these 10 fresh Teams per attack
// ended without an Owner.
const runs = 10;
const ourRoles = ['owner', 'lead', 'engineer', 'reviewer', 'observer'];

let ada: TestUser;
let bo: TestUser;
let lee: TestUser;

beforeAll(async () => {
  ada = await signUp(ctx.app, 'Ada Owner');
  bo = await signUp(ctx.app, 'Bo Owner');
  lee = await signUp(ctx.app, 'Lee Lead');
});
afterAll(() => ctx.close());

async function membersOf(teamId: string): Promise<Array<{ id: string; userId: string; role: string }>> {
  const { rows } = await query(
    'select id, user_id as "userId", role from member where organization_id = $1 order by role, id',
    [teamId],
  );
  return rows;
}

async function memberId(teamId: string, who: TestUser): Promise<string> {
  const found = (await membersOf(teamId)).find((m) => m.userId === who.id);
  if (!found) throw new Error(`${who.name} is not in Team ${teamId}`);
  return found.id;
}

const rolesIn = async (teamId: string) => (await membersOf(teamId)).map((m) => m.role).sort();

/** The error the database answered with; fails the test when it accepted the change. */
async function refusal(change: Promise<unknown>): Promise<DatabaseError> {
  try {
    await change;
  } catch (error) {
    return error as DatabaseError;
  }
  throw new Error('the database accepted the change');
}

const demote = (by: TestUser, teamId: string, memberId: string) =>
  by.agent.post('/api/auth/organization/update-member-role').send({ memberId, role: 'lead', organizationId: teamId });
const leave = (by: TestUser, teamId: string) =>
  by.agent.post('/api/auth/organization/leave').send({ organizationId: teamId });
const remove = (by: TestUser, teamId: string, memberId: string) =>
  by.agent.post('/api/auth/organization/remove-member').send({ memberIdOrEmail: memberId, organizationId: teamId });

type Attack = (team: { teamId: string; adaMember: string; boMember: string }) => Array<PromiseLike<{ status: number }>>;

// Each pair passes better-auth's own checks when sent alone to a Team of two Owners; only both
// together would leave the Team without one.
const attacks: Array<[string, Attack]> = [
  [
    'two Owners demote each other at the same moment',
    ({ teamId, adaMember, boMember }) => [demote(ada, teamId, boMember), demote(bo, teamId, adaMember)],
  ],
  ['two Owners leave at the same moment', ({ teamId }) => [leave(ada, teamId), leave(bo, teamId)]],
  [
    'an Owner demotes themself while the other Owner removes themself',
    ({ teamId, adaMember, boMember }) => [demote(ada, teamId, adaMember), remove(bo, teamId, boMember)],
  ],
  [
    'an Owner removes the other Owner while being demoted by them',
    ({ teamId, adaMember, boMember }) => [remove(ada, teamId, boMember), demote(bo, teamId, adaMember)],
  ],
];

describe('a Team keeps an Owner through better-auth', () => {
  it.each(attacks)('refuses the last of: %s', async (_title, attack) => {
    const outcomes = [];
    for (let run = 0; run < runs; run++) {
      const teamId = await createTeam(ctx, ada, [{ user: bo, role: 'owner' }]);
      const team = { teamId, adaMember: await memberId(teamId, ada), boMember: await memberId(teamId, bo) };
      const responses = await Promise.all(attack(team));
      outcomes.push({ run, statuses: responses.map((r) => r.status), roles: await rolesIn(teamId) });
    }
    expect(
      outcomes.filter((o) => !o.roles.includes('owner')),
      'runs that left the Team without an Owner',
    ).toEqual([]);
    expect(
      outcomes.filter((o) => !o.statuses.some((s) => s >= 400)),
      'runs in which both changes went through',
    ).toEqual([]);
  });

  it('still refuses a sole Owner who demotes themself, leaves or removes themself', async () => {
    const teamId = await createTeam(ctx, ada, [{ user: lee, role: 'lead' }]);
    const own = await memberId(teamId, ada);
    for (const res of [await demote(ada, teamId, own), await leave(ada, teamId), await remove(ada, teamId, own)]) {
      expect(res.status).toBeGreaterThanOrEqual(400);
      expect(res.status).toBeLessThan(500);
    }
    expect(await rolesIn(teamId)).toEqual(['lead', 'owner']);
  });

  it('still lets an Owner delete the whole Team, its members and invitations with it', async () => {
    const teamId = await createTeam(ctx, ada, [
      { user: bo, role: 'owner' },
      { user: lee, role: 'lead' },
    ]);
    const invited = await ada.agent
      .post('/api/auth/organization/invite-member')
      .send({ email: uniqueEmail('invitee'), role: 'engineer', organizationId: teamId });
    expect(invited.status).toBe(200);

    const res = await ada.agent.post('/api/auth/organization/delete').send({ organizationId: teamId });
    expect(res.status).toBe(200);
    const left = await query(
      `select (select count(*) from organization where id = $1)::int as teams,
              (select count(*) from member where organization_id = $1)::int as members,
              (select count(*) from invitation where organization_id = $1)::int as invitations`,
      [teamId],
    );
    expect(left.rows[0]).toEqual({ teams: 0, members: 0, invitations: 0 });
  });
});

describe('a Team keeps an Owner in the database itself', () => {
  it('refuses demoting the last Owner with the error isTeamOwnerRuleViolation recognises', async () => {
    const teamId = await createTeam(ctx, ada, [{ user: lee, role: 'lead' }]);
    const own = await memberId(teamId, ada);

    const error = await refusal(query(`update member set role = 'lead' where id = $1`, [own]));
    expect(error).toMatchObject({
      code: '23514',
      constraint: 'team_keeps_an_owner',
      message: 'A Team must keep at least one Owner.',
    });
    expect(isTeamOwnerRuleViolation(error)).toBe(true);
    // Drizzle wraps the pg error; the one it wraps is in the cause chain.
    const wrapped = await refusal(ctx.db.update(member).set({ role: 'lead' }).where(eq(member.id, own)));
    expect(wrapped).not.toBe(error);
    expect(isTeamOwnerRuleViolation(wrapped)).toBe(true);
    expect(await rolesIn(teamId)).toEqual(['lead', 'owner']);
  });

  it('refuses deleting the last Owner, and emptying a Team without deleting it', async () => {
    const teamId = await createTeam(ctx, ada, [{ user: lee, role: 'lead' }]);
    const own = await memberId(teamId, ada);
    expect(isTeamOwnerRuleViolation(await refusal(query('delete from member where id = $1', [own])))).toBe(true);
    expect(
      isTeamOwnerRuleViolation(await refusal(query('delete from member where organization_id = $1', [teamId]))),
    ).toBe(true);
    expect(await rolesIn(teamId)).toEqual(['lead', 'owner']);
  });

  it('lets a Team be deleted both ways: the Team row first, or its members first in one transaction', async () => {
    const cascaded = await createTeam(ctx, ada, [{ user: bo, role: 'owner' }]);
    await query('delete from organization where id = $1', [cascaded]);
    expect(await membersOf(cascaded)).toEqual([]);

    // better-auth's order: members, invitations, then the Team.
    const membersFirst = await createTeam(ctx, ada, [{ user: bo, role: 'owner' }]);
    await ctx.db.transaction(async (tx) => {
      await tx.delete(member).where(eq(member.organizationId, membersFirst));
      await tx.delete(invitation).where(eq(invitation.organizationId, membersFirst));
      await tx.delete(organization).where(eq(organization.id, membersFirst));
    });
    expect(await membersOf(membersFirst)).toEqual([]);
  });

  it('lets one transaction hand the Team to another Owner in either order', async () => {
    const teamId = await createTeam(ctx, ada, [{ user: lee, role: 'lead' }]);
    const [own, lees] = [await memberId(teamId, ada), await memberId(teamId, lee)];
    await ctx.db.transaction(async (tx) => {
      await tx.update(member).set({ role: 'lead' }).where(eq(member.id, own));
      await tx.update(member).set({ role: 'owner' }).where(eq(member.id, lees));
    });
    expect((await membersOf(teamId)).find((m) => m.role === 'owner')?.userId).toBe(lee.id);
  });

  it('refuses moving a membership to another Team, which would take an Owner away unseen', async () => {
    const from = await createTeam(ctx, ada, [{ user: bo, role: 'owner' }]);
    const to = await createTeam(ctx, lee);
    const error = await refusal(
      query('update member set organization_id = $1 where id = $2', [to, await memberId(from, ada)]),
    );
    expect(error).toMatchObject({ code: '23514', constraint: 'member_stays_in_its_team' });
    expect(await rolesIn(from)).toEqual(['owner', 'owner']);
  });

  it('makes a concurrent last change wait for the first, then sees it committed and refuses', async () => {
    const teamId = await createTeam(ctx, ada, [{ user: bo, role: 'owner' }]);
    const [adaMember, boMember] = [await memberId(teamId, ada), await memberId(teamId, bo)];
    const first = new Client({ connectionString: inject('databaseUrl') });
    const second = new Client({ connectionString: inject('databaseUrl') });
    await Promise.all([first.connect(), second.connect()]);
    try {
      await first.query('begin');
      await first.query(`update member set role = 'lead' where id = $1`, [boMember]);
      // Runs the commit-time check now: it passes (Ada is still an Owner) and holds the Team's lock.
      await first.query('set constraints team_keeps_an_owner immediate');

      await second.query('begin');
      await second.query(`update member set role = 'lead' where id = $1`, [adaMember]);
      const {
        rows: [{ pid }],
      } = await second.query<{ pid: number }>('select pg_backend_pid() as pid');
      const secondCommit = second.query('commit').then(
        () => undefined,
        (error: unknown) => error,
      );
      // The second check must be waiting for the first's lock, not have run past it.
      for (let waited = 0; ; waited += 20) {
        const { rows } = await query('select wait_event_type from pg_stat_activity where pid = $1', [pid]);
        if (rows[0]?.wait_event_type === 'Lock') break;
        if (waited > 5_000) throw new Error(`the second commit never waited: ${JSON.stringify(rows)}`);
        await new Promise((resolve) => setTimeout(resolve, 20));
      }
      await first.query('commit');

      expect(isTeamOwnerRuleViolation(await secondCommit)).toBe(true);
      expect(await rolesIn(teamId)).toEqual(['lead', 'owner']);
      expect((await membersOf(teamId)).find((m) => m.role === 'owner')?.id).toBe(adaMember);
    } finally {
      await Promise.all([first.end(), second.end()]);
    }
  });
});

describe('isTeamOwnerRuleViolation', () => {
  it('is false for other refusals and for things that are not errors', async () => {
    const teamId = await createTeam(ctx, ada, [{ user: lee, role: 'lead' }]);
    const otherCheck = await refusal(
      query(`update member set role = 'admin' where id = $1`, [await memberId(teamId, lee)]),
    );
    expect(otherCheck).toMatchObject({ code: '23514', constraint: 'member_role_is_ours' });
    const duplicate = await refusal(query(`update "user" set email = $1 where id = $2`, [ada.email, bo.id]));
    expect(duplicate).toMatchObject({ code: '23505' });

    const looping: { cause?: unknown } = new Error('loops');
    looping.cause = looping;
    for (const notIt of [otherCheck, duplicate, new Error('team_keeps_an_owner'), looping, null, undefined, '23514']) {
      expect(isTeamOwnerRuleViolation(notIt)).toBe(false);
    }
  });

  it('finds the rule deep in a cause chain', async () => {
    const teamId = await createTeam(ctx, ada);
    const error = await refusal(query('delete from member where organization_id = $1', [teamId]));
    const deep = new Error('better-auth', { cause: new Error('adapter', { cause: error }) });
    expect(isTeamOwnerRuleViolation(deep)).toBe(true);
  });
});

describe('roles outside ours', () => {
  // ["observer","owner"] is what better-auth stores as "observer,owner".
  const foreignRoles = ['observer,owner', 'observer, owner', 'admin', 'member', 'Owner', ' owner', ''];

  it.each(foreignRoles)('cannot store %j as a member role, by update or insert', async (role) => {
    const teamId = await createTeam(ctx, ada, [{ user: lee, role: 'lead' }]);
    const updated = await refusal(
      query('update member set role = $1 where id = $2', [role, await memberId(teamId, lee)]),
    );
    expect(updated).toMatchObject({ code: '23514', constraint: 'member_role_is_ours' });
    const inserted = await refusal(
      query('insert into member (organization_id, user_id, role, created_at) values ($1, $2, $3, now())', [
        teamId,
        bo.id,
        role,
      ]),
    );
    expect(inserted).toMatchObject({ code: '23514', constraint: 'member_role_is_ours' });
    expect(await rolesIn(teamId)).toEqual(['lead', 'owner']);
  });

  it.each([...foreignRoles, null])('cannot store %j as an invitation role', async (role) => {
    const teamId = await createTeam(ctx, ada);
    const error = await refusal(
      query(
        `insert into invitation (organization_id, email, role, status, expires_at, inviter_id)
         values ($1, $2, $3, 'pending', now() + interval '1 day', $4)`,
        [teamId, uniqueEmail('foreign'), role, ada.id],
      ),
    );
    expect(error).toMatchObject({ code: '23514', constraint: 'invitation_role_is_ours' });
  });

  it('does not let an Owner invite as ["observer","owner"] or give better-auth\'s "admin"', async () => {
    const teamId = await createTeam(ctx, ada, [{ user: lee, role: 'lead' }]);
    const email = uniqueEmail('hidden-owner');
    for (const role of [['observer', 'owner'], 'observer,owner', 'admin']) {
      const invited = await ada.agent
        .post('/api/auth/organization/invite-member')
        .send({ email, role, organizationId: teamId });
      expect(invited.status, JSON.stringify(role)).toBeGreaterThanOrEqual(400);
      const updated = await ada.agent
        .post('/api/auth/organization/update-member-role')
        .send({ memberId: await memberId(teamId, lee), role, organizationId: teamId });
      expect(updated.status, JSON.stringify(role)).toBeGreaterThanOrEqual(400);
    }
    expect((await query('select role from invitation where organization_id = $1', [teamId])).rows).toEqual([]);
    expect(await rolesIn(teamId)).toEqual(['lead', 'owner']);
  });
});

describe('the migration that brings these rules', () => {
  let url: string;

  beforeAll(async () => {
    url = await ensureDatabase(await ensureCluster(), `cyclemoot_${inject('runId')}_roles`, { fresh: true });
    // The schema as it was before this migration, holding rows a deployment may have written.
    const before = mkdtempSync(path.join(tmpdir(), 'cyclemoot-migrations-'));
    try {
      const committed = path.join(repoRoot, 'db', 'migrations');
      const journal = JSON.parse(readFileSync(path.join(committed, 'meta', '_journal.json'), 'utf8'));
      mkdirSync(path.join(before, 'meta'));
      writeFileSync(
        path.join(before, 'meta', '_journal.json'),
        JSON.stringify({ ...journal, entries: [journal.entries[0]] }),
      );
      writeFileSync(path.join(before, '0000_initial.sql'), readFileSync(path.join(committed, '0000_initial.sql')));
      const db = createDatabase(url, 1);
      try {
        await migrate(db, { migrationsFolder: before });
      } finally {
        await db.$client.end();
      }
    } finally {
      rmSync(before, { recursive: true, force: true });
    }
  });

  it('makes existing roles ours, the first when it is ours, else Observer, and keeps every Team an Owner', async () => {
    const old = new Client({ connectionString: url });
    await old.connect();
    try {
      const users: string[] = [];
      for (const name of ['Una', 'Vic', 'Wen', 'Xia']) {
        const { rows } = await old.query(`insert into "user" (name, email) values ($1, $2) returning id`, [
          name,
          uniqueEmail(name.toLowerCase()),
        ]);
        users.push(rows[0].id);
      }
      const team = async (slug: string, roles: Array<string | null>) => {
        const { rows } = await old.query(
          `insert into organization (name, slug, created_at) values ($1, $1, now()) returning id`,
          [slug],
        );
        for (const [i, role] of roles.entries()) {
          await old.query(
            `insert into member (organization_id, user_id, role, created_at)
             values ($1, $2, $3, now() + make_interval(secs => $4))`,
            [rows[0].id, users[i], role, i],
          );
        }
        return rows[0].id as string;
      };
      const mixed = await team('mixed', ['owner', 'observer,owner', 'admin', 'engineer, reviewer']);
      // Its only Owner hid behind another first role: taking the first alone would orphan the Team.
      const hidden = await team('hidden', ['member', 'lead,owner']);
      const twoHidden = await team('two-hidden', ['lead,owner', 'reviewer, owner']);
      for (const role of ['observer,owner', 'admin', null, 'lead', ' engineer,owner']) {
        await old.query(
          `insert into invitation (organization_id, email, role, status, expires_at, inviter_id)
           values ($1, $2, $3, 'pending', now() + interval '1 day', $4)`,
          [mixed, uniqueEmail('old'), role, users[0]],
        );
      }

      await migrateDatabase(url);

      const rolesOf = async (teamId: string) =>
        (await old.query('select role from member where organization_id = $1 order by created_at', [teamId])).rows.map(
          (r) => r.role,
        );
      expect(await rolesOf(mixed)).toEqual(['owner', 'observer', 'observer', 'engineer']);
      expect(await rolesOf(hidden)).toEqual(['observer', 'owner']);
      expect(await rolesOf(twoHidden)).toEqual(['owner', 'reviewer']);
      const invited = await old.query('select role from invitation where organization_id = $1', [mixed]);
      expect(invited.rows.map((r) => r.role).sort()).toEqual(['engineer', 'lead', 'observer', 'observer', 'observer']);
      for (const { role } of (await old.query('select role from member union select role from invitation')).rows) {
        expect(ourRoles).toContain(role);
      }
      // And the rule holds from the first change on.
      const error = await refusal(old.query(`update member set role = 'lead' where organization_id = $1`, [hidden]));
      expect(isTeamOwnerRuleViolation(error)).toBe(true);
    } finally {
      await old.end();
    }
  });
});
