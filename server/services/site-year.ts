import { eq, sql } from 'drizzle-orm';

import type { Database, Reader } from '@/db/client';
import { siteYear, user, type SiteYearColumns } from '@/db/schema';
import { DEFAULT_FIRED_HOURS_PER_YEAR, type CandidateWire } from '@/server/contracts/board';
import type { CandidateYear, SiteYear, SiteYearSummary } from '@/server/contracts/site-year';
import {
  EngineInputError,
  profileDensities,
  profileSummary,
  siteYear as siteYearOf,
  type AmbientProfile,
  type CycleInput,
} from '@/server/engine';
import { ApiError } from '@/server/http/errors';

import { recordActivity } from './activity';
import type { Broadcast } from './broadcast';
import { listCandidates } from './candidates';
import { coreOf, lockBasis, readBasis } from './design-basis';
import { reviewOf } from './reviews';
import type { ParsedProfile } from './site-year-csv';

/**
 * A review's site year: the stored hourly profile, and each candidate's fixed machine over
 * it, computed on request from the candidate's stored engine input (the design basis ambient
 * and the required power) and kept per candidate revision, profile and fired hours.
 */

export type SiteYearContext = { db: Database; broadcast: Broadcast; actorId: string };

type ProfileRow = typeof siteYear.$inferSelect & { uploadedByName: string | null };

async function readProfile(db: Reader, reviewId: string): Promise<ProfileRow | null> {
  const [row] = await db
    .select({ row: siteYear, uploadedByName: user.name })
    .from(siteYear)
    .leftJoin(user, eq(user.id, siteYear.uploadedById))
    .where(eq(siteYear.reviewId, reviewId))
    .limit(1);
  return row ? { ...row.row, uploadedByName: row.uploadedByName } : null;
}

function summaryOf(row: ProfileRow): SiteYearSummary {
  return {
    hours: row.hours,
    rows: row.rows,
    minK: row.minK,
    maxK: row.maxK,
    meanK: row.meanK,
    hasPressure: row.columns.pressureKPa !== null,
    fileName: row.fileName,
    uploadedBy: row.uploadedById ? { id: row.uploadedById, name: row.uploadedByName ?? '' } : null,
    updatedAt: row.updatedAt.toISOString(),
  };
}

/** Summary figures of parsed columns (the mean weighted by the hours each row stands for). */
function summarise(columns: SiteYearColumns) {
  const { minK, maxK, meanK } = profileSummary(columns);
  // Rounding can put the mean of equal values a hair outside them.
  return { minK, maxK, meanK: Math.min(maxK, Math.max(minK, meanK)) };
}

/**
 * Stores (or replaces) the review's profile in one transaction with its Activity line; the
 * basis row is locked (share) so the profile is never replaced under a basis change. After
 * the commit the room hears `site-year:updated` with the summary.
 */
export async function putSiteYear(
  { db, broadcast, actorId }: SiteYearContext,
  reviewId: string,
  parsed: ParsedProfile,
  fileName: string,
): Promise<SiteYearSummary> {
  const review = await reviewOf(db, reviewId);
  const { minK, maxK, meanK } = summarise(parsed.columns);
  await db.transaction(async (tx) => {
    await lockBasis(tx, reviewId, 'share');
    const values = {
      columns: parsed.columns,
      rows: parsed.rows,
      hours: parsed.hours,
      minK,
      maxK,
      meanK,
      fileName,
      uploadedById: actorId,
    };
    const replaced = await tx
      .insert(siteYear)
      .values({ reviewId, ...values })
      .onConflictDoUpdate({ target: siteYear.reviewId, set: { ...values, updatedAt: sql`now()` } })
      .returning({ inserted: sql<boolean>`(xmax = 0)` });
    await recordActivity(tx, {
      teamId: review.teamId,
      reviewId,
      actorId,
      kind: 'site-year:updated',
      detail: {
        reviewName: review.name,
        name: fileName,
        hours: parsed.hours,
        minK,
        maxK,
        replaced: !replaced[0]?.inserted,
      },
    });
  });
  const row = await readProfile(db, reviewId);
  const summary = summaryOf(row!);
  broadcast.toReview(reviewId, 'site-year:updated', { reviewId, profile: summary });
  return summary;
}

