import { existsSync } from 'node:fs';
import path from 'node:path';

import { createDatabase } from '@/db/client';
import { startServer } from '@/server/index';
import { demoPassword, demoUsers, isEmpty, seedDemo } from '@/server/ops/seed';

import { startMailFake } from './mail-fake';
import { migrateDatabase } from './migrate';
import { stateDir } from './paths';
import { ensureCluster, ensureDatabase } from './postgres';
import { authSecret } from './secrets';
import { ensureWebBuild, webDir } from './web-build';

const port = Number(process.env.PORT ?? 8090);
const smtpPort = Number(process.env.CYCLEMOOT_SMTP_PORT ?? 2525);
const mailWebPort = Number(process.env.CYCLEMOOT_MAIL_PORT ?? 8025);
/** The public origin when served behind a proxy (https://… makes the session cookie Secure). */
const origin = process.env.CYCLEMOOT_ORIGIN || undefined;
/** Which proxy may name the client (Express `trust proxy`: "loopback", an address, a hop count). */
const trustProxy = process.env.CYCLEMOOT_TRUST_PROXY || undefined;

/** `npm start`: database, migrations, demo data, web bundle, mail fake, then the server. */
async function main() {
  const started = Date.now();
  const cluster = await ensureCluster();
  const databaseUrl = await ensureDatabase(cluster, 'cyclemoot');
  await migrateDatabase(databaseUrl);

  const db = createDatabase(databaseUrl, 2);
  if (await isEmpty(db)) {
    await seedDemo(db);
    console.log('[seed] demo team, five members and two reviews written');
  }
  await db.$client.end();

  // A second process (`PORT=8091 npm start` beside a running `npm start`) shares the first
  // one's mail fake instead of starting another on the same ports (it stops with the first),
  // and serves the web bundle the first one serves: rebuilding would empty dist/ under it.
  const running = await runningMailFake(mailWebPort);
  if (running && existsSync(path.join(webDir, 'index.html'))) {
    console.log('[web] another process serves dist/: using it as it is (restart both to rebuild)');
  } else ensureWebBuild();
  const mail = running
    ? { smtpPort, webURL: running, stop: async () => {} }
    : await startMailFake({ smtpPort, webPort: mailWebPort, mailDir: path.join(stateDir(), 'mail') });
  const server = await startServer({
    databaseUrl,
    secret: authSecret(),
    smtp: { host: '127.0.0.1', port: mail.smtpPort },
    port,
    origin,
    trustProxy: trustProxy && /^\d+$/.test(trustProxy) ? Number(trustProxy) : trustProxy,
    webDir,
  });

  const width = Math.max(...demoUsers.map((u) => u.email.length));
  console.log(
    [
      '',
      `Cyclemoot is up at ${server.url}   (ready in ${((Date.now() - started) / 1000).toFixed(1)} s)`,
      `Sent e-mail (the local mail fake): ${mail.webURL}${running ? '   (shared with the process already running)' : ''}`,
      running
        ? 'Another Cyclemoot process runs on this database: the two share rooms through the Postgres adapter.'
        : 'A second process on this database: PORT=8091 npm start (it shares rooms, data and mail with this one).',
      `Ports: app ${port}, Postgres ${cluster.port}, mail SMTP ${mail.smtpPort} (mailbox ${new URL(mail.webURL).port})`,
      `Database: postgres on 127.0.0.1:${cluster.port}, data in ${cluster.dataDir}`,
      '',
      `Demo sign-ins (password for all: ${demoPassword})`,
      ...demoUsers.map((u) => `  ${u.email.padEnd(width)}  ${u.role}`),
      '',
      'Results are concept-stage estimates; detailed design and acceptance follow the applicable codes,',
      "the machine maker's data and licensed engineering practice.",
      'Press Ctrl+C to stop.',
    ].join('\n'),
  );

  let stopping = false;
  const stop = async () => {
    if (stopping) return;
    stopping = true;
    console.log('\nStopping…');
    await server.close().catch(() => {});
    await mail.stop();
    process.exit(0);
  };
  process.on('SIGINT', stop);
  process.on('SIGTERM', stop);
}

/** The mailbox URL when a mail fake already answers on `webPort` (the first process's), else null. */
async function runningMailFake(webPort: number): Promise<string | null> {
  const url = `http://127.0.0.1:${webPort}`;
  try {
    const res = await fetch(`${url}/api/healthz`, { signal: AbortSignal.timeout(1_000) });
    return res.ok ? url : null;
  } catch {
    return null;
  }
}

main().catch((error: Error & { code?: string }) => {
  if (error.code === 'EADDRINUSE') {
    console.error(`\nCyclemoot could not start: port ${port} is taken (another Cyclemoot process?).`);
    console.error('A second process beside a running one takes another port: PORT=8091 npm start');
    process.exit(1);
  }
  console.error(`\nCyclemoot could not start: ${error.message}`);
  process.exit(1);
});
