import { Router } from 'express';

import type { Database } from '@/db/client';
import { updateSettingsInput } from '@/server/contracts/settings';
import { parse } from '@/server/http/errors';
import { getSettings, updateSettings } from '@/server/services/settings';

/** The signed-in person's own settings (the unit system), kept with the account. */
export function settingsRouter({ db }: { db: Database }): Router {
  const router = Router();

  router.get('/me/settings', async (_req, res) => {
    res.json(await getSettings(db, res.locals.user.id));
  });

  router.put('/me/settings', async (req, res) => {
    const input = parse(updateSettingsInput, req.body);
    // Access: a person reads and writes only their own settings, by their session.
    res.json(await updateSettings(db, res.locals.user.id, input));
  });

  return router;
}
