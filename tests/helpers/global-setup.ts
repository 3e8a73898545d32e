import type { TestProject } from 'vitest/node';

import { startMailFake, type MailFake } from '@/server/ops/mail-fake';
import { migrateDatabase } from '@/server/ops/migrate';
import { dropTestDatabases, ensureCluster, ensureDatabase } from '@/server/ops/postgres';

import { freePort } from './ports';

let mail: MailFake | undefined;

function isAlive(pid: number) {
  try {
    process.kill(pid, 0);
    return true;
  } catch {
    return false;
  }
}

/**
 * Once per vitest run: the project's Postgres cluster with a fresh `cyclemoot_test`
 * database (never the demo data), migrated, and a mail fake on free loopback ports. The
 * cluster is this checkout's own, on 54329 or, when that is taken, a free port
 * (`ensureCluster`), so a second checkout's run goes beside the first one's.
 */
export default async function setup(project: TestProject) {
  const cluster = await ensureCluster();
  // One database per run (never the demo data); leftovers of runs that were killed are dropped.
  await dropTestDatabases(cluster, (pid) => !isAlive(pid));
  const runId = `t${process.pid}`;
  const databaseUrl = await ensureDatabase(cluster, `cyclemoot_${runId}_main`, { fresh: true });
  await migrateDatabase(databaseUrl);
  // Free ports each run, so two test runs on one machine never trip over each other.
  mail = await startMailFake({ smtpPort: await freePort(), webPort: await freePort() });
  // The cluster's port is its own when 54329 was taken (another checkout's cluster, say).
  console.log(`[test] Postgres on 127.0.0.1:${cluster.port}; mail fake SMTP ${mail.smtpPort}, mailbox ${mail.webURL}`);
  project.provide('databaseUrl', databaseUrl);
  project.provide('runId', runId);
  project.provide('smtpPort', mail.smtpPort);
  project.provide('mailboxURL', mail.webURL);
  return async () => {
    await mail?.stop();
    await dropTestDatabases(cluster, (pid) => pid === process.pid);
  };
}

declare module 'vitest' {
  export interface ProvidedContext {
    databaseUrl: string;
    smtpPort: number;
    mailboxURL: string;
    /** Prefix for extra databases a test file makes: `cyclemoot_<runId>_<name>`. */
    runId: string;
  }
}
