import { and, eq } from 'drizzle-orm';

import type { Database } from '@/db/client';
import { member, review } from '@/db/schema';
import { primaryRole, roleAllows, type Permission, type TeamRole } from '@/server/contracts/roles';

import { ApiError } from './errors';

export type TeamAccess = { teamId: string; role: TeamRole; memberId: string };

const uuidPattern = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/**
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
    .select({ id: member.id, role: member.role })
    .from(member)
    .where(and(eq(member.organizationId, teamId), eq(member.userId, userId)))
    .limit(1);
  if (!row) throw ApiError.notFound('The team');
  const role = primaryRole(row.role);
  if (!role) throw ApiError.forbidden(`Your role "${row.role}" is not one of this product's roles.`);
  if (permission && !roleAllows(role, permission)) throw ApiError.forbidden();
  return { teamId, role, memberId: row.id };
}

/** Loads a review and checks the user's membership of its team, as `requireTeam` does. */
export async function requireReview(db: Database, userId: string, reviewId: string, permission?: Permission) {
  if (!uuidPattern.test(reviewId)) throw ApiError.notFound('The review');
  const [row] = await db.select({ teamId: review.teamId }).from(review).where(eq(review.id, reviewId)).limit(1);
  if (!row) throw ApiError.notFound('The review');
  try {
    return await requireTeam(db, userId, row.teamId, permission);
  } catch (error) {
    // Outsiders learn nothing: a review of a team they are not in is simply not found.
    if (error instanceof ApiError && error.status === 404) throw ApiError.notFound('The review');
    throw error;
  }
}
