import { z } from 'zod';

/** A person's own settings, kept with the account on the server (the same on every device). */

export const unitSystems = ['si', 'us'] as const;

export const unitSystemField = z.enum(unitSystems, {
  error: 'Unit system must be si (SI) or us (US customary).',
});

export const dailyDigestField = z.boolean({ error: 'Daily digest must be true or false.' });

/** Body of PUT /api/me/settings: any of the settings, at least one. */
export const updateSettingsInput = z
  .strictObject({ unitSystem: unitSystemField.optional(), dailyDigest: dailyDigestField.optional() })
  .refine((input) => input.unitSystem !== undefined || input.dailyDigest !== undefined, {
    path: ['unitSystem'],
    message: 'Send unitSystem (si or us) or dailyDigest (true or false).',
  });
export type UpdateSettingsInput = z.input<typeof updateSettingsInput>;

/**
 * GET and PUT /api/me/settings answer this; SI and no digest until the person chooses
 * otherwise. `dailyDigest`: a mail each morning (07:00 UTC) with the comments others posted
 * in the person's Reviews since the last one.
 */
export const settingsSchema = z.object({ unitSystem: z.enum(unitSystems), dailyDigest: z.boolean() });
export type Settings = z.infer<typeof settingsSchema>;

export const defaultSettings: Settings = { unitSystem: 'si', dailyDigest: false };
