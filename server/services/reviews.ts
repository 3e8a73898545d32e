import { and, asc, desc, eq, sql } from 'drizzle-orm';

import type { Database, Reader } from '@/db/client';
import { review, user } from '@/db/schema';
import type { Review, ReviewStatus } from '@/server/contracts/review';
import type { ActivityKind } from '@/server/contracts/team';
import { violatedUnique } from '@/server/http/database-errors';
import { ApiError } from '@/server/http/errors';

import { recordActivity } from './activity';
import type { Broadcast } from './broadcast';

const columns = {
  id: review.id,
  teamId: review.teamId,
  name: review.name,
  summary: review.summary,
  status: review.status,
  createdAt: review.createdAt,
  updatedAt: review.updatedAt,
  archivedAt: review.archivedAt,
  createdById: user.id,
  createdByName: user.name,
};

function selectReviews(db: Database) {
  return db.select(columns).from(review).leftJoin(user, eq(user.id, review.createdById));
}

type Row = Awaited<ReturnType<typeof selectReviews>>[number];

function toReview(r: Row): Review {
  return {
    id: r.id,
    teamId: r.teamId,
    name: r.name,
    summary: r.summary,
    status: r.status,
    createdAt: r.createdAt.toISOString(),
    updatedAt: r.updatedAt.toISOString(),
    archivedAt: r.archivedAt ? r.archivedAt.toISOString() : null,
    createdBy: r.createdById ? { id: r.createdById, name: r.createdByName ?? '' } : null,
  };
}

export async function getReview(db: Database, reviewId: string): Promise<Review> {
  const [row] = await selectReviews(db).where(eq(review.id, reviewId)).limit(1);
  if (!row) throw ApiError.notFound('The Review');
  return toReview(row);
}

export async function listReviews(db: Database, teamId: string, status: ReviewStatus | 'all'): Promise<Review[]> {
  const where =
    status === 'all' ? eq(review.teamId, teamId) : and(eq(review.teamId, teamId), eq(review.status, status));
  const rows = await selectReviews(db).where(where).orderBy(asc(review.status), desc(review.updatedAt));
  return rows.map(toReview);
}

const isNameTaken = (error: unknown) => violatedUnique(error) === 'review_team_name_key';

/** The Team and name of a Review (for Activity lines), or 404. */
export async function reviewOf(db: Reader, reviewId: string): Promise<{ teamId: string; name: string }> {
  const [row] = await db
    .select({ teamId: review.teamId, name: review.name })
    .from(review)
    .where(eq(review.id, reviewId))
    .limit(1);
  if (!row) throw ApiError.notFound('The Review');
  return row;
}

const nameTaken = (name: string) =>
  new ApiError(409, 'conflict', `A Review named "${name}" already exists in this Team.`, {
    field: 'name',
    fieldErrors: { name: ['This Team already has a Review with this name.'] },
  });

export type ServiceContext = { db: Database; broadcast: Broadcast; actorId: string };

export async function createReview(
  { db, broadcast, actorId }: ServiceContext,
  teamId: string,
  input: { name: string; summary: string },
): Promise<Review> {
  let id: string;
  try {
    id = await db.transaction(async (tx) => {
      const [created] = await tx
        .insert(review)
        .values({ teamId, name: input.name, summary: input.summary, createdById: actorId })
        .returning({ id: review.id });
      await recordActivity(tx, {
        teamId,
        reviewId: created.id,
        actorId,
        kind: 'review:created',
        detail: { name: input.name },
      });
      return created.id;
    });
  } catch (error) {
    if (isNameTaken(error)) throw nameTaken(input.name);
    throw error;
  }
  const created = await getReview(db, id);
  broadcast.toTeam(teamId, 'review:created', { review: created });
  return created;
}

export async function updateReview(
  { db, broadcast, actorId }: ServiceContext,
  reviewId: string,
  input: { name?: string; summary?: string; status?: ReviewStatus },
): Promise<Review> {
  const before = await getReview(db, reviewId);
  const changes: Partial<typeof review.$inferInsert> = {};
  const events: Array<{ kind: ActivityKind; detail: Record<string, unknown> }> = [];
  if (input.name !== undefined && input.name !== before.name) {
    changes.name = input.name;
    events.push({ kind: 'review:renamed', detail: { from: before.name, to: input.name } });
  }
  if (input.summary !== undefined && input.summary !== before.summary) {
    changes.summary = input.summary;
    events.push({ kind: 'review:summary-changed', detail: { name: input.name ?? before.name } });
  }
  if (input.status !== undefined && input.status !== before.status) {
    changes.status = input.status;
    changes.archivedAt = input.status === 'archived' ? new Date() : null;
    events.push({
      kind: input.status === 'archived' ? 'review:archived' : 'review:restored',
      detail: { name: before.name },
    });
  }
  if (events.length === 0) return before;
  try {
    await db.transaction(async (tx) => {
      await tx
        .update(review)
        .set({ ...changes, updatedAt: sql`now()` })
        .where(eq(review.id, reviewId));
      for (const e of events) await recordActivity(tx, { teamId: before.teamId, reviewId, actorId, ...e });
    });
  } catch (error) {
    if (isNameTaken(error)) throw nameTaken(input.name ?? '');
    throw error;
  }
  const after = await getReview(db, reviewId);
  broadcast.toTeam(before.teamId, 'review:updated', { review: after });
  return after;
}
