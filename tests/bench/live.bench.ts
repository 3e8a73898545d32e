/**
 * Live board benchmark: `npm run bench:live -- --clients N [--edits M]`.
 *
 * N socket.io clients in a process of their own, split over two server processes on one
 * database with the Postgres adapter, all on the first demo review's board. Edits go through
 * the API (PATCH a candidate's parameters: validation, recompute, transaction, Activity, then
 * the broadcast through the adapter), alternating between the two processes; each figure is
 * the time from sending the request to the LAST client's receipt of candidate:recomputed.
 * The floor beside it: bare socket.io (no API, no session) broadcasting a 6 KB payload to the
 * same N clients, on one process and on two with the adapter. Its own database
 * `cyclemoot_bench_live` (dropped at the end), never the demo one. Prints figures and asserts
 * nothing; the target is ≤ 25 ms p95 at 100 clients. `--profile DIR` writes a CPU profile of
 * each server and clients process to DIR (open it in Chrome's DevTools).
 */
import { fork, type ChildProcess } from 'node:child_process';
import path from 'node:path';
import { parseArgs } from 'node:util';

import { and, asc, eq } from 'drizzle-orm';
import { Client } from 'pg';

import { createDatabase } from '@/db/client';
import { candidate, review, team } from '@/db/schema';
import { startMailFake } from '@/server/ops/mail-fake';
import { migrateDatabase } from '@/server/ops/migrate';
import { repoRoot } from '@/server/ops/paths';
import { ensureCluster, ensureDatabase } from '@/server/ops/postgres';
import { demoPassword, demoReviews, demoTeam, demoUsers, seedDemo } from '@/server/ops/seed';
import { freePort } from '@/tests/helpers/ports';

import { clock, type ClientsMessage, type ClientsSetup, type ParentMessage } from './live-shared';

const { values: args } = parseArgs({
  options: {
    clients: { type: 'string', default: '100' },
    edits: { type: 'string', default: '60' },
    floor: { type: 'string', default: '60' },
    // A directory: every server and clients process writes its CPU profile there on exit.
    profile: { type: 'string' },
  },
});
const clients = Number(args.clients);
const edits = Number(args.edits);
const floorRuns = Number(args.floor);
const warmup = 5;
const floorBytes = 6 * 1024;
const targetP95Ms = 25;
const secret = 'bench-live-secret-0123456789abcdef0123456789';
const databaseName = 'cyclemoot_bench_live';

if (!(clients >= 1 && edits >= 1 && floorRuns >= 1)) {
  console.error('Usage: npm run bench:live -- --clients N [--edits M] [--floor R] [--profile DIR]');
  process.exit(2);
}

const children: ChildProcess[] = [];

function start(file: string, env: Record<string, string> = {}): ChildProcess {
  const child = fork(path.join(repoRoot, 'tests', 'bench', file), [], {
    execArgv: ['--import', 'tsx', ...(args.profile ? ['--cpu-prof', `--cpu-prof-dir=${args.profile}`] : [])],
    cwd: repoRoot,
    env: { ...process.env, ...env },
    stdio: ['ignore', 'inherit', 'inherit', 'ipc'],
  });
  children.push(child);
  return child;
}

/** The next message from `child` that `pick` turns into a value. */
function receive<T>(child: ChildProcess, pick: (message: unknown) => T | undefined, what: string, ms = 60_000) {
  return new Promise<T>((resolve, reject) => {
    const timer = setTimeout(() => done(new Error(`no ${what} within ${ms} ms`)), ms);
    const onMessage = (message: unknown) => {
      if (message && typeof message === 'object' && 'failed' in message) {
        return done(new Error(`${what}: ${(message as { failed: string }).failed}`));
      }
      const value = pick(message);
      if (value !== undefined) done(undefined, value);
    };
    const onExit = (code: number | null) => done(new Error(`a bench process exited (${code}) before ${what}`));
    function done(error?: Error, value?: T) {
      clearTimeout(timer);
      child.off('message', onMessage);
      child.off('exit', onExit);
      if (error) reject(error);
      else resolve(value as T);
    }
    child.on('message', onMessage);
    child.once('exit', onExit);
  });
}

async function startServers(mode: 'product' | 'bare' | 'bare-adapter', count: number, env: Record<string, string>) {
  return Promise.all(
    Array.from({ length: count }, async () => {
      const child = start('live-server.ts', { ...env, BENCH_MODE: mode });
      const url = await receive(child, (m) => (m as { url?: string }).url, 'a server URL');
      return { child, url };
    }),
  );
}

