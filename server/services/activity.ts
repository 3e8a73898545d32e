import { desc, eq } from 'drizzle-orm';

import type { Database, Tx } from '@/db/client';
import { activity, user } from '@/db/schema';
import type { Activity, ActivityKind } from '@/server/contracts/team';

export type ActivityEntry = {
  teamId: string;
  reviewId?: string | null;
  actorId: string;
  kind: ActivityKind;
  detail?: Record<string, unknown>;
};

/** Writes one activity line; call inside the transaction of the change it records. */
export async function recordActivity(tx: Tx | Database, entry: ActivityEntry) {
  await tx.insert(activity).values({
    teamId: entry.teamId,
    reviewId: entry.reviewId ?? null,
    actorId: entry.actorId,
    kind: entry.kind,
    detail: entry.detail ?? {},
  });
}

/** Activity lines with their actor's name; the caller adds the where, order and limit. */
export function selectActivity(db: Database) {
  return db
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
    .leftJoin(user, eq(user.id, activity.actorId));
}

type Selected = Awaited<ReturnType<typeof selectActivity>>[number];

export function toActivity(r: Selected): Activity {
  return {
    id: r.id,
    kind: r.kind as ActivityKind,
    reviewId: r.reviewId,
    detail: r.detail,
    createdAt: r.createdAt.toISOString(),
    actor: r.actorId ? { id: r.actorId, name: r.actorName ?? '' } : null,
  };
}

export async function listTeamActivity(db: Database, teamId: string, limit = 200): Promise<Activity[]> {
  const rows = await selectActivity(db)
    .where(eq(activity.teamId, teamId))
    .orderBy(desc(activity.createdAt))
    .limit(limit);
  return rows.map(toActivity);
}
