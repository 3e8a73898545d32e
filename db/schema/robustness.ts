import { sql } from 'drizzle-orm';
import { check, index, integer, jsonb, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core';

import { user } from './auth';
import { review } from './review';

/**
 * A robustness check of a review's ranking: a seeded Monte Carlo run over the uncertainty it
 * was started with, its progress while it runs and its result when done, kept with the
 * fingerprint of the inputs it came from (a changed candidate, basis, score or profile makes
 * it out of date). One run at a time per review.
 */
export const robustnessRun = pgTable(
  'robustness_run',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    reviewId: uuid('review_id')
      .notNull()
      .references(() => review.id, { onDelete: 'cascade' }),
    status: text('status', { enum: ['running', 'cancelling', 'done', 'cancelled', 'failed'] }).notNull(),
    samples: integer('samples').notNull(),
    seed: integer('seed').notNull(),
    uncertainty: jsonb('uncertainty').$type<Record<string, unknown>>().notNull(),
    /** What the run was computed from: candidate revisions, basis revision, scores, profile. */
    fingerprint: text('fingerprint').notNull(),
    done: integer('done').notNull().default(0),
    result: jsonb('result').$type<Record<string, unknown>>(),
    message: text('message'),
    startedById: text('started_by_id').references(() => user.id, { onDelete: 'set null' }),
    startedAt: timestamp('started_at', { withTimezone: true }).notNull().defaultNow(),
    /** Touched as the run progresses: a running row that stops being touched was interrupted. */
    heartbeatAt: timestamp('heartbeat_at', { withTimezone: true }).notNull().defaultNow(),
    finishedAt: timestamp('finished_at', { withTimezone: true }),
  },
  (table) => [
    index('robustness_run_review_idx').on(table.reviewId, table.startedAt),
    uniqueIndex('robustness_one_running_key')
      .on(table.reviewId)
      .where(sql`${table.status} in ('running', 'cancelling')`),
    check('robustness_samples_range', sql`${table.samples} between 1 and 20000`),
    check('robustness_done_range', sql`${table.done} between 0 and ${table.samples}`),
  ],
);
