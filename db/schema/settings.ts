import { boolean, pgTable, text, timestamp } from 'drizzle-orm/pg-core';

import { user } from './auth';

/** A person's own settings, kept with the account (not per device). */
export const userSetting = pgTable('user_setting', {
  userId: text('user_id')
    .primaryKey()
    .references(() => user.id, { onDelete: 'cascade' }),
  unitSystem: text('unit_system', { enum: ['si', 'us'] })
    .notNull()
    .default('si'),
  /** A daily e-mail of the comments posted in the person's reviews since the last one. */
  dailyDigest: boolean('daily_digest').notNull().default(false),
  digestSentAt: timestamp('digest_sent_at', { withTimezone: true }),
  updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
});
