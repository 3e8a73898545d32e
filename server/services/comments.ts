import { and, asc, count, eq, inArray } from 'drizzle-orm';

import type { Database, Reader } from '@/db/client';
import { candidate, comment, review, teamMember, user } from '@/db/schema';
import type { Comment } from '@/server/contracts/board';
import { ApiError } from '@/server/http/errors';

import { recordActivity } from './activity';
import type { Broadcast } from './broadcast';
import { reviewOf } from './reviews';

export type CommentContext = { db: Database; broadcast: Broadcast; actorId: string };

const uuidPattern = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

type Member = { id: string; name: string };

const wordCharacter = /[\p{L}\p{N}_]/u;

/**
 * The members an `@Name` in `body` points at, by user id, in the order first named. A name
 * matches without regard to letter case and must end where a word ends; where several
 * members' names follow the same `@` (Ana, Ana Lima), the longest wins. An `@` inside a word
 * (an e-mail address) names nobody.
 */
export function resolveMentions(body: string, members: Member[]): string[] {
  const names = members
    .map((m) => ({ id: m.id, name: m.name.trim().toLowerCase() }))
    .filter((m) => m.name.length > 0)
    .sort((a, b) => b.name.length - a.name.length);
  const text = body.toLowerCase();
  const found: string[] = [];
  for (let at = text.indexOf('@'); at !== -1; at = text.indexOf('@', at + 1)) {
    if (at > 0 && (wordCharacter.test(text[at - 1]) || text[at - 1] === '.')) continue;
    const rest = text.slice(at + 1);
    const match = names.find((m) => rest.startsWith(m.name) && !wordCharacter.test(rest.charAt(m.name.length)));
    if (match && !found.includes(match.id)) found.push(match.id);
  }
  return found;
}

/** The people of a Review's Team, by name: whom a comment may @mention. */
export async function listMentionable(db: Reader, reviewId: string): Promise<Member[]> {
  const rows = await db
    .select({ id: user.id, name: user.name })
    .from(review)
    .innerJoin(teamMember, eq(teamMember.organizationId, review.teamId))
    .innerJoin(user, eq(user.id, teamMember.userId))
    .where(eq(review.id, reviewId));
  return rows.sort((a, b) => a.name.localeCompare(b.name) || a.id.localeCompare(b.id));
}

function selectComments(db: Reader) {
  return db
    .select({
      id: comment.id,
      reviewId: comment.reviewId,
      candidateId: comment.candidateId,
      parentId: comment.parentId,
      body: comment.body,
      mentions: comment.mentions,
      clientId: comment.clientId,
      createdAt: comment.createdAt,
      authorId: user.id,
      authorName: user.name,
    })
    .from(comment)
    .leftJoin(user, eq(user.id, comment.authorId));
}

type Row = Awaited<ReturnType<typeof selectComments>>[number];

function toComment(r: Row): Comment {
  return {
    id: r.id,
    reviewId: r.reviewId,
    candidateId: r.candidateId,
    parentId: r.parentId,
    body: r.body,
    author: r.authorId ? { id: r.authorId, name: r.authorName ?? '' } : null,
    mentions: r.mentions,
    clientId: r.clientId,
    createdAt: r.createdAt.toISOString(),
  };
}

async function findCandidate(db: Reader, reviewId: string, candidateId: string) {
  if (!uuidPattern.test(candidateId)) return undefined;
  const [row] = await db
    .select({ id: candidate.id, name: candidate.name })
    .from(candidate)
    .where(and(eq(candidate.id, candidateId), eq(candidate.reviewId, reviewId)))
    .limit(1);
  return row;
}

/** A review's comments oldest first, all of them or those on one candidate (404 for another review's). */
export async function listComments(db: Database, reviewId: string, candidateId?: string): Promise<Comment[]> {
  if (candidateId !== undefined && !(await findCandidate(db, reviewId, candidateId))) {
    throw ApiError.notFound('The Candidate');
  }
  const where = candidateId
    ? and(eq(comment.reviewId, reviewId), eq(comment.candidateId, candidateId))
    : eq(comment.reviewId, reviewId);
  const rows = await selectComments(db).where(where).orderBy(asc(comment.createdAt), asc(comment.id));
  return rows.map(toComment);
}

/** Comments per candidate id, and under `review` those on the review itself (replies counted). */
export async function commentCounts(db: Database, reviewId: string): Promise<Record<string, number>> {
  const rows = await db
    .select({ candidateId: comment.candidateId, n: count() })
    .from(comment)
    .where(eq(comment.reviewId, reviewId))
    .groupBy(comment.candidateId);
  return Object.fromEntries(rows.map((r) => [r.candidateId ?? 'review', r.n]));
}

