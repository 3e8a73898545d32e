import { eq, sql } from 'drizzle-orm';

import type { Database } from '@/db/client';
import { userSetting } from '@/db/schema';
import { defaultSettings, type Settings } from '@/server/contracts/settings';

/** The signed-in person's settings; the defaults until they save any. */
export async function getSettings(db: Database, userId: string): Promise<Settings> {
  const [row] = await db
    .select({ unitSystem: userSetting.unitSystem })
    .from(userSetting)
    .where(eq(userSetting.userId, userId))
    .limit(1);
  return row ?? { ...defaultSettings };
}

/** Saves the person's settings (one row per person, written in place). */
export async function updateSettings(db: Database, userId: string, input: Settings): Promise<Settings> {
  const [row] = await db
    .insert(userSetting)
    .values({ userId, unitSystem: input.unitSystem })
    .onConflictDoUpdate({
      target: userSetting.userId,
      set: { unitSystem: input.unitSystem, updatedAt: sql`now()` },
    })
    .returning({ unitSystem: userSetting.unitSystem });
  return row;
}
