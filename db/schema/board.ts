import { sql } from 'drizzle-orm';
import {
  boolean,
  check,
  foreignKey,
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
import { review } from './review';

/**
 * The live board's tables. Engine inputs and results are stored as JSON exactly as the engine
 * contract has them (server/contracts/cycle.ts, board.ts); the columns here are what is
 * queried or constrained.
 */

/** One per review: site, fuel, power, property model, limits and criteria. */
export const designBasis = pgTable('design_basis', {
  reviewId: uuid('review_id')
    .primaryKey()
    .references(() => review.id, { onDelete: 'cascade' }),
  /** The basis without its criteria, in the engine contract's groups and names. */
  basis: jsonb('basis').$type<Record<string, unknown>>().notNull(),
  criteria: jsonb('criteria').$type<Array<Record<string, unknown>>>().notNull(),
  revision: integer('revision').notNull().default(1),
  updatedById: text('updated_by_id').references(() => user.id, { onDelete: 'set null' }),
  updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
});

/**
 * A cycle alternative. One row revision holds the parameters, the full engine input they
 * make with the basis, and the engine's results (or its field error), together.
 */
export const candidate = pgTable(
  'candidate',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    reviewId: uuid('review_id')
      .notNull()
      .references(() => review.id, { onDelete: 'cascade' }),
    name: text('name').notNull(),
    /** Index into the candidate colour series, kept for life. */
    colourIndex: integer('colour_index').notNull(),
    status: text('status', { enum: ['proposed', 'shortlisted', 'set-aside', 'chosen'] })
      .notNull()
      .default('proposed'),
    preset: text('preset', {
      enum: ['simple', 'regenerative', 'intercooled', 'reheat', 'intercooled-reheat-regenerative'],
    }),
    parameters: jsonb('parameters').$type<Record<string, unknown>>().notNull(),
    input: jsonb('input').$type<Record<string, unknown>>().notNull(),
    results: jsonb('results').$type<Record<string, unknown>>(),
    error: jsonb('error').$type<{ field: string; message: string }>(),
    revision: integer('revision').notNull().default(1),
    position: integer('position').notNull(),
    createdById: text('created_by_id').references(() => user.id, { onDelete: 'set null' }),
    updatedById: text('updated_by_id').references(() => user.id, { onDelete: 'set null' }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [
    uniqueIndex('candidate_review_name_key').on(table.reviewId, sql`lower(${table.name})`),
    uniqueIndex('candidate_review_colour_key').on(table.reviewId, table.colourIndex),
    index('candidate_review_idx').on(table.reviewId, table.position),
    // Either results or an engine error, never both.
    check('candidate_results_or_error', sql`${table.results} is null or ${table.error} is null`),
  ],
);

/** A preference round: the Lead opens it, members spread votes, the Lead closes it. */
export const round = pgTable(
  'preference_round',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    reviewId: uuid('review_id')
      .notNull()
      .references(() => review.id, { onDelete: 'cascade' }),
    number: integer('number').notNull(),
    status: text('status', { enum: ['open', 'closed'] })
      .notNull()
      .default('open'),
    votesPerPerson: integer('votes_per_person').notNull(),
    blind: boolean('blind').notNull(),
    openedById: text('opened_by_id').references(() => user.id, { onDelete: 'set null' }),
    openedAt: timestamp('opened_at', { withTimezone: true }).notNull().defaultNow(),
    closedAt: timestamp('closed_at', { withTimezone: true }),
  },
  (table) => [
    uniqueIndex('round_review_number_key').on(table.reviewId, table.number),
    // One open round per review at a time.
    uniqueIndex('round_one_open_key')
      .on(table.reviewId)
      .where(sql`${table.status} = 'open'`),
    check('round_votes_positive', sql`${table.votesPerPerson} between 1 and 20`),
  ],
);

/** One ballot per person per round, by construction (the primary key). */
export const ballot = pgTable(
  'ballot',
  {
    roundId: uuid('round_id')
      .notNull()
      .references(() => round.id, { onDelete: 'cascade' }),
    userId: text('user_id')
      .notNull()
      .references(() => user.id, { onDelete: 'cascade' }),
    /** { <candidateId>: votes } */
    votes: jsonb('votes').$type<Record<string, number>>().notNull(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [primaryKey({ name: 'ballot_round_user_pk', columns: [table.roundId, table.userId] })],
);

/** A comment on the review, or on one candidate; one level of replies. */
export const comment = pgTable(
  'comment',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    reviewId: uuid('review_id')
      .notNull()
      .references(() => review.id, { onDelete: 'cascade' }),
    candidateId: uuid('candidate_id').references(() => candidate.id, { onDelete: 'cascade' }),
    parentId: uuid('parent_id'),
    authorId: text('author_id').references(() => user.id, { onDelete: 'set null' }),
    body: text('body').notNull(),
    mentions: jsonb('mentions').$type<string[]>().notNull().default([]),
    /** Chosen by the client; a retried post is stored once. */
    clientId: text('client_id').notNull(),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [
    foreignKey({ name: 'comment_parent_fk', columns: [table.parentId], foreignColumns: [table.id] }).onDelete(
      'cascade',
    ),
    uniqueIndex('comment_author_client_key').on(table.reviewId, table.authorId, table.clientId),
    index('comment_review_idx').on(table.reviewId, table.createdAt),
    check('comment_body_length', sql`char_length(${table.body}) between 1 and 5000`),
  ],
);

/**
 * Who is gathering a review's room, and to which candidate: kept in the database so a
 * rejoining client (or another server process) finds the Lead where they are now.
 */
export const liveGathering = pgTable('live_gathering', {
  reviewId: uuid('review_id')
    .primaryKey()
    .references(() => review.id, { onDelete: 'cascade' }),
  candidateId: uuid('candidate_id')
    .notNull()
    .references(() => candidate.id, { onDelete: 'cascade' }),
  byId: text('by_id')
    .notNull()
    .references(() => user.id, { onDelete: 'cascade' }),
  startedAt: timestamp('started_at', { withTimezone: true }).notNull().defaultNow(),
});
