import { sql } from 'drizzle-orm';
import { Router } from 'express';

import type { Database } from '@/db/client';
import { parse } from '@/server/http/errors';
import { invitationParams } from '@/server/http/params';
import { getPublicInvitation } from '@/server/services/teams';

/** Routes that answer without a session: health and the invitation preview. */
export function publicRouter({ db }: { db: Database }): Router {
  const router = Router();

  router.get('/health', async (_req, res) => {
    const started = performance.now();
    try {
      await db.execute(sql`select 1`);
      res.json({
        status: 'ok',
        database: { ok: true, latencyMs: Math.round((performance.now() - started) * 10) / 10 },
      });
    } catch (error) {
      res.status(503).json({ status: 'degraded', database: { ok: false, message: String((error as Error).message) } });
    }
  });

  router.get('/invitations/:invitationId', async (req, res) => {
    const { invitationId } = parse(invitationParams, req.params);
    res.json(await getPublicInvitation(db, invitationId));
  });

  return router;
}
