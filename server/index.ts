import { createServer } from 'node:http';
import type { AddressInfo } from 'node:net';

import { createDatabase, type Database } from '@/db/client';
import { attachRealtime, type SocketLimits } from '@/realtime/server';
import { createApp } from '@/server/app';
import { createAuth } from '@/server/auth/auth';
import type { AuthLimits } from '@/server/auth/gate';
import { createSmtpMailer } from '@/server/auth/mailer';
import { startMailJobs } from '@/server/jobs/mail';
import { startJobQueue, type QueueOptions } from '@/server/jobs/queue';
import type { Broadcast } from '@/server/services/broadcast';
import { closeRobustness } from '@/server/services/robustness';
import { storageFromEnv, type FileStorage } from '@/server/storage';

export type ServerConfig = {
  databaseUrl: string;
  secret: string;
  smtp: { host: string; port: number };
  host?: string;
  /** 0 picks a free port (tests). */
  port?: number;
  /** Public origin; defaults to http://<host>:<port>. */
  origin?: string;
  webDir?: string;
  /** Express `trust proxy` (which proxies may name the client); none by default. */
  trustProxy?: boolean | number | string;
  authLimits?: AuthLimits;
  socketLimits?: SocketLimits;
  /** Where uploaded files' bytes go; from CYCLEMOOT_STORAGE (Postgres by default) when absent. */
  storage?: (db: Database) => FileStorage;
  /** The job queue's polling and retry settings (mail). */
  queue?: QueueOptions;
};

export type RunningServer = { url: string; close(): Promise<void> };

/** The only place that listens: HTTP app, better-auth, socket.io and the web bundle on one port. */
export async function startServer(config: ServerConfig): Promise<RunningServer> {
  const host = config.host ?? '127.0.0.1';
  const db = createDatabase(config.databaseUrl);
  // The app needs a broadcaster before socket.io exists; forward to it once attached.
  const target: { current?: Broadcast } = {};
  const broadcast: Broadcast = {
    toTeam: (...args) => target.current?.toTeam(...args),
    toReview: (...args) => target.current?.toReview(...args),
  };

  const httpServer = createServer();
  await new Promise<void>((resolve, reject) => {
    httpServer.once('error', reject);
    httpServer.listen(config.port ?? 8090, host, () => resolve());
  });
  const { port } = httpServer.address() as AddressInfo;
  const origin = config.origin ?? `http://${host}:${port}`;

  // Every mail goes through the job queue: a request only enqueues it, and a worker sends it
  // by SMTP, retrying with back-off while the mail server is away.
  const smtp = createSmtpMailer({ ...config.smtp, from: 'Cyclemoot <no-reply@cyclemoot.test>' });
  const queue = await startJobQueue(config.databaseUrl, config.queue);
  const mailer = await startMailJobs({ db, queue, smtp, origin });
  const storage = config.storage ? config.storage(db) : storageFromEnv(db);
  const auth = createAuth({ db, baseURL: origin, secret: config.secret, mailer });
  const app = createApp({
    db,
    auth,
    broadcast,
    origin,
    trustProxy: config.trustProxy,
    authLimits: config.authLimits,
    mailer,
    storage,
    webDir: config.webDir,
  });
  httpServer.on('request', app);
  const realtime = attachRealtime(httpServer, { db, auth, origin, limits: config.socketLimits });
  target.current = realtime.broadcast;

  return {
    url: origin,
    async close() {
      await new Promise<void>((resolve) => realtime.io.close(() => resolve()));
      httpServer.closeAllConnections();
      await closeRobustness(db);
      await queue.stop();
      await db.$client.end();
    },
  };
}
