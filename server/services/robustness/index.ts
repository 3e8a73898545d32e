import { createHash } from 'node:crypto';
import { setMaxListeners } from 'node:events';
import { availableParallelism } from 'node:os';
import path from 'node:path';

import { and, asc, desc, eq, inArray, lt, sql } from 'drizzle-orm';
import { Piscina } from 'piscina';

import type { Database } from '@/db/client';
import { candidate, robustnessRun, siteYear, user } from '@/db/schema';
import { DEFAULT_FIRED_HOURS_PER_YEAR } from '@/server/contracts/board';
import { evaluateRequestSchema } from '@/server/contracts/cycle';
import {
  defaultUncertainty,
  robustnessMethod,
  type Band,
  type Robustness,
  type StartRunInput,
  type Uncertainty,
} from '@/server/contracts/robustness';
import { violatedUnique } from '@/server/http/database-errors';
import { ApiError } from '@/server/http/errors';

import { recordActivity } from '../activity';
import type { Broadcast } from '../broadcast';
import { listCandidates } from '../candidates';
import { coreOf, readBasis, toDesignBasis } from '../design-basis';
import { marksOf, type Mark } from '../matrix';
import { reviewOf } from '../reviews';
import { getSiteYear } from '../site-year';
import type { DrawCandidate, DrawJob, DrawPartial } from './draws';

/**
 * The robustness check of a review's ranking: a seeded Monte Carlo run in a worker pool
 * (piscina), off the request thread. Progress goes to the room as chunks finish; the Lead (or
 * Owner) cancels it from any server process (the run's row says so, the running process reads
 * it at each chunk); the result is stored with the fingerprint of its inputs.
 */

export type RobustnessContext = { db: Database; broadcast: Broadcast; actorId: string };

/** A running row not touched for this long was cut short (its process stopped). */
const heartbeatStaleMs = 60_000;
const progressEveryMs = 200;

let pool: Piscina | null = null;

function workerPool(): Piscina {
  if (!pool) {
    const tsx = process.execArgv.some((a) => a.includes('tsx'));
    pool = new Piscina({
      filename: path.join(__dirname, 'worker.ts'),
      // One core stays with the requests: a board GET answers while a run goes on.
      maxThreads: Math.max(1, availableParallelism() - 1),
      minThreads: 0,
      idleTimeout: 30_000,
      execArgv: tsx ? process.execArgv : [...process.execArgv, '--import', 'tsx'],
    });
  }
  return pool;
}

/** The runs this process is executing: cancelled here at once, elsewhere through the row. */
const running = new Map<string, AbortController>();

/** Ends this process's runs (marked failed) and the pool; part of the server's close. */
export async function closeRobustness(db: Database) {
  const ids = [...running.keys()];
  for (const c of running.values()) c.abort();
  if (ids.length)
    await db
      .update(robustnessRun)
      .set({ status: 'failed', message: 'The server stopped during the run.', finishedAt: sql`now()` })
      .where(inArray(robustnessRun.id, ids))
      .catch(() => {});
  const p = pool;
  pool = null;
  await p?.destroy();
}

type Inputs = {
  job: Omit<DrawJob, 'seed' | 'from' | 'to' | 'uncertainty'>;
  fingerprint: string;
  ids: string[];
};

