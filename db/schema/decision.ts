import { sql } from 'drizzle-orm';
import {
  check,
  customType,
  index,
  integer,
  jsonb,
  pgTable,
  primaryKey,
  text,
  timestamp,
  uniqueIndex,
  uuid,
} from 'drizzle-orm/pg-core';

import { user } from './auth';
import { candidate } from './board';
import { review } from './review';

/**
 * Scoring, the decision record and the review's files. Criteria live in the design basis's
 * JSON (design_basis.criteria), so a score names its criterion by id and the service checks
 * that the id is in the basis.
 */

/** One person's score of one candidate on one criterion (1–5, an optional one-line reason). */
export const score = pgTable(
  'score',
  {
    reviewId: uuid('review_id')
      .notNull()
      .references(() => review.id, { onDelete: 'cascade' }),
    candidateId: uuid('candidate_id')
      .notNull()
      .references(() => candidate.id, { onDelete: 'cascade' }),
    criterionId: text('criterion_id').notNull(),
    userId: text('user_id')
      .notNull()
      .references(() => user.id, { onDelete: 'cascade' }),
    score: integer('score').notNull(),
    reason: text('reason').notNull().default(''),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [
    primaryKey({ columns: [table.candidateId, table.criterionId, table.userId] }),
    index('score_review_idx').on(table.reviewId),
    check('score_between_1_and_5', sql`${table.score} between 1 and 5`),
  ],
);

/**
 * One revision of a review's decision record. Revision 1 is created as a draft; signing
 * freezes it with a snapshot of what it was based on; reopening makes revision n+1 (a draft
 * copied from n). At most one draft per review.
 */
export const decisionRevision = pgTable(
  'decision_revision',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    reviewId: uuid('review_id')
      .notNull()
      .references(() => review.id, { onDelete: 'cascade' }),
    number: integer('number').notNull(),
    status: text('status', { enum: ['draft', 'signed'] })
      .notNull()
      .default('draft'),
    chosenCandidateId: uuid('chosen_candidate_id'),
    rationale: text('rationale').notNull().default(''),
    assumptions: text('assumptions').notNull().default(''),
    /** [{ candidateId, reason }] */
    rejected: jsonb('rejected').$type<Array<{ candidateId: string; reason: string }>>().notNull().default([]),
    /** [{ name, text }] */
    dissent: jsonb('dissent').$type<Array<{ name: string; text: string }>>().notNull().default([]),
    /** [{ text, owner, due }] with due an ISO date */
    actions: jsonb('actions').$type<Array<{ text: string; owner: string; due: string }>>().notNull().default([]),
    /** What the signed record was based on: basis, candidates, results, scores, tallies. */
    snapshot: jsonb('snapshot').$type<Record<string, unknown>>(),
    signedById: text('signed_by_id').references(() => user.id, { onDelete: 'set null' }),
    signedByName: text('signed_by_name'),
    signedAt: timestamp('signed_at', { withTimezone: true }),
    updatedById: text('updated_by_id').references(() => user.id, { onDelete: 'set null' }),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [
    uniqueIndex('decision_review_number_key').on(table.reviewId, table.number),
    uniqueIndex('decision_one_draft_key')
      .on(table.reviewId)
      .where(sql`${table.status} = 'draft'`),
    check(
      'decision_signed_complete',
      sql`${table.status} = 'draft' or (${table.signedAt} is not null and ${table.snapshot} is not null)`,
    ),
  ],
);

const bytea = customType<{ data: Buffer; driverData: Buffer }>({
  dataType: () => 'bytea',
});

/** A file attached to a review or to one of its candidates; the bytes live with a driver. */
export const storedFile = pgTable(
  'stored_file',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    reviewId: uuid('review_id')
      .notNull()
      .references(() => review.id, { onDelete: 'cascade' }),
    candidateId: uuid('candidate_id').references(() => candidate.id, { onDelete: 'set null' }),
    name: text('name').notNull(),
    /** Taken from the content, not the name. */
    contentType: text('content_type').notNull(),
    sizeBytes: integer('size_bytes').notNull(),
    sha256: text('sha256').notNull(),
    /** 'postgres' or 's3': where the bytes are. */
    driver: text('driver', { enum: ['postgres', 's3'] }).notNull(),
    storageKey: text('storage_key').notNull(),
    uploadedById: text('uploaded_by_id').references(() => user.id, { onDelete: 'set null' }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [
    index('stored_file_review_idx').on(table.reviewId, table.createdAt),
    check('stored_file_size', sql`${table.sizeBytes} between 1 and 20971520`),
  ],
);

/** The Postgres storage driver's bytes, one row per stored object. */
export const fileBlob = pgTable('file_blob', {
  storageKey: text('storage_key').primaryKey(),
  bytes: bytea('bytes').notNull(),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
});
