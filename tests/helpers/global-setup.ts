import type { TestProject } from 'vitest/node';

import { startMailFake, type MailFake } from '@/server/ops/mail-fake';
import { migrateDatabase } from '@/server/ops/migrate';
import { ensureCluster, ensureDatabase } from '@/server/ops/postgres';

let mail: MailFake | undefined;

/**
 * Once per vitest run: the project's Postgres cluster with a fresh `cyclemoot_test`
 * database (never the demo data), migrated, and a mail fake on its own ports.
 */
export default async function setup(project: TestProject) {
  const cluster = await ensureCluster();
  const databaseUrl = await ensureDatabase(cluster, 'cyclemoot_test', { fresh: true });
  await migrateDatabase(databaseUrl);
  mail = await startMailFake({
    smtpPort: Number(process.env.CYCLEMOOT_TEST_SMTP_PORT ?? 2526),
    webPort: Number(process.env.CYCLEMOOT_TEST_MAIL_PORT ?? 8026),
  });
  project.provide('databaseUrl', databaseUrl);
  project.provide('smtpPort', mail.smtpPort);
  project.provide('mailboxURL', mail.webURL);
  return async () => {
    await mail?.stop();
  };
}

declare module 'vitest' {
  export interface ProvidedContext {
    databaseUrl: string;
    smtpPort: number;
    mailboxURL: string;
  }
}
