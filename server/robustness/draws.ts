import type { Criterion } from '@/server/contracts/board';
import { measuredBest } from '@/server/contracts/matrix';
import { scoreMax, scoreMin } from '@/server/contracts/scores';
import { EngineInputError, evaluateCycle, type CycleInput } from '@/server/engine';

/**
 * The robustness of the ranking: N seeded draws of the uncertain inputs; every draw
 * evaluates every candidate with the engine, scores it as the matrix does (measured criteria
 * pre-scored linearly between the worst and the best candidate of that draw; judged
 * criteria from one of the team's own scores), weights each criterion by a factor and ranks
 * by the weighted total. Pure and synchronous: the worker pool runs chunks of draws.
 */

/** Common-practice spreads, each drawn uniformly within ± the value. */
export type Uncertainty = {
  /** Compressor stage isentropic efficiency, ± absolute (common practice: ±0.01). */
  compressorEfficiency: number;
  /** Turbine stage isentropic efficiency, ± absolute (common practice: ±0.01). */
  turbineEfficiency: number;
  /** Regenerator effectiveness, ± absolute (common practice: ±0.02). */
  regeneratorEffectiveness: number;
  /** Every pressure loss, ± this fraction of its value (common practice: ±20 %). */
  pressureLossFraction: number;
  /** Turbine inlet (and reheat) temperature, ± K (common practice: ±15 K). */
  turbineInletK: number;
  /** Ambient temperature, ± K around the basis without a profile (±10 K). */
  ambientK: number;
  /** Each criterion weight × U(1 − f, 1 + f), renormalised by the total (common practice: 0.2). */
  weightFactor: number;
  /** Draw judged scores from the team's own spread (false: their mean). */
  scores: boolean;
};

export const defaultUncertainty: Uncertainty = {
  compressorEfficiency: 0.01,
  turbineEfficiency: 0.01,
  regeneratorEffectiveness: 0.02,
  pressureLossFraction: 0.2,
  turbineInletK: 15,
  ambientK: 10,
  weightFactor: 0.2,
  scores: true,
};

export const zeroUncertainty: Uncertainty = {
  compressorEfficiency: 0,
  turbineEfficiency: 0,
  regeneratorEffectiveness: 0,
  pressureLossFraction: 0,
  turbineInletK: 0,
  ambientK: 0,
  weightFactor: 0,
  scores: false,
};

export type DrawCandidate = {
  id: string;
  input: CycleInput;
  /** Per criterion id, the people's scores (1–5) of this candidate; absent: none. */
  scores: Record<string, number[]>;
};

export type DrawTask = {
  candidates: DrawCandidate[];
  criteria: Criterion[];
  uncertainty: Uncertainty;
  seed: number;
  /** Draw indices from (inclusive) to (exclusive); each draw has its own generator. */
  from: number;
  to: number;
  /** The profile's hourly temperatures, K: each draw takes one at random as its ambient. */
  ambientTemperaturesK?: readonly number[] | null;
};

export type DrawChunk = {
  draws: number;
  /** Per candidate: the share of first place won in each draw, summed (ties split). */
  firstPlace: Record<string, number>;
  /** Per candidate: counts of each rank 1…n (shared ranks count at that rank). */
  ranks: Record<string, number[]>;
  /** Per candidate, per draw: thermal efficiency and net specific work (NaN where refused). */
  efficiency: Record<string, number[]>;
  netWork: Record<string, number[]>;
};

