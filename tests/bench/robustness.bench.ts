/**
 * Robustness benchmark: `npm run bench:robustness`.
 *
 * 1. The work of a run: 2000 draws × the demo review's 5 candidates (10 000 engine
 *    evaluations, with the site year's ambient, weights and scores drawn), on one thread,
 *    as a worker does it. Target ≤ 150 ms.
 * 2. While a run of 20 000 draws goes on in the server's worker pool, board GETs of the same
 *    review keep answering: p50 / p95 of their round trip. Target p95 ≤ 50 ms.
 * Its own database `cyclemoot_bench_robust` with the demo data; prints figures, asserts nothing.
 */
import path from 'node:path';

import { and, asc, eq } from 'drizzle-orm';

import { createDatabase } from '@/db/client';
import { review, team } from '@/db/schema';
import { measuredBest } from '@/server/contracts/matrix';
import { defaultUncertainty } from '@/server/contracts/robustness';
import { startServer } from '@/server/index';
import { startMailFake } from '@/server/ops/mail-fake';
import { migrateDatabase } from '@/server/ops/migrate';
import { stateDir } from '@/server/ops/paths';
import { ensureCluster, ensureDatabase } from '@/server/ops/postgres';
import { demoPassword, demoReviews, demoTeam, isEmpty, seedDemo } from '@/server/ops/seed';
import { gatherInputs } from '@/server/services/robustness';
import { runDraws } from '@/server/services/robustness/draws';
import { freePort } from '@/tests/helpers/ports';

const workTargetMs = 150;
const getTargetP95Ms = 50;

const quantile = (xs: number[], q: number) => {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.min(s.length - 1, Math.floor(q * s.length))]!;
};

async function main() {
  const cluster = await ensureCluster();
  const databaseUrl = await ensureDatabase(cluster, 'cyclemoot_bench_robust');
  await migrateDatabase(databaseUrl);
  const db = createDatabase(databaseUrl, 4);
  if (await isEmpty(db)) await seedDemo(db);
  const [first] = await db
    .select({ id: review.id })
    .from(review)
    .innerJoin(team, eq(team.id, review.teamId))
    .where(and(eq(team.slug, demoTeam.slug), eq(review.name, demoReviews[0]!.name)))
    .orderBy(asc(review.createdAt))
    .limit(1);
  const reviewId = first!.id;

  // 1. The work of 2000 draws on one thread.
  const inputs = await gatherInputs(db, reviewId);
  const n = inputs.ids.length;
  const job = { ...inputs.job, seed: 1, from: 0, to: 2000, uncertainty: defaultUncertainty };
  runDraws({ ...job, to: 200 }, measuredBest); // warm-up
  const times: number[] = [];
  let evaluations = 0;
  for (let i = 0; i < 5; i++) {
    const t0 = performance.now();
    evaluations = runDraws({ ...job, seed: i + 2 }, measuredBest).evaluations;
    times.push(performance.now() - t0);
  }
  const work = quantile(times, 0.5);
  console.log(
    `Robustness: 2000 draws × ${n} candidates (${evaluations} engine evaluations, profile ${inputs.job.profile ? 'yes' : 'no'})`,
  );
  console.log(
    `  work on one thread                  median ${work.toFixed(1)} ms  best ${Math.min(...times).toFixed(1)} ms  target ≤ ${workTargetMs} ms: ${work <= workTargetMs ? 'met' : 'NOT met'}`,
  );
  await db.$client.end();

  // 2. Board GETs while a 20 000-draw run goes on in the worker pool.
  const mail = await startMailFake({
    smtpPort: await freePort(),
    webPort: await freePort(),
    mailDir: path.join(stateDir(), 'bench-mail'),
  });
  const server = await startServer({
    databaseUrl,
    secret: 'bench-robust-secret-0123456789abcdef0123456789',
    smtp: { host: '127.0.0.1', port: mail.smtpPort },
    port: 0,
  });
  try {
    const signIn = await fetch(`${server.url}/api/auth/sign-in/email`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', origin: server.url },
      body: JSON.stringify({ email: 'lead@tindra.example', password: demoPassword }),
    });
    const cookie = signIn.headers
      .getSetCookie()
      .map((c) => c.split(';')[0])
      .join('; ');
    const headers = { cookie, origin: server.url, 'content-type': 'application/json' };
    const get = async () => {
      const t0 = performance.now();
      const res = await fetch(`${server.url}/api/reviews/${reviewId}/board`, { headers });
      await res.arrayBuffer();
      return performance.now() - t0;
    };
    const idle: number[] = [];
    for (let i = 0; i < 40; i++) idle.push(await get());
    const started = performance.now();
    const run = await fetch(`${server.url}/api/reviews/${reviewId}/robustness`, {
      method: 'POST',
      headers,
      body: JSON.stringify({ samples: 20000, seed: 11 }),
    });
    if (run.status !== 202) throw new Error(`run refused: ${run.status} ${await run.text()}`);
    const during: number[] = [];
    let status = 'running';
    while (status === 'running') {
      during.push(await get());
      if (during.length % 10 === 0) {
        const r = (await (await fetch(`${server.url}/api/reviews/${reviewId}/robustness`, { headers })).json()) as {
          status: string;
        };
        status = r.status;
      }
    }
    const runMs = performance.now() - started;
    const p95 = quantile(during, 0.95);
    console.log(
      `  board GET, idle                     p50 ${quantile(idle, 0.5).toFixed(1)} ms  p95 ${quantile(idle, 0.95).toFixed(1)} ms`,
    );
    console.log(
      `  board GET during a 20 000-draw run  p50 ${quantile(during, 0.5).toFixed(1)} ms  p95 ${p95.toFixed(1)} ms  (${during.length} GETs; run ${status} in ${(runMs / 1000).toFixed(1)} s)  target p95 ≤ ${getTargetP95Ms} ms: ${p95 <= getTargetP95Ms ? 'met' : 'NOT met'}`,
    );
  } finally {
    await server.close();
    await mail.stop();
  }
}

main().catch((error) => {
  console.error(error);
  process.exit(1);
});
