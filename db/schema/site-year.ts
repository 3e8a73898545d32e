import { sql } from 'drizzle-orm';
import { check, doublePrecision, integer, jsonb, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';

import { user } from './auth';
import { review } from './review';

/** The hourly ambient columns, one entry per row of the uploaded profile. */
export type SiteYearColumns = {
  temperatureK: number[];
  /** 0–1 */
  relativeHumidity: number[];
  /** kPa; null when the profile gave none (the basis pressure then holds). */
  pressureKPa: number[] | null;
  /** Hours each row stands for; null when every row is one hour. */
  weightHours: number[] | null;
};

/**
 * A review's site year: its hourly ambient profile, stored with the design basis (one per
 * review), as compact columns, and its summary.
 */
export const siteYear = pgTable(
  'site_year',
  {
    reviewId: uuid('review_id')
      .primaryKey()
      .references(() => review.id, { onDelete: 'cascade' }),
    columns: jsonb('columns').$type<SiteYearColumns>().notNull(),
    rows: integer('rows').notNull(),
    /** Hours the profile stands for (8760, 8784, or the sum of its hours column). */
    hours: doublePrecision('hours').notNull(),
    minK: doublePrecision('min_k').notNull(),
    maxK: doublePrecision('max_k').notNull(),
    meanK: doublePrecision('mean_k').notNull(),
    fileName: text('file_name').notNull(),
    uploadedById: text('uploaded_by_id').references(() => user.id, { onDelete: 'set null' }),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [
    check('site_year_rows_check', sql`${table.rows} > 0`),
    check('site_year_hours_check', sql`${table.hours} > 0`),
    check('site_year_range_check', sql`${table.minK} <= ${table.meanK} and ${table.meanK} <= ${table.maxK}`),
  ],
);
