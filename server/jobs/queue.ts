import PgBoss from 'pg-boss';

import type { Mail, Mailer } from '@/server/auth/mailer';

/** The product's background work on its own Postgres (schema `pgboss`), through pg-boss. */

export const mailQueue = 'mail';
export const digestQueue = 'mail-digest';

export type QueueOptions = {
  /** How often an idle worker looks for jobs, seconds (pg-boss: at least 0.5). */
  pollingIntervalSeconds?: number;
  /** A failed send is tried again this many times … */
  retryLimit?: number;
  /** … first after about this many seconds, each wait doubling (with jitter) after that. */
  retryDelaySeconds?: number;
  /** When the daily digest goes out (cron, UTC); every day at 07:00 unless set. */
  digestCron?: string;
};

export const defaultQueueOptions: Required<QueueOptions> = {
  pollingIntervalSeconds: 1,
  retryLimit: 12,
  retryDelaySeconds: 2,
  digestCron: '0 7 * * *',
};

export type JobQueue = {
  boss: PgBoss;
  options: Required<QueueOptions>;
  /** The Mailer every part of the product sends through: `send` enqueues and returns. */
  mailer: Mailer;
  /** Sends the queued mails with `smtp`, one job at a time, retried with back-off on failure. */
  workMail(smtp: Mailer): Promise<void>;
  /** Runs `handler` once a day (the schedule is one for all processes; one worker gets each run). */
  scheduleDigest(handler: () => Promise<void>): Promise<void>;
  stop(): Promise<void>;
};

/**
 * Starts pg-boss on `databaseUrl` (creating or migrating its schema) and makes the mail
 * queue. Two server processes on one database share the queue: pg-boss hands each job to one
 * worker, so a mail is sent once.
 */
export async function startJobQueue(databaseUrl: string, options: QueueOptions = {}): Promise<JobQueue> {
  const o = { ...defaultQueueOptions, ...options };
  const boss = new PgBoss({
    connectionString: databaseUrl,
    schema: 'pgboss',
    application_name: 'cyclemoot-jobs',
    max: 4,
    // Keep a finished job for a week (what was sent, and when) before maintenance drops it.
    deleteAfterDays: 7,
  });
  let lastLogged = 0;
  boss.on('error', (error) => {
    if (Date.now() - lastLogged < 10_000) return;
    lastLogged = Date.now();
    console.error(`[jobs] ${error.message}`);
  });
  await boss.start();
  await ensureQueue(boss, {
    name: mailQueue,
    retryLimit: o.retryLimit,
    retryDelay: o.retryDelaySeconds,
    retryBackoff: true,
    expireInSeconds: 120,
  });
  await ensureQueue(boss, {
    name: digestQueue,
    policy: 'singleton',
    retryLimit: 2,
    retryDelay: 60,
    retryBackoff: true,
  });

  const workers: string[] = [];
  const mailer: Mailer = {
    async send(mail: Mail) {
      await boss.send(mailQueue, mail);
      // A worker of this process looks now instead of at its next poll.
      for (const id of workers) boss.notifyWorker(id);
    },
  };

  return {
    boss,
    options: o,
    mailer,
    async workMail(smtp) {
      const id = await boss.work<Mail>(
        mailQueue,
        { batchSize: 1, pollingIntervalSeconds: o.pollingIntervalSeconds },
        async ([job]) => {
          try {
            await smtp.send(job.data);
          } catch (error) {
            console.error(`[mail] sending "${job.data.subject}" failed; it will be tried again: ${String(error)}`);
            throw error;
          }
        },
      );
      workers.push(id);
    },
    async scheduleDigest(handler) {
      await boss.work(digestQueue, { pollingIntervalSeconds: Math.max(o.pollingIntervalSeconds, 5) }, async () => {
        await handler();
      });
      await boss.schedule(digestQueue, o.digestCron, {}, { tz: 'UTC' });
    },
    async stop() {
      await boss.stop({ graceful: true, timeout: 5_000, wait: true });
    },
  };
}

async function ensureQueue(boss: PgBoss, queue: PgBoss.Queue) {
  const existing = await boss.getQueue(queue.name);
  if (existing) await boss.updateQueue(queue.name, queue);
  else {
    try {
      await boss.createQueue(queue.name, queue);
    } catch (error) {
      // Another process created it at the same moment.
      if (!(await boss.getQueue(queue.name))) throw error;
    }
  }
}
