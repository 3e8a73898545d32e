import { sql } from 'drizzle-orm';
import { Router } from 'express';

import type { Database } from '@/db/client';
import { parse } from '@/server/http/errors';
import { invitationParams } from '@/server/http/params';
import { getPublicInvitation } from '@/server/services/teams';

/** The health check answers within this even when the database hangs. */
const healthTimeoutMs = 2_000;

/** Routes that answer without a session: health and the invitation preview. */
export function publicRouter({ db }: { db: Database }): Router {
  const router = Router();

  router.get('/health', async (_req, res) => {
    const started = performance.now();
    const check = db.execute(sql`select 1`);
    let timer: NodeJS.Timeout | undefined;
    const timeout = new Promise<never>((_resolve, reject) => {
      timer = setTimeout(() => reject(new Error('timed out')), healthTimeoutMs);
    });
    try {
      await Promise.race([check, timeout]);
      res.json({
        status: 'ok',
        database: { ok: true, latencyMs: Math.round((performance.now() - started) * 10) / 10 },
      });
    } catch {
      // Never the driver's message: it can carry the host, port or user of the database.
      check.catch(() => {});
      res.setHeader('Retry-After', '5');
      res.status(503).json({ status: 'degraded', database: { ok: false, message: 'The database is not reachable.' } });
    } finally {
      clearTimeout(timer);
    }
  });

  router.get('/invitations/:invitationId', async (req, res) => {
    const { invitationId } = parse(invitationParams, req.params);
    res.json(await getPublicInvitation(db, invitationId));
  });

  return router;
}
