import { and, eq } from 'drizzle-orm';

import type { Database, Reader } from '@/db/client';
import { candidate, score } from '@/db/schema';
import type { CandidateWire, Criterion, Round } from '@/server/contracts/board';
import {
  matrixFigureDefs,
  matrixFigureKeys,
  matrixYearFigureDefs,
  matrixYearFigureKeys,
  measuredBest,
  totalRule,
  yearRule,
  type Matrix,
  type MatrixCell,
  type MatrixTotal,
  type MatrixYear,
  type MatrixYearFigureKey,
} from '@/server/contracts/matrix';
import { preScoreRule, scoreMax, scoreMin } from '@/server/contracts/scores';
import type { CandidateYear, SiteYear } from '@/server/contracts/site-year';

import { listCandidates } from './candidates';
import { readBasis, toDesignBasis } from './design-basis';
import { getReview } from './reviews';
import { listRounds } from './rounds';
import { getSiteYear } from './site-year';

/**
 * The comparison matrix: the pure arithmetic (`buildMatrix`, `preScores`) and the one read
 * that gathers what it needs (`matrixOf`). The rules are stated in server/contracts/matrix.ts.
 */

/** One person's stored mark (the matrix needs no names or reasons). */
export type Mark = { candidateId: string; criterionId: string; userId: string; score: number };

export type MatrixInputs = {
  reviewId: string;
  reviewName: string;
  basisRevision: number;
  criteria: Criterion[];
  candidates: Pick<CandidateWire, 'id' | 'name' | 'colour' | 'status' | 'results'>[];
  scores: Mark[];
  rounds: Round[];
  /** The review's site year (GET site-year); without it the matrix has no `year`. */
  siteYear?: SiteYear;
};

/** Values closer than this (relative) count as equal: ties in totals, no spread in a figure. */
const tolerance = 1e-9;
const same = (a: number, b: number) => Math.abs(a - b) <= tolerance * Math.max(1, Math.abs(a), Math.abs(b));

function figureOf(results: Record<string, unknown> | null, key: string): number | null {
  const v = results?.[key];
  return typeof v === 'number' && Number.isFinite(v) ? v : null;
}

const pairKey = (candidateId: string, criterionId: string) => `${candidateId}\u0000${criterionId}`;

/**
 * Pre-scores of one measured criterion, per candidate: linear between the worst candidate
 * with results (1) and the best (5). Null for a candidate without the figure, and for all
 * when fewer than two candidates have it or all have the same value (no scale to draw).
 */
export function preScores(criterion: Criterion, candidates: MatrixInputs['candidates']): Record<string, number | null> {
  const out: Record<string, number | null> = Object.fromEntries(candidates.map((c) => [c.id, null]));
  if (!criterion.measure) return out;
  const values = candidates
    .map((c) => ({ id: c.id, v: figureOf(c.results, criterion.measure!) }))
    .filter((x): x is { id: string; v: number } => x.v !== null);
  if (values.length < 2) return out;
  const highest = Math.max(...values.map((x) => x.v));
  const lowest = Math.min(...values.map((x) => x.v));
  if (same(highest, lowest)) return out;
  const [worst, best] = measuredBest[criterion.measure] === 'highest' ? [lowest, highest] : [highest, lowest];
  for (const { id, v } of values) out[id] = scoreMin + ((scoreMax - scoreMin) * (v - worst)) / (best - worst);
  return out;
}

function cellOf(pre: number | null, own: number[], scorers: number): MatrixCell {
  // A scorer who left a measured criterion alone takes the pre-score as their mark.
  const marks = pre === null ? own : [...own, ...Array<number>(scorers - own.length).fill(pre)];
  if (marks.length === 0) {
    return { value: pre, mean: pre, min: pre, max: pre, count: 0, preScore: pre, overrides: 0 };
  }
  const mean = marks.reduce((s, m) => s + m, 0) / marks.length;
  return {
    value: mean,
    mean,
    min: Math.min(...marks),
    max: Math.max(...marks),
    count: marks.length,
    preScore: pre,
    overrides: pre === null ? 0 : own.length,
  };
}