/** Everything a run needs from the database, and the fingerprint of it. */
export async function gatherInputs(db: Database, reviewId: string): Promise<Inputs> {
  const [basisRow, candidates, marks, profileRows] = await Promise.all([
    readBasis(db, reviewId),
    listCandidates(db, reviewId),
    marksOf(db, reviewId),
    db.select().from(siteYear).where(eq(siteYear.reviewId, reviewId)).limit(1),
  ]);
  const basis = toDesignBasis(basisRow, new Date(0).toISOString());
  const core = basisRow ? coreOf(basisRow) : null;
  const firedHoursPerYear = core?.firedHoursPerYear ?? DEFAULT_FIRED_HOURS_PER_YEAR;
  const profile = profileRows[0] ?? null;
  const computed = candidates.filter((c) => c.results !== null);
  const year = profile ? await getSiteYear(db, reviewId) : null;

  const drawCandidates: DrawCandidate[] = [];
  for (const c of computed) {
    const parsed = evaluateRequestSchema.safeParse(c.input);
    if (!parsed.success) continue;
    const compressor = (c.input as { compressor?: { intercoolTemperatureK?: unknown } }).compressor;
    drawCandidates.push({
      id: c.id,
      input: parsed.data,
      ownIntercoolTemperature: typeof compressor?.intercoolTemperatureK === 'number',
      yearFuelTonnes: year?.candidates.find((y) => y.candidateId === c.id)?.annual?.fuelTonnes ?? null,
    });
  }
  const ids = drawCandidates.map((c) => c.id);
  const criteria = basis.criteria.map((c) => ({ id: c.id, weight: c.weight, measure: c.measure ?? null }));
  const scorers = new Set(marks.filter((m) => ids.includes(m.candidateId)).map((m) => m.userId)).size;
  const grid = criteria.map((k) =>
    ids.map((id) => marks.filter((m) => m.candidateId === id && m.criterionId === k.id).map((m) => m.score)),
  );

  let drawProfile: DrawJob['profile'] = null;
  if (profile) {
    const cols = profile.columns;
    const cumulative = new Float64Array(cols.temperatureK.length);
    let sum = 0;
    cols.temperatureK.forEach((_, i) => {
      sum += cols.weightHours ? cols.weightHours[i]! : 1;
      cumulative[i] = sum;
    });
    drawProfile = {
      temperatureK: Float64Array.from(cols.temperatureK),
      relativeHumidity: Float64Array.from(cols.relativeHumidity),
      pressureKPa: cols.pressureKPa ? Float64Array.from(cols.pressureKPa) : null,
      cumulativeHours: cumulative,
    };
  }

  return {
    job: { candidates: drawCandidates, criteria, marks: grid, scorers, firedHoursPerYear, profile: drawProfile },
    fingerprint: fingerprintOf(basis.revision, candidates, marks, profile?.updatedAt ?? null),
    ids,
  };
}

/** What a run's result rests on: the basis, each candidate's revision, the marks, the profile. */
function fingerprintOf(
  basisRevision: number,
  candidates: Array<{ id: string; revision: number }>,
  marks: Mark[],
  profileUpdatedAt: Date | null,
): string {
  return createHash('sha256')
    .update(
      JSON.stringify({
        basis: basisRevision,
        candidates: candidates.map((c) => [c.id, c.revision]),
        marks: marks.map((m) => [m.candidateId, m.criterionId, m.userId, m.score]).sort(),
        profile: profileUpdatedAt ? profileUpdatedAt.toISOString() : null,
      }),
    )
    .digest('hex');
}

/**
 * The fingerprint of the review's inputs as they are now, from only what it hashes (no results,
 * no profile columns, no site year), for telling whether a stored run is stale.
 */
async function currentFingerprint(db: Database, reviewId: string): Promise<string> {
  const [basisRow, candidates, marks, [profile]] = await Promise.all([
    readBasis(db, reviewId),
    // The order of listCandidates, which gatherInputs hashes.
    db
      .select({ id: candidate.id, revision: candidate.revision })
      .from(candidate)
      .where(eq(candidate.reviewId, reviewId))
      .orderBy(asc(candidate.position), asc(candidate.createdAt)),
    marksOf(db, reviewId),
    db.select({ updatedAt: siteYear.updatedAt }).from(siteYear).where(eq(siteYear.reviewId, reviewId)).limit(1),
  ]);
  const basis = toDesignBasis(basisRow, new Date(0).toISOString());
  return fingerprintOf(basis.revision, candidates, marks, profile?.updatedAt ?? null);
}

/** Interrupted runs (their process stopped) no longer hold the review's one running slot. */
async function clearInterrupted(db: Database, reviewId: string) {
  await db
    .update(robustnessRun)
    .set({ status: 'failed', message: 'The run was interrupted (its server stopped).', finishedAt: sql`now()` })
    .where(
      and(
        eq(robustnessRun.reviewId, reviewId),
        inArray(robustnessRun.status, ['running', 'cancelling']),
        lt(robustnessRun.heartbeatAt, sql`now() - make_interval(secs => ${heartbeatStaleMs / 1000})`),
      ),
    );
}

