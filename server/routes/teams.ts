import { Router } from 'express';

import type { Database } from '@/db/client';
import { parse } from '@/server/http/errors';
import { teamParams } from '@/server/http/params';
import { requireTeam } from '@/server/services/access';
import { listTeamActivity } from '@/server/services/activity';
import { getMe, getTeamDetail } from '@/server/services/teams';

export function teamsRouter({ db }: { db: Database }): Router {
  const router = Router();

  router.get('/me', async (_req, res) => {
    res.json(await getMe(db, res.locals.user));
  });

  router.get('/teams/:teamId', async (req, res) => {
    const { teamId } = parse(teamParams, req.params);
    const access = await requireTeam(db, res.locals.user.id, teamId);
    res.json(await getTeamDetail(db, teamId, access.role));
  });

  router.get('/teams/:teamId/activity', async (req, res) => {
    const { teamId } = parse(teamParams, req.params);
    await requireTeam(db, res.locals.user.id, teamId);
    res.json(await listTeamActivity(db, teamId));
  });

  return router;
}