/** Ranks by total, highest first; equal totals share the rank (1, 1, 3); no total, no rank. */
export function rankTotals(totals: Record<string, MatrixTotal>): Record<string, number | null> {
  const ranked = Object.values(totals)
    .map((t) => t.total)
    .filter((t): t is number => t !== null);
  return Object.fromEntries(
    Object.entries(totals).map(([id, t]) => [
      id,
      t.total === null ? null : 1 + ranked.filter((other) => other > t.total! && !same(other, t.total!)).length,
    ]),
  );
}

const yearFigureOf: Record<MatrixYearFigureKey, (y: CandidateYear) => number | null> = {
  hotDayKW: (y) => y.hotDayKW,
  coldDayKW: (y) => y.coldDayKW,
  energyMWh: (y) => y.annual?.energyMWh ?? null,
  fuelTonnes: (y) => y.annual?.fuelTonnes ?? null,
  co2Tonnes: (y) => y.annual?.co2Tonnes ?? null,
  meanHeatRateKJPerKWh: (y) => y.annual?.meanHeatRateKJPerKWh ?? null,
  shortfallHours: (y) => y.annual?.shortfallHours ?? null,
};

/**
 * The site year's figures for the matrix's candidates; a candidate the year does not hold
 * (or one the engine refused) has null figures, never 0.
 */
export function yearOf(siteYear: SiteYear, candidateIds: string[]): MatrixYear {
  const byId = new Map(siteYear.candidates.map((y) => [y.candidateId, y]));
  const computed = candidateIds.map((id) => byId.get(id)).find((y) => y !== undefined && y.error === null);
  const finite = (v: number | null) => (v !== null && Number.isFinite(v) ? v : null);
  return {
    profile: siteYear.profile,
    firedHoursPerYear: siteYear.firedHoursPerYear,
    hotDayK: computed?.hotDayK ?? null,
    coldDayK: computed?.coldDayK ?? null,
    rule: yearRule,
    figures: matrixYearFigureKeys.map((key) => ({
      key,
      label: matrixYearFigureDefs[key].label,
      unit: matrixYearFigureDefs[key].unit,
      values: Object.fromEntries(
        candidateIds.map((id) => {
          const y = byId.get(id);
          return [id, y && y.error === null ? finite(yearFigureOf[key](y)) : null];
        }),
      ),
    })),
  };
}