/** POST /api/reviews/:reviewId/robustness: starts a run, answers its id at once. */
export async function startRun(
  { db, broadcast, actorId }: RobustnessContext,
  reviewId: string,
  input: StartRunInput,
): Promise<{ runId: string }> {
  const uncertainty: Uncertainty = input.uncertainty ?? defaultUncertainty;
  const inputs = await gatherInputs(db, reviewId);
  if (inputs.ids.length < 2)
    throw new ApiError(409, 'conflict', 'The robustness check needs at least two computed candidates to rank.');
  await clearInterrupted(db, reviewId);
  let runId: string;
  try {
    runId = await db.transaction(async (tx) => {
      const target = await reviewOf(tx, reviewId);
      const [row] = await tx
        .insert(robustnessRun)
        .values({
          reviewId,
          status: 'running',
          samples: input.samples,
          seed: input.seed,
          uncertainty,
          fingerprint: inputs.fingerprint,
          startedById: actorId,
        })
        .returning({ id: robustnessRun.id });
      await recordActivity(tx, {
        teamId: target.teamId,
        reviewId,
        actorId,
        kind: 'robustness:started',
        detail: { reviewName: target.name, samples: input.samples, seed: input.seed },
      });
      return row!.id;
    });
  } catch (error) {
    if (violatedUnique(error) === 'robustness_one_running_key')
      throw new ApiError(409, 'conflict', 'A robustness check of this review is already running; wait or cancel it.');
    throw error;
  }
  void execute({ db, broadcast, actorId }, reviewId, runId, inputs, input.samples, input.seed, uncertainty);
  return { runId };
}

function chunking(samples: number): Array<[number, number]> {
  const size = Math.max(50, Math.ceil(samples / 40));
  const out: Array<[number, number]> = [];
  for (let from = 0; from < samples; from += size) out.push([from, Math.min(samples, from + size)]);
  return out;
}

async function execute(
  { db, broadcast, actorId }: RobustnessContext,
  reviewId: string,
  runId: string,
  inputs: Inputs,
  samples: number,
  seed: number,
  uncertainty: Uncertainty,
) {
  const controller = new AbortController();
  // One listener per chunk in the pool's queue.
  setMaxListeners(200, controller.signal);
  running.set(runId, controller);
  const parts: DrawPartial[] = [];
  let done = 0;
  let lastTick = 0;
  let cancelled = false;
  const tick = async (force = false) => {
    const now = Date.now();
    if (!force && now - lastTick < progressEveryMs) return;
    lastTick = now;
    const [row] = await db
      .update(robustnessRun)
      .set({ done, heartbeatAt: sql`now()` })
      .where(eq(robustnessRun.id, runId))
      .returning({ status: robustnessRun.status });
    if (row?.status === 'cancelling') {
      cancelled = true;
      controller.abort();
      return;
    }
    broadcast.toReview(reviewId, 'robustness:progress', { reviewId, runId, done, total: samples });
  };
  try {
    const p = workerPool();
    await Promise.all(
      chunking(samples).map(async ([from, to]) => {
        const job: DrawJob = { ...inputs.job, seed, from, to, uncertainty };
        const part = (await p.run(job, { signal: controller.signal })) as DrawPartial;
        parts.push(part);
        done += to - from;
        await tick(done === samples);
      }),
    );
    const result = merge(inputs.ids, parts, samples);
    await db.transaction(async (tx) => {
      const target = await reviewOf(tx, reviewId);
      await tx
        .update(robustnessRun)
        .set({ status: 'done', done: samples, result, finishedAt: sql`now()`, heartbeatAt: sql`now()` })
        .where(eq(robustnessRun.id, runId));
      await recordActivity(tx, {
        teamId: target.teamId,
        reviewId,
        actorId,
        kind: 'robustness:finished',
        detail: { reviewName: target.name, samples, seed },
      });
    });
  } catch (error) {
    const aborted = cancelled || controller.signal.aborted;
    await db
      .update(robustnessRun)
      .set(
        aborted
          ? { status: 'cancelled', done, finishedAt: sql`now()` }
          : { status: 'failed', message: 'The run failed on the server.', finishedAt: sql`now()` },
      )
      .where(and(eq(robustnessRun.id, runId), inArray(robustnessRun.status, ['running', 'cancelling'])))
      .catch(() => {});
    if (!aborted) console.error('[robustness] run failed:', error);
  } finally {
    running.delete(runId);
  }
  broadcast.toReview(reviewId, 'robustness:finished', { reviewId, runId });
}

function band(values: number[]): Band | null {
  const v = values.filter(Number.isFinite).sort((a, b) => a - b);
  if (v.length === 0) return null;
  // Linear interpolation between order statistics (the "type 7" quantile).
  const at = (q: number) => {
    const x = q * (v.length - 1);
    const lo = Math.floor(x);
    const hi = Math.min(v.length - 1, lo + 1);
    return v[lo]! + (v[hi]! - v[lo]!) * (x - lo);
  };
  return { p5: at(0.05), p50: at(0.5), p95: at(0.95) };
}

