import { z } from 'zod';

/** A person's own settings, kept with the account on the server (the same on every device). */

export const unitSystems = ['si', 'us'] as const;

export const unitSystemField = z.enum(unitSystems, {
  error: 'Unit system must be si (SI) or us (US customary).',
});

/** Body of PUT /api/me/settings. */
export const updateSettingsInput = z.strictObject({ unitSystem: unitSystemField });
export type UpdateSettingsInput = z.input<typeof updateSettingsInput>;

/** GET and PUT /api/me/settings answer this; SI until the person chooses otherwise. */
export const settingsSchema = z.object({ unitSystem: z.enum(unitSystems) });
export type Settings = z.infer<typeof settingsSchema>;

export const defaultSettings: Settings = { unitSystem: 'si' };