/** Removes the review's profile (404 when it has none); the room hears `site-year:updated` with null. */
export async function deleteSiteYear({ db, broadcast, actorId }: SiteYearContext, reviewId: string): Promise<void> {
  const review = await reviewOf(db, reviewId);
  await db.transaction(async (tx) => {
    const gone = await tx
      .delete(siteYear)
      .where(eq(siteYear.reviewId, reviewId))
      .returning({ fileName: siteYear.fileName });
    if (gone.length === 0) throw ApiError.notFound('The site year');
    await recordActivity(tx, {
      teamId: review.teamId,
      reviewId,
      actorId,
      kind: 'site-year:removed',
      detail: { reviewName: review.name, name: gone[0].fileName },
    });
  });
  broadcast.toReview(reviewId, 'site-year:updated', { reviewId, profile: null });
}

// ── Figures ─────────────────────────────────────────────────────────────────────────────

/** Computed years by candidate revision, profile version and fired hours (derived data only). */
const cache = new Map<string, CandidateYear>();
const maxCached = 400;

function remember(key: string, value: CandidateYear) {
  cache.set(key, value);
  if (cache.size > maxCached) cache.delete(cache.keys().next().value as string);
}

function candidateYear(
  c: CandidateWire,
  profile: AmbientProfile | null,
  densities: Float64Array | undefined,
  firedHoursPerYear: number,
): CandidateYear {
  const input = c.input as unknown as CycleInput;
  const empty = {
    candidateId: c.id,
    revision: c.revision,
    ratingCurve: [],
    hotDayKW: null,
    hotDayK: profile ? 0 : 318.15,
    coldDayKW: null,
    coldDayK: profile ? 0 : 243.15,
    requiredKW: typeof input.netPowerKW === 'number' ? input.netPowerKW : 0,
    annual: null,
  };
  if (c.error || !c.results) return { ...empty, error: c.error?.message ?? 'The candidate has no results.' };
  try {
    const r = siteYearOf(input, profile, { firedHoursPerYear, densities });
    return {
      candidateId: c.id,
      revision: c.revision,
      ratingCurve: r.ratingCurve,
      hotDayKW: r.hotDayKW,
      hotDayK: r.hotDayK,
      coldDayKW: r.coldDayKW,
      coldDayK: r.coldDayK,
      requiredKW: r.requiredKW,
      annual: r.annual,
      error: null,
    };
  } catch (error) {
    if (error instanceof EngineInputError) return { ...empty, error: error.message };
    throw error;
  }
}

/** GET /api/reviews/:reviewId/site-year (access checked by the caller). */
export async function getSiteYear(db: Database, reviewId: string): Promise<SiteYear> {
  const [basisRow, row, candidates] = await Promise.all([
    readBasis(db, reviewId),
    readProfile(db, reviewId),
    listCandidates(db, reviewId),
  ]);
  const core = basisRow ? coreOf(basisRow) : null;
  const firedHoursPerYear = core?.firedHoursPerYear ?? DEFAULT_FIRED_HOURS_PER_YEAR;
  let profile: AmbientProfile | null = null;
  const version = row ? row.updatedAt.getTime() : 0;
  let densities: Float64Array | undefined;
  const out: CandidateYear[] = [];
  for (const c of candidates) {
    const key = `${c.id}:${c.revision}:${version}:${firedHoursPerYear}`;
    const hit = cache.get(key);
    if (hit) {
      out.push(hit);
      continue;
    }
    if (row && !profile)
      profile = {
        temperatureK: Float64Array.from(row.columns.temperatureK),
        relativeHumidity: Float64Array.from(row.columns.relativeHumidity),
        pressureKPa: row.columns.pressureKPa ? Float64Array.from(row.columns.pressureKPa) : null,
        weightHours: row.columns.weightHours ? Float64Array.from(row.columns.weightHours) : null,
      };
    // Candidates of one review share the basis pressure, so one set of densities serves them all.
    const basisPressure = pressureOf(c);
    if (profile && !densities && basisPressure !== null) densities = profileDensities(profile, basisPressure);
    const year = candidateYear(c, profile, densities, firedHoursPerYear);
    remember(key, year);
    out.push(year);
  }
  return { profile: row ? summaryOf(row) : null, firedHoursPerYear, candidates: out };
}

/** The basis ambient pressure a candidate's input holds (given, or null for an elevation: the engine resolves it). */
function pressureOf(c: CandidateWire): number | null {
  const ambient = (c.input as { ambient?: { pressureKPa?: unknown } }).ambient;
  return typeof ambient?.pressureKPa === 'number' ? ambient.pressureKPa : null;
}