/** mulberry32 (public domain), seeded per draw from the run's seed and the draw's index. */
function generator(seed: number, index: number) {
  let a = (Math.imul(seed ^ 0x9e3779b9, 0x85ebca6b) ^ Math.imul(index + 1, 0xc2b2ae35)) >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const clamp = (x: number, lo: number, hi: number) => Math.min(hi, Math.max(lo, x));

/** The candidate's input with this draw's values (uniform within ± each spread). */
function perturbed(input: CycleInput, u: Uncertainty, random: () => number, ambientK: number): CycleInput {
  const pm = (spread: number) => (spread === 0 ? 0 : (2 * random() - 1) * spread);
  const loss = (value: number | undefined) =>
    value === undefined ? undefined : clamp(value * (1 + pm(u.pressureLossFraction)), 0, 0.5);
  const dTit = pm(u.turbineInletK);
  return {
    ...input,
    ambient: { ...input.ambient, temperatureK: ambientK },
    compressor: {
      ...input.compressor,
      isentropicEfficiency: clamp(input.compressor.isentropicEfficiency + pm(u.compressorEfficiency), 0.01, 1),
      intercoolerPressureLoss: loss(input.compressor.intercoolerPressureLoss),
    },
    regenerator: input.regenerator
      ? {
          effectiveness: clamp(input.regenerator.effectiveness + pm(u.regeneratorEffectiveness), 0, 1),
          airSidePressureLoss: loss(input.regenerator.airSidePressureLoss)!,
          gasSidePressureLoss: loss(input.regenerator.gasSidePressureLoss)!,
        }
      : input.regenerator,
    combustorPressureLoss: loss(input.combustorPressureLoss)!,
    turbine: {
      ...input.turbine,
      inletTemperatureK: input.turbine.inletTemperatureK + dTit,
      reheatTemperatureK:
        input.turbine.reheatTemperatureK === undefined ? undefined : input.turbine.reheatTemperatureK + dTit,
      isentropicEfficiency: clamp(input.turbine.isentropicEfficiency + pm(u.turbineEfficiency), 0.01, 1),
      reheaterPressureLoss: loss(input.turbine.reheaterPressureLoss),
    },
  };
}

const tolerance = 1e-9;
const same = (a: number, b: number) => Math.abs(a - b) <= tolerance * Math.max(1, Math.abs(a), Math.abs(b));

/** Runs draws `from`…`to` of a task. The same seed and index always give the same draw. */
export function runDraws(task: DrawTask): DrawChunk {
  const { candidates, criteria, uncertainty: u, seed } = task;
  const n = candidates.length;
  const firstPlace: Record<string, number> = {};
  const ranks: Record<string, number[]> = {};
  const efficiency: Record<string, number[]> = {};
  const netWork: Record<string, number[]> = {};
  for (const c of candidates) {
    firstPlace[c.id] = 0;
    ranks[c.id] = new Array(n).fill(0);
    efficiency[c.id] = [];
    netWork[c.id] = [];
  }
  const profile = task.ambientTemperaturesK && task.ambientTemperaturesK.length > 0 ? task.ambientTemperaturesK : null;
  const figures: Array<Record<string, number> | null> = new Array(n);
  const totals = new Array<number | null>(n);

  for (let d = task.from; d < task.to; d++) {
    const random = generator(seed, d);
    // One ambient for every candidate in a draw (they stand on the same site).
    const baseK = candidates[0]?.input.ambient.temperatureK ?? 288.15;
    const ambientK = profile
      ? profile[Math.floor(random() * profile.length)]
      : baseK + (u.ambientK === 0 ? 0 : (2 * random() - 1) * u.ambientK);
    for (let i = 0; i < n; i++) {
      const c = candidates[i];
      try {
        const r = evaluateCycle(perturbed(c.input, u, random, ambientK), { paths: false });
        figures[i] =
          r.netWorkKJPerKg > 0
            ? {
                thermalEfficiency: r.thermalEfficiency,
                netWorkKJPerKg: r.netWorkKJPerKg,
                co2KgPerMWh: r.co2KgPerMWh ?? NaN,
              }
            : null;
      } catch (error) {
        if (!(error instanceof EngineInputError)) throw error;
        figures[i] = null;
      }
      efficiency[c.id].push(figures[i]?.thermalEfficiency ?? NaN);
      netWork[c.id].push(figures[i]?.netWorkKJPerKg ?? NaN);
    }
    const weighted = new Array(n).fill(0);
    const weightScored = new Array(n).fill(0);
    for (const criterion of criteria) {
      if (criterion.weight <= 0) continue;
      const weight = criterion.weight * (u.weightFactor === 0 ? 1 : 1 + (2 * random() - 1) * u.weightFactor);
      const pre = criterion.measure ? preScoresOf(criterion.measure, figures) : null;
      for (let i = 0; i < n; i++) {
        const own = candidates[i].scores[criterion.id] ?? [];
        // As the matrix: a scorer who left a measured criterion alone takes the pre-score.
        const p = pre ? pre[i] : null;
        let value: number | null;
        if (p === null && own.length === 0) value = null;
        else if (u.scores) {
          const marks = p === null ? own : [...own, p];
          value = marks[Math.floor(random() * marks.length)];
        } else {
          const marks = p === null ? own : [...own, p];
          value = marks.reduce((s, m) => s + m, 0) / marks.length;
        }
        if (value === null) continue;
        weighted[i] += weight * value;
        weightScored[i] += weight;
      }
    }
    for (let i = 0; i < n; i++) totals[i] = weightScored[i] > 0 ? weighted[i] / weightScored[i] : null;
    let firsts = 0;
    const rankOf = new Array<number>(n);
    for (let i = 0; i < n; i++) {
      const t = totals[i];
      if (t === null) {
        rankOf[i] = n;
        continue;
      }
      let above = 0;
      for (let j = 0; j < n; j++) {
        const o = totals[j];
        if (o !== null && o > t && !same(o, t)) above++;
      }
      rankOf[i] = above + 1;
      if (rankOf[i] === 1) firsts++;
    }
    for (let i = 0; i < n; i++) {
      ranks[candidates[i].id][rankOf[i] - 1]++;
      if (rankOf[i] === 1 && totals[i] !== null) firstPlace[candidates[i].id] += 1 / firsts;
    }
  }
  return { draws: task.to - task.from, firstPlace, ranks, efficiency, netWork };
}

/** Pre-scores of one measured figure in a draw: linear between the worst (1) and the best (5). */
function preScoresOf(measure: keyof typeof measuredBest, figures: Array<Record<string, number> | null>) {
  const values = figures.map((f) => (f && Number.isFinite(f[measure]) ? f[measure] : null));
  const known = values.filter((v): v is number => v !== null);
  if (known.length < 2) return values.map(() => null);
  const hi = Math.max(...known);
  const lo = Math.min(...known);
  if (same(hi, lo)) return values.map(() => null);
  const [worst, best] = measuredBest[measure] === 'highest' ? [lo, hi] : [hi, lo];
  return values.map((v) => (v === null ? null : scoreMin + ((scoreMax - scoreMin) * (v - worst)) / (best - worst)));
}

/** Merges chunks in draw order. */
export function mergeChunks(chunks: DrawChunk[]): DrawChunk {
  const [first, ...rest] = chunks;
  const out: DrawChunk = structuredClone(first);
  for (const c of rest) {
    out.draws += c.draws;
    for (const id of Object.keys(out.firstPlace)) {
      out.firstPlace[id] += c.firstPlace[id];
      c.ranks[id].forEach((k, r) => (out.ranks[id][r] += k));
      out.efficiency[id].push(...c.efficiency[id]);
      out.netWork[id].push(...c.netWork[id]);
    }
  }
  return out;
}

/** The 5th and 95th percentiles of the finite values (nearest rank), or null without any. */
export function band(values: readonly number[]): { p5: number; p95: number } | null {
  const sorted = values.filter(Number.isFinite).sort((a, b) => a - b);
  if (sorted.length === 0) return null;
  const at = (p: number) => sorted[Math.min(sorted.length - 1, Math.max(0, Math.ceil(p * sorted.length) - 1))];
  return { p5: at(0.05), p95: at(0.95) };
}

/** The run's result: probability of first place per candidate (summing to 1), rank shares and bands. */
export function summarise(chunk: DrawChunk) {
  const ids = Object.keys(chunk.firstPlace);
  const total = ids.reduce((s, id) => s + chunk.firstPlace[id], 0);
  return {
    draws: chunk.draws,
    firstPlace: Object.fromEntries(ids.map((id) => [id, total > 0 ? chunk.firstPlace[id] / total : 0])),
    ranks: Object.fromEntries(ids.map((id) => [id, chunk.ranks[id].map((k) => k / chunk.draws)])),
    bands: Object.fromEntries(
      ids.map((id) => [id, { thermalEfficiency: band(chunk.efficiency[id]), netWorkKJPerKg: band(chunk.netWork[id]) }]),
    ),
  };
}
