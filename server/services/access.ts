import { and, eq } from 'drizzle-orm';

import type { Database } from '@/db/client';
import { review, teamMember } from '@/db/schema';
import { primaryRole, roleAllows, type Permission, type TeamRole } from '@/server/contracts/roles';
import { ApiError } from '@/server/http/errors';

export type TeamAccess = { teamId: string; role: TeamRole; memberId: string };

const uuidPattern = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/**
 * Access to a Team's data, decided in one place for every route and socket handler.
 * The one place that decides whether a user may touch a team's data. A user who is not a
 * member gets 404 (the team's data does not exist for them); a member whose role lacks
 * `permission` gets 403.
 */
export async function requireTeam(
  db: Database,
  userId: string,
  teamId: string,
  permission?: Permission,
): Promise<TeamAccess> {
  const [row] = await db
    .select({ id: teamMember.id, role: teamMember.role })
    .from(teamMember)
    .where(and(eq(teamMember.organizationId, teamId), eq(teamMember.userId, userId)))
    .limit(1);
  if (!row) throw ApiError.notFound('The Team');
  const role = primaryRole(row.role);
  if (!role) throw ApiError.forbidden(`Your role "${row.role}" is not one of this product's roles.`);
  if (permission && !roleAllows(role, permission)) throw ApiError.forbidden();
  return { teamId, role, memberId: row.id };
}

/**
 * Loads a review and checks the user's membership of its team, as `requireTeam` does, in one
 * query (the review and the user's membership row together).
 */
export async function requireReview(
  db: Database,
  userId: string,
  reviewId: string,
  permission?: Permission,
): Promise<TeamAccess> {
  if (!uuidPattern.test(reviewId)) throw ApiError.notFound('The Review');
  const [row] = await db
    .select({ teamId: review.teamId, memberId: teamMember.id, role: teamMember.role })
    .from(review)
    .leftJoin(teamMember, and(eq(teamMember.organizationId, review.teamId), eq(teamMember.userId, userId)))
    .where(eq(review.id, reviewId))
    .limit(1);
  // Outsiders learn nothing: a review of a team they are not in is simply not found.
  if (!row || !row.memberId || row.role === null) throw ApiError.notFound('The Review');
  const role = primaryRole(row.role);
  if (!role) throw ApiError.forbidden(`Your role "${row.role}" is not one of this product's roles.`);
  if (permission && !roleAllows(role, permission)) throw ApiError.forbidden();
  return { teamId: row.teamId, role, memberId: row.memberId };
}

/** The members of a Review's Team now, with their roles: who its room may tell, and how. */
export async function reviewListeners(db: Database, reviewId: string): Promise<Map<string, TeamRole>> {
  const rows = await db
    .select({ userId: teamMember.userId, role: teamMember.role })
    .from(review)
    .innerJoin(teamMember, eq(teamMember.organizationId, review.teamId))
    .where(eq(review.id, reviewId));
  const listeners = new Map<string, TeamRole>();
  for (const row of rows) {
    const role = primaryRole(row.role);
    if (role) listeners.set(row.userId, role);
  }
  return listeners;
}

/** The user ids of a Team's members now (a room is told news only while one is a member). */
export async function teamMemberIds(db: Database, teamId: string): Promise<Set<string>> {
  const rows = await db
    .select({ userId: teamMember.userId })
    .from(teamMember)
    .where(eq(teamMember.organizationId, teamId));
  return new Set(rows.map((r) => r.userId));
}
