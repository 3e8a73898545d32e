import { and, desc, eq, lt, or } from 'drizzle-orm';

import type { Database } from '@/db/client';
import { activity } from '@/db/schema';
import type { Activity } from '@/server/contracts/team';
import { ApiError } from '@/server/http/errors';

import { selectActivity, toActivity } from './activity';

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
  const rows = await selectActivity(db)
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
  return rows.map(toActivity);
}