/** Someone a new comment @mentioned, to be told by e-mail (never the author). */
export type MentionNotice = {
  to: { email: string; name: string };
  author: string;
  reviewId: string;
  reviewName: string;
  candidateName: string | null;
  body: string;
};

export type PostedComment = {
  comment: Comment;
  /** False when this was a retry of a comment already stored (same author and clientId). */
  created: boolean;
  mentionNotices: MentionNotice[];
};

/**
 * Stores a comment on the review or one of its candidates, or a reply to a top-level comment
 * on the same one (a reply without `candidateId` takes its parent's). A retried post (same
 * author and `clientId`) is stored once: the insert does nothing on that key and the stored
 * comment is returned, with nothing told or mailed again.
 */
export async function postComment(
  { db, broadcast, actorId }: CommentContext,
  reviewId: string,
  input: { body: string; candidateId?: string | null; parentId?: string | null; clientId: string },
): Promise<PostedComment> {
  const outcome = await db.transaction(async (tx) => {
    const target = await reviewOf(tx, reviewId);

    let candidateId = input.candidateId ?? null;
    if (input.parentId) {
      const parent = uuidPattern.test(input.parentId)
        ? (
            await tx
              .select({ id: comment.id, parentId: comment.parentId, candidateId: comment.candidateId })
              .from(comment)
              .where(and(eq(comment.id, input.parentId), eq(comment.reviewId, reviewId)))
              .limit(1)
          )[0]
        : undefined;
      if (!parent) throw ApiError.invalidField('parentId', 'No comment of this Review has this id.');
      if (parent.parentId !== null) {
        throw ApiError.invalidField('parentId', 'Replies go one level deep: answer the comment this one replies to.');
      }
      if (input.candidateId === undefined) candidateId = parent.candidateId;
      else if (candidateId !== parent.candidateId) {
        throw ApiError.invalidField(
          'parentId',
          'A reply stays with its comment: on the same candidate, or the review.',
        );
      }
    }
    let candidateName: string | null = null;
    if (candidateId !== null) {
      const found = await findCandidate(tx, reviewId, candidateId);
      if (!found) throw ApiError.invalidField('candidateId', 'No candidate of this Review has this id.');
      candidateName = found.name;
    }

    const members = await listMentionable(tx, reviewId);
    const mentions = resolveMentions(input.body, members);
    const [inserted] = await tx
      .insert(comment)
      .values({
        reviewId,
        candidateId,
        parentId: input.parentId ?? null,
        authorId: actorId,
        body: input.body,
        mentions,
        clientId: input.clientId,
      })
      .onConflictDoNothing({ target: [comment.reviewId, comment.authorId, comment.clientId] })
      .returning({ id: comment.id });
    const where = inserted
      ? eq(comment.id, inserted.id)
      : and(eq(comment.reviewId, reviewId), eq(comment.authorId, actorId), eq(comment.clientId, input.clientId));
    const [row] = await selectComments(tx).where(where).limit(1);
    if (!inserted) return { comment: toComment(row), created: false, mentions: [] as string[], target, candidateName };

    await recordActivity(tx, {
      teamId: target.teamId,
      reviewId,
      actorId,
      kind: 'comment:posted',
      detail: { reviewName: target.name, candidateName, reply: input.parentId ? true : false },
    });
    return { comment: toComment(row), created: true, mentions, target, candidateName };
  });

  if (!outcome.created) return { comment: outcome.comment, created: false, mentionNotices: [] };
  broadcast.toReview(reviewId, 'comment:posted', { comment: outcome.comment });

  const others = outcome.mentions.filter((id) => id !== actorId);
  const people = others.length
    ? await db.select({ id: user.id, email: user.email, name: user.name }).from(user).where(inArray(user.id, others))
    : [];
  const byId = new Map(people.map((p) => [p.id, p]));
  const mentionNotices = others.flatMap((id) => {
    const person = byId.get(id);
    if (!person) return [];
    return [
      {
        to: { email: person.email, name: person.name },
        author: outcome.comment.author?.name ?? '',
        reviewId,
        reviewName: outcome.target.name,
        candidateName: outcome.candidateName,
        body: outcome.comment.body,
      },
    ];
  });
  return { comment: outcome.comment, created: true, mentionNotices };
}
