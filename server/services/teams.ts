import { and, asc, eq, gt } from 'drizzle-orm';

import type { Database } from '@/db/client';
import { invitation, member, organization, user } from '@/db/schema';
import { primaryRole, roleAllows, type TeamRole } from '@/server/contracts/roles';
import type { Me, PublicInvitation, TeamDetail } from '@/server/contracts/team';
import { ApiError } from '@/server/http/errors';

// Anything unknown reads as the least a member can do.
const firstRole = (stored: string | null): TeamRole => primaryRole(stored) ?? 'observer';

export async function getMe(db: Database, me: { id: string; name: string; email: string }): Promise<Me> {
  const rows = await db
    .select({ id: organization.id, name: organization.name, slug: organization.slug, role: member.role })
    .from(member)
    .innerJoin(organization, eq(organization.id, member.organizationId))
    .where(eq(member.userId, me.id))
    .orderBy(asc(organization.name));
  return { user: me, teams: rows.map((r) => ({ ...r, role: firstRole(r.role) })) };
}

export async function getTeamDetail(db: Database, teamId: string, myRole: TeamRole): Promise<TeamDetail> {
  const [team] = await db.select().from(organization).where(eq(organization.id, teamId)).limit(1);
  if (!team) throw ApiError.notFound('The Team');
  const members = await db
    .select({
      memberId: member.id,
      userId: user.id,
      name: user.name,
      email: user.email,
      role: member.role,
      joinedAt: member.createdAt,
    })
    .from(member)
    .innerJoin(user, eq(user.id, member.userId))
    .where(eq(member.organizationId, teamId))
    .orderBy(asc(user.name));
  const mayInvite = roleAllows(myRole, { invitation: ['create'] });
  const mayCancel = roleAllows(myRole, { invitation: ['cancel'] });
  // An invitation's id is what accepting it needs: shown to a role that cannot invite, it let
  // an Observer take an Owner invitation for an address they then signed up with.
  const invitations = !mayInvite
    ? []
    : await db
        .select({
          id: invitation.id,
          email: invitation.email,
          role: invitation.role,
          expiresAt: invitation.expiresAt,
          invitedBy: user.name,
        })
        .from(invitation)
        .leftJoin(user, eq(user.id, invitation.inviterId))
        .where(
          and(
            eq(invitation.organizationId, teamId),
            eq(invitation.status, 'pending'),
            gt(invitation.expiresAt, new Date()),
          ),
        )
        .orderBy(asc(invitation.email));
  return {
    id: team.id,
    name: team.name,
    slug: team.slug,
    myRole,
    members: members.map((m) => ({ ...m, role: firstRole(m.role), joinedAt: m.joinedAt.toISOString() })),
    invitations: invitations
      .map((i) => ({ ...i, role: firstRole(i.role), expiresAt: i.expiresAt.toISOString() }))
      .filter((i) => i.role !== 'owner' || myRole === 'owner')
      .map((i) => (mayCancel ? i : { ...i, id: null })),
  };
}

/** What the holder of an invitation link may see before signing in: the mail told them as much. */
export async function getPublicInvitation(db: Database, id: string): Promise<PublicInvitation> {
  const [row] = await db
    .select({
      id: invitation.id,
      teamName: organization.name,
      email: invitation.email,
      role: invitation.role,
      inviterName: user.name,
      status: invitation.status,
      expiresAt: invitation.expiresAt,
    })
    .from(invitation)
    .innerJoin(organization, eq(organization.id, invitation.organizationId))
    .leftJoin(user, eq(user.id, invitation.inviterId))
    .where(eq(invitation.id, id))
    .limit(1);
  if (!row) throw ApiError.notFound('The invitation');
  const expired = row.status === 'pending' && row.expiresAt.getTime() < Date.now();
  return {
    ...row,
    role: firstRole(row.role),
    status: expired ? 'expired' : (row.status as PublicInvitation['status']),
    expiresAt: row.expiresAt.toISOString(),
  };
}