/** The whole matrix from what was read; the same inputs always give the same matrix. */
export function buildMatrix(inputs: MatrixInputs, madeAt: Date = new Date()): Matrix {
  const { criteria, candidates } = inputs;
  const candidateIds = new Set(candidates.map((c) => c.id));
  const criterionIds = new Set(criteria.map((c) => c.id));
  // Marks of what the matrix shows: a removed criterion's or candidate's are kept, not counted.
  const marks = inputs.scores.filter((s) => candidateIds.has(s.candidateId) && criterionIds.has(s.criterionId));
  const scorers = new Set(marks.map((s) => s.userId)).size;
  const byPair = new Map<string, number[]>();
  for (const m of marks) {
    const key = pairKey(m.candidateId, m.criterionId);
    byPair.set(key, [...(byPair.get(key) ?? []), m.score]);
  }

  const weightSum = criteria.reduce((s, c) => s + c.weight, 0);
  const share = (w: number) => (weightSum > 0 ? w / weightSum : 0);

  const rows = criteria.map((criterion) => {
    const pre = preScores(criterion, candidates);
    return {
      criterionId: criterion.id,
      weight: criterion.weight,
      share: share(criterion.weight),
      cells: Object.fromEntries(
        candidates.map((c) => [
          c.id,
          cellOf(pre[c.id] ?? null, byPair.get(pairKey(c.id, criterion.id)) ?? [], scorers),
        ]),
      ),
    };
  });

  const totals: Record<string, MatrixTotal> = {};
  for (const c of candidates) {
    let weighted = 0;
    let weightScored = 0;
    const missing: string[] = [];
    rows.forEach((row) => {
      if (row.weight <= 0) return;
      const value = row.cells[c.id]!.value;
      if (value === null) {
        missing.push(row.criterionId);
        return;
      }
      weighted += row.weight * value;
      weightScored += row.weight;
    });
    totals[c.id] = {
      total: weightScored > 0 ? weighted / weightScored : null,
      incomplete: missing.length > 0,
      missing,
    };
  }

  const figures = matrixFigureKeys.map((key) => {
    const def = matrixFigureDefs[key];
    return {
      key,
      label: def.label,
      unit: def.unit,
      values: Object.fromEntries(
        candidates.map((c) => {
          const v = figureOf(c.results, key);
          return [c.id, v === null ? null : v * def.scale];
        }),
      ),
    };
  });

  const rounds = inputs.rounds
    .filter((r): r is Round & { tally: Record<string, number> } => r.tally !== null)
    .map((r) => ({
      number: r.number,
      status: r.status,
      blind: r.blind,
      votesPerPerson: r.votesPerPerson,
      voters: r.voters,
      tally: Object.fromEntries(candidates.map((c) => [c.id, r.tally[c.id] ?? 0])),
      closedAt: r.closedAt,
    }));

  return {
    reviewId: inputs.reviewId,
    reviewName: inputs.reviewName,
    basisRevision: inputs.basisRevision,
    criteria: criteria.map((c) => ({
      id: c.id,
      name: c.name,
      weight: c.weight,
      share: share(c.weight),
      measure: c.measure,
    })),
    candidates: candidates.map((c) => ({
      id: c.id,
      name: c.name,
      colour: c.colour,
      status: c.status,
      computed: c.results !== null,
    })),
    figures,
    rows,
    totals,
    ranks: rankTotals(totals),
    rounds,
    scorers,
    rules: { preScore: `Pre-scores of measured criteria: ${preScoreRule}.`, total: totalRule },
    ...(inputs.siteYear
      ? {
          year: yearOf(
            inputs.siteYear,
            candidates.map((c) => c.id),
          ),
        }
      : {}),
    madeAt: madeAt.toISOString(),
  };
}

/** Every stored mark on the review's candidates (whatever the criterion). */
export async function marksOf(db: Reader, reviewId: string): Promise<Mark[]> {
  return db
    .select({
      candidateId: score.candidateId,
      criterionId: score.criterionId,
      userId: score.userId,
      score: score.score,
    })
    .from(score)
    .innerJoin(candidate, and(eq(candidate.id, score.candidateId), eq(candidate.reviewId, reviewId)))
    .where(eq(score.reviewId, reviewId));
}

/**
 * GET /api/reviews/:reviewId/matrix. Access is not checked here: the caller checks. The
 * viewer decides nothing in the matrix itself (tallies are the same for every role); it is
 * who the rounds are read for. The site year's figures come along (`withYear: false` leaves
 * them out, for a caller that needs only the scores' cells and totals).
 */
export async function matrixOf(
  db: Database,
  reviewId: string,
  viewerId: string,
  { withYear = true }: { withYear?: boolean } = {},
): Promise<Matrix> {
  // Stamped before the reads: of two matrices, the later stamp saw every change the earlier did.
  const madeAt = new Date();
  const [review, basisRow, candidates, scores, rounds, siteYear] = await Promise.all([
    getReview(db, reviewId),
    readBasis(db, reviewId),
    listCandidates(db, reviewId),
    marksOf(db, reviewId),
    listRounds(db, reviewId, { userId: viewerId, role: 'observer' }),
    withYear ? getSiteYear(db, reviewId) : undefined,
  ]);
  const basis = toDesignBasis(basisRow, review.createdAt);
  return buildMatrix(
    {
      reviewId,
      reviewName: review.name,
      basisRevision: basis.revision,
      criteria: basis.criteria,
      candidates,
      scores,
      rounds,
      siteYear,
    },
    madeAt,
  );
}
