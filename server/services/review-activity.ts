import { and, desc, eq, lt, or } from 'drizzle-orm';

import type { Database } from '@/db/client';
import { activity, user } from '@/db/schema';
import type { Activity, ActivityKind } from '@/server/contracts/team';
import { ApiError } from '@/server/http/errors';

/**
 * One Review's Activity, newest first: every change recorded with its reviewId. `beforeId`
 * (an entry of this review) pages back through the entries older than it.
 */
export async function listReviewActivity(
  db: Database,
  reviewId: string,
  { limit, beforeId }: { limit: number; beforeId?: string },
): Promise<Activity[]> {
  let before: { createdAt: Date; id: string } | undefined;
  if (beforeId !== undefined) {
    const [row] = await db
      .select({ createdAt: activity.createdAt, id: activity.id })
      .from(activity)
      .where(and(eq(activity.id, beforeId), eq(activity.reviewId, reviewId)))
      .limit(1);
    if (!row) throw ApiError.invalidField('before', 'This is not an Activity entry of this Review.');
    before = row;
  }
  const rows = await db
    .select({
      id: activity.id,
      kind: activity.kind,
      reviewId: activity.reviewId,
      detail: activity.detail,
      createdAt: activity.createdAt,
      actorId: user.id,
      actorName: user.name,
    })
    .from(activity)
    .leftJoin(user, eq(user.id, activity.actorId))
    .where(
      and(
        eq(activity.reviewId, reviewId),
        before
          ? or(
              lt(activity.createdAt, before.createdAt),
              and(eq(activity.createdAt, before.createdAt), lt(activity.id, before.id)),
            )
          : undefined,
      ),
    )
    .orderBy(desc(activity.createdAt), desc(activity.id))
    .limit(limit);
  return rows.map((r) => ({
    id: r.id,
    kind: r.kind as ActivityKind,
    reviewId: r.reviewId,
    detail: r.detail,
    createdAt: r.createdAt.toISOString(),
    actor: r.actorId ? { id: r.actorId, name: r.actorName ?? '' } : null,
  }));
}
