import express, { type Express } from 'express';
import helmet from 'helmet';

import type { Database } from '@/db/client';
import type { Auth } from '@/server/auth/auth';
import { authGate, type AuthLimits } from '@/server/auth/gate';
import type { Mailer } from '@/server/auth/mailer';
import { apiNotFound, errorHandler, requestId } from '@/server/http/handlers';
import { refuseForeignOrigin } from '@/server/http/origin';
import { requireSession } from '@/server/http/session';
import { serveWebBundle } from '@/server/http/web-bundle';
import { boardRouter } from '@/server/routes/board';
import { commentsRouter } from '@/server/routes/comments';
import { cyclesRouter } from '@/server/routes/cycles';
import { decisionRouter } from '@/server/routes/decision';
import { filesRouter } from '@/server/routes/files';
import { publicRouter } from '@/server/routes/public';
import { reviewActivityRouter } from '@/server/routes/review-activity';
import { reviewsRouter } from '@/server/routes/reviews';
import { robustnessRouter } from '@/server/routes/robustness';
import { roundsRouter } from '@/server/routes/rounds';
import { scoresRouter } from '@/server/routes/scores';
import { settingsRouter } from '@/server/routes/settings';
import { siteYearRouter } from '@/server/routes/site-year';
import { teamsRouter } from '@/server/routes/teams';
import type { Broadcast } from '@/server/services/broadcast';
import { postgresStorage, type FileStorage } from '@/server/storage';

export type AppDeps = {
  db: Database;
  auth: Auth;
  broadcast: Broadcast;
  /** The origin the app is served from; state-changing requests from any other are refused. */
  origin: string;
  /**
   * Express's `trust proxy`: which proxies may say who the client is (X-Forwarded-For).
   * None by default: the address is the socket's, so a client cannot invent one.
   */
  trustProxy?: boolean | number | string;
  authLimits?: AuthLimits;
  /**
   * Sends the product's own mails (a comment's @mentions). Without one (an app built for a
   * test that reads no mail) mentions are still resolved and stored, and nobody is mailed.
   */
  mailer?: Mailer;
  /** Where uploaded files' bytes go (server/storage); the Postgres driver when absent. */
  storage?: FileStorage;
  /** The exported web bundle (dist/); the API alone when absent. */
  webDir?: string;
};

const jsonBodyLimit = '256kb';

const noMail: Mailer = { async send() {} };

/** Builds the Express app; `server/index.ts` listens, tests use it as it is. */
export function createApp({
  db,
  auth,
  broadcast,
  origin,
  trustProxy = false,
  authLimits,
  mailer = noMail,
  storage = postgresStorage(db),
  webDir,
}: AppDeps): Express {
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', trustProxy);
  // The exported web app loads its own scripts only; the default policy would block its inline boot data.
  app.use(helmet({ contentSecurityPolicy: false, crossOriginEmbedderPolicy: false }));
  app.use(requestId);

  app.use('/api', refuseForeignOrigin(origin));
  app.use('/api/auth', authGate({ auth, origin, limits: authLimits }));

  app.use('/api', express.json({ limit: jsonBodyLimit, strict: true }));
  app.use('/api', publicRouter({ db }));
  app.use('/api', requireSession(auth));
  app.use('/api', teamsRouter({ db }));
  app.use('/api', reviewsRouter({ db, broadcast }));
  app.use('/api/cycles', cyclesRouter());
  app.use('/api', roundsRouter({ db, broadcast }));
  app.use('/api', commentsRouter({ db, broadcast, mailer, origin }));
  app.use('/api', settingsRouter({ db }));
  app.use('/api', boardRouter({ db, broadcast }));
  app.use('/api', scoresRouter({ db, broadcast }));
  app.use('/api', filesRouter({ db, broadcast, storage }));
  app.use('/api', decisionRouter({ db, broadcast, mailer, origin }));
  app.use('/api', reviewActivityRouter({ db }));
  app.use('/api', siteYearRouter({ db, broadcast }));
  app.use('/api', robustnessRouter({ db, broadcast }));
  app.use('/api', apiNotFound);

  serveWebBundle(app, webDir);
  app.use((req, res) => {
    res.status(404).type('text/plain').send(`Not found: ${req.path}`);
  });
  app.use(errorHandler);
  return app;
}