/** The chunks' counts and samples, merged in draw order. */
export function merge(ids: string[], parts: DrawPartial[], samples: number) {
  const n = ids.length;
  const sorted = [...parts].sort((a, b) => a.from - b.from);
  const first = new Float64Array(n);
  const ranks = new Float64Array(n * n);
  const refused = new Int32Array(n);
  let ranked = 0;
  let evaluations = 0;
  const series = ids.map(() => ({ eff: [] as number[], work: [] as number[], fuel: [] as number[] }));
  for (const p of sorted) {
    const count = p.to - p.from;
    ranked += p.ranked;
    evaluations += p.evaluations;
    for (let j = 0; j < n; j++) {
      first[j] += p.firstPlace[j]!;
      refused[j] += p.refused[j]!;
      for (let r = 0; r < n; r++) ranks[j * n + r] += p.rankCounts[j * n + r]!;
      for (let s = 0; s < count; s++) {
        series[j]!.eff.push(p.efficiency[j * count + s]!);
        series[j]!.work.push(p.netWork[j * count + s]!);
        series[j]!.fuel.push(p.annualFuel[j * count + s]!);
      }
    }
  }
  return {
    firstPlace: Object.fromEntries(ids.map((id, j) => [id, ranked > 0 ? first[j]! / ranked : 0])),
    ranks: Object.fromEntries(
      ids.map((id, j) => [id, Array.from({ length: n }, (_, r) => ranks[j * n + r]! / samples)]),
    ),
    bands: Object.fromEntries(
      ids.map((id, j) => [
        id,
        {
          thermalEfficiency: band(series[j]!.eff),
          netWorkKJPerKg: band(series[j]!.work),
          annualFuelTonnes: band(series[j]!.fuel),
        },
      ]),
    ),
    refused: Object.fromEntries(ids.map((id, j) => [id, refused[j]!])),
    evaluations,
  };
}

const none = (stale: boolean): Robustness => ({
  runId: null,
  samples: null,
  seed: null,
  status: 'none',
  done: 0,
  uncertainty: defaultUncertainty,
  firstPlace: null,
  ranks: null,
  bands: null,
  refused: null,
  stale,
  startedBy: null,
  startedAt: null,
  finishedAt: null,
  message: null,
  method: robustnessMethod,
});

/** GET /api/reviews/:reviewId/robustness: the latest run, and whether its inputs have changed. */
export async function getRobustness(db: Database, reviewId: string): Promise<Robustness> {
  const [row] = await db
    .select({ run: robustnessRun, startedByName: user.name })
    .from(robustnessRun)
    .leftJoin(user, eq(user.id, robustnessRun.startedById))
    .where(eq(robustnessRun.reviewId, reviewId))
    .orderBy(desc(robustnessRun.startedAt))
    .limit(1);
  if (!row) return none(false);
  const { run } = row;
  const fingerprint = await currentFingerprint(db, reviewId);
  const result = run.result as ReturnType<typeof merge> | null;
  return {
    runId: run.id,
    samples: run.samples,
    seed: run.seed,
    status: run.status,
    done: run.done,
    uncertainty: { ...defaultUncertainty, ...(run.uncertainty as Partial<Uncertainty>) },
    firstPlace: result?.firstPlace ?? null,
    ranks: result?.ranks ?? null,
    bands: result?.bands ?? null,
    refused: result?.refused ?? null,
    stale: fingerprint !== run.fingerprint,
    startedBy: run.startedById ? { id: run.startedById, name: row.startedByName ?? '' } : null,
    startedAt: run.startedAt.toISOString(),
    finishedAt: run.finishedAt?.toISOString() ?? null,
    message: run.message,
    method: robustnessMethod,
  };
}

/** DELETE /api/reviews/:reviewId/robustness/:runId: cancels a running run (from any process). */
export async function cancelRun({ db }: RobustnessContext, reviewId: string, runId: string): Promise<Robustness> {
  const [row] = await db
    .select({ status: robustnessRun.status })
    .from(robustnessRun)
    .where(and(eq(robustnessRun.id, runId), eq(robustnessRun.reviewId, reviewId)))
    .limit(1);
  if (!row) throw ApiError.notFound('The robustness run');
  if (row.status !== 'running' && row.status !== 'cancelling')
    throw new ApiError(409, 'conflict', `This run is ${row.status}; only a running one can be cancelled.`);
  await db
    .update(robustnessRun)
    .set({ status: 'cancelling' })
    .where(and(eq(robustnessRun.id, runId), eq(robustnessRun.status, 'running')));
  running.get(runId)?.abort();
  return getRobustness(db, reviewId);
}