/** Last receipts by key, as the clients process reports them; `lastAt(key)` waits for one. */
function receipts(child: ChildProcess) {
  const seen = new Map<number, { lastAt: number; bytes: number }>();
  const waiting = new Map<number, (r: { lastAt: number; bytes: number }) => void>();
  child.on('message', (message: ClientsMessage) => {
    if (!('all' in message)) return;
    const r = { lastAt: message.lastAt, bytes: message.bytes };
    const waiter = waiting.get(message.key);
    if (waiter) {
      waiting.delete(message.key);
      waiter(r);
    } else seen.set(message.key, r);
  });
  return (key: number, ms = 10_000) =>
    new Promise<{ lastAt: number; bytes: number }>((resolve, reject) => {
      const got = seen.get(key);
      if (got) {
        seen.delete(key);
        return resolve(got);
      }
      const timer = setTimeout(() => reject(new Error(`not every client heard ${key} within ${ms} ms`)), ms);
      waiting.set(key, (r) => {
        clearTimeout(timer);
        resolve(r);
      });
    });
}

async function startClients(setup: ClientsSetup) {
  const child = start('live-clients.ts');
  const lastAt = receipts(child);
  child.send(setup);
  const { connectMs } = await receive(
    child,
    (m) => ((m as { ready?: true }).ready ? (m as { connectMs: number }) : undefined),
    `${setup.clients} clients on the board`,
    180_000,
  );
  return { child, lastAt, connectMs };
}

const stopAll = async (list: ChildProcess[]) => {
  await Promise.all(
    list.map(
      (child) =>
        new Promise<void>((resolve) => {
          if (child.exitCode !== null) return resolve();
          child.once('exit', () => resolve());
          child.send({ stop: true });
          setTimeout(() => child.kill('SIGKILL'), 5_000).unref();
        }),
    ),
  );
};

const settle = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

function percentiles(samples: number[]) {
  const sorted = [...samples].sort((a, b) => a - b);
  const at = (q: number) => sorted[Math.min(sorted.length - 1, Math.ceil(q * sorted.length) - 1)];
  return { p50: at(0.5), p95: at(0.95), max: sorted[sorted.length - 1], n: sorted.length };
}

const ms = (v: number) => v.toFixed(1).padStart(6);
const line = (label: string, samples: number[]) => {
  const p = percentiles(samples);
  return `  ${label.padEnd(58)} p50 ${ms(p.p50)}  p95 ${ms(p.p95)}  max ${ms(p.max)} ms  (${p.n} runs)`;
};

/** Bare socket.io: `servers` processes (with the adapter when more than one), N clients, 6 KB broadcasts. */
async function floor(mode: 'bare' | 'bare-adapter', count: number, databaseUrl: string) {
  const servers = await startServers(mode, count, { BENCH_DATABASE_URL: databaseUrl });
  const crowd = await startClients({ urls: servers.map((s) => s.url), cookies: [], reviewId: null, clients });
  await settle(mode === 'bare-adapter' ? 2_500 : 300); // the adapters find each other by heartbeat
  const samples: number[] = [];
  for (let i = 0; i < warmup + floorRuns; i++) {
    const key = -(i + 1);
    const from = servers[i % servers.length].child;
    const sent = receive(
      from,
      (m) => ((m as { key?: number }).key === key ? (m as { sentAt: number }) : undefined),
      'sent',
    );
    from.send({ floor: { key, bytes: floorBytes } } satisfies ParentMessage);
    const [{ sentAt }, { lastAt }] = await Promise.all([sent, crowd.lastAt(key)]);
    if (i >= warmup) samples.push(lastAt - sentAt);
    await settle(20);
  }
  await stopAll([crowd.child, ...servers.map((s) => s.child)]);
  return samples;
}

async function signIn(baseURL: string, email: string): Promise<string> {
  const res = await fetch(`${baseURL}/api/auth/sign-in/email`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', origin: baseURL },
    body: JSON.stringify({ email, password: demoPassword }),
  });
  if (!res.ok) throw new Error(`Sign-in as ${email} failed: ${res.status} ${await res.text()}`);
  return res.headers
    .getSetCookie()
    .map((c) => c.split(';')[0])
    .join('; ');
}

