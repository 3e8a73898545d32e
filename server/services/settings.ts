import { eq, sql } from 'drizzle-orm';

import type { Database } from '@/db/client';
import { userSetting } from '@/db/schema';
import { defaultSettings, type Settings } from '@/server/contracts/settings';

const columns = { unitSystem: userSetting.unitSystem, dailyDigest: userSetting.dailyDigest };

/** The signed-in person's settings; the defaults until they save any. */
export async function getSettings(db: Database, userId: string): Promise<Settings> {
  const [row] = await db.select(columns).from(userSetting).where(eq(userSetting.userId, userId)).limit(1);
  return row ?? { ...defaultSettings };
}

/**
 * Saves the settings sent (one row per person, written in place; the others keep their
 * value). Choosing the daily digest starts it from now: the first one holds what comes after.
 */
export async function updateSettings(db: Database, userId: string, input: Partial<Settings>): Promise<Settings> {
  const values = { ...defaultSettings, ...input };
  const set: Record<string, unknown> = { updatedAt: sql`now()` };
  if (input.unitSystem !== undefined) set.unitSystem = input.unitSystem;
  if (input.dailyDigest !== undefined) set.dailyDigest = input.dailyDigest;
  if (input.dailyDigest) set.digestSentAt = sql`coalesce(${userSetting.digestSentAt}, now())`;
  const [row] = await db
    .insert(userSetting)
    .values({ userId, ...values, digestSentAt: values.dailyDigest ? sql`now()` : null })
    .onConflictDoUpdate({ target: userSetting.userId, set })
    .returning(columns);
  return row;
}
