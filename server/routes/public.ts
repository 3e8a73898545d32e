import { Router } from 'express';

import type { Database } from '@/db/client';
import { parse } from '@/server/http/errors';
import { invitationParams } from '@/server/http/params';
import { checkDatabase } from '@/server/services/health';
import { getPublicInvitation } from '@/server/services/teams';

/** Routes that answer without a session: health and the invitation preview. */
export function publicRouter({ db }: { db: Database }): Router {
  const router = Router();

  router.get('/health', async (_req, res) => {
    const database = await checkDatabase(db);
    if (!database.ok) res.status(503).setHeader('Retry-After', '5');
    res.json({ status: database.ok ? 'ok' : 'degraded', database });
  });

  router.get('/invitations/:invitationId', async (req, res) => {
    const { invitationId } = parse(invitationParams, req.params);
    res.json(await getPublicInvitation(db, invitationId));
  });

  return router;
}