async function main() {
  const cluster = await ensureCluster();
  const databaseUrl = await ensureDatabase(cluster, databaseName, { fresh: true });
  await migrateDatabase(databaseUrl);
  const db = createDatabase(databaseUrl, 2);
  const mail = await startMailFake({ smtpPort: await freePort(), webPort: await freePort() });
  try {
    await seedDemo(db);
    const [{ reviewId }] = await db
      .select({ reviewId: review.id })
      .from(review)
      .innerJoin(team, eq(team.id, review.teamId))
      .where(and(eq(team.slug, demoTeam.slug), eq(review.name, demoReviews[0].name)));

    console.log(`Live board: ${clients} clients in a separate process, 6 KB floor payload, ${edits} edits.`);
    const floorOne = await floor('bare', 1, databaseUrl);
    console.log(line('floor: bare socket.io, one process', floorOne));
    const floorTwo = await floor('bare-adapter', 2, databaseUrl);
    console.log(line('floor: bare socket.io, two processes + Postgres adapter', floorTwo));

    const servers = await startServers('product', 2, {
      BENCH_DATABASE_URL: databaseUrl,
      BENCH_SECRET: secret,
      BENCH_SMTP_PORT: String(mail.smtpPort),
    });
    const cookies = await Promise.all(demoUsers.map((u) => signIn(servers[0].url, u.email)));
    const lead = cookies[demoUsers.findIndex((u) => u.role === 'lead')];

    // A candidate to edit: the seed's first, or one made through the API.
    let [target] = await db
      .select({ id: candidate.id })
      .from(candidate)
      .where(eq(candidate.reviewId, reviewId))
      .orderBy(asc(candidate.position))
      .limit(1);
    if (!target) {
      const res = await fetch(`${servers[0].url}/api/reviews/${reviewId}/candidates`, {
        method: 'POST',
        headers: { 'content-type': 'application/json', origin: servers[0].url, cookie: lead },
        body: JSON.stringify({ name: 'Bench simple cycle', preset: 'simple' }),
      });
      if (res.status !== 201) {
        throw new Error(`POST /api/reviews/:reviewId/candidates answered ${res.status}: ${await res.text()}`);
      }
      target = { id: ((await res.json()) as { id: string }).id };
    }

    const crowd = await startClients({ urls: servers.map((s) => s.url), cookies, reviewId, clients });
    console.log(`  (${clients} clients joined the board in ${(crowd.connectMs / 1000).toFixed(1)} s)`);
    await settle(2_500); // presence after the joins, and the heartbeats that tell the processes of each other

    const endToEnd: number[] = [];
    const response: number[] = [];
    let bytes = 0;
    for (let i = 0; i < warmup + edits; i++) {
      const server = servers[i % servers.length];
      const sentAt = clock();
      const res = await fetch(`${server.url}/api/reviews/${reviewId}/candidates/${target.id}`, {
        method: 'PATCH',
        headers: { 'content-type': 'application/json', origin: server.url, cookie: lead },
        body: JSON.stringify({ parameters: { compressor: { pressureRatio: i % 2 ? 16 : 14 } } }),
      });
      const answeredAt = clock();
      if (!res.ok) throw new Error(`PATCH answered ${res.status}: ${await res.text()}`);
      const { revision } = (await res.json()) as { revision: number };
      const heard = await crowd.lastAt(revision);
      if (i >= warmup) {
        endToEnd.push(heard.lastAt - sentAt);
        response.push(answeredAt - sentAt);
      }
      bytes = heard.bytes;
      await settle(20);
    }
    console.log(line('edit via the API → last client (two processes, adapter)', endToEnd));
    console.log(line('  of which the PATCH response', response));
    const p95 = percentiles(endToEnd).p95;
    console.log(
      `  candidate:recomputed payload ${(bytes / 1024).toFixed(1)} KB; target ≤ ${targetP95Ms} ms p95: ` +
        (p95 <= targetP95Ms ? 'met' : 'NOT met'),
    );
    await stopAll([crowd.child, ...servers.map((s) => s.child)]);
  } finally {
    await stopAll(children);
    await db.$client.end();
    await mail.stop();
    const admin = new Client({ connectionString: cluster.url('postgres') });
    await admin.connect();
    await admin.query(`drop database if exists ${databaseName} with (force)`);
    await admin.end();
  }
}

main().catch(async (error: unknown) => {
  console.error('bench:live failed:', error instanceof Error ? error.message : error);
  await stopAll(children);
  process.exit(1);
});
