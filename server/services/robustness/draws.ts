import { uniformFloat64 } from 'pure-rand/distribution/uniformFloat64';
import { xoroshiro128plus } from 'pure-rand/generator/xoroshiro128plus';

import type { Uncertainty } from '@/server/contracts/robustness';
import { evaluateCycle, type CycleInput } from '@/server/engine';

/**
 * The robustness check's draws, pure and synchronous (run in a worker thread). Draw `i` of a
 * run with seed `s` is made from its own generator seeded from (s, i), so a run gives the
 * same result however its draws are split over workers, and the same seed the same result.
 */

export type DrawCandidate = {
  id: string;
  /** The engine input the candidate was computed from (parsed: defaults filled in). */
  input: CycleInput;
  /** The candidate sets its own intercooling temperature (else it follows the drawn ambient). */
  ownIntercoolTemperature: boolean;
  /** Annual fuel of the nominal candidate over the site year, t; null without a profile. */
  yearFuelTonnes: number | null;
};

export type DrawCriterion = { id: string; weight: number; measure: string | null };

/** The team's marks of one cell (candidate × criterion): each scorer's own score. */
export type DrawJob = {
  seed: number;
  from: number;
  to: number;
  candidates: DrawCandidate[];
  criteria: DrawCriterion[];
  /** marks[criterionIndex][candidateIndex]: the scores people gave. */
  marks: number[][][];
  /** People who scored anything in the review (a scorer who left a measured cell takes its pre-score). */
  scorers: number;
  uncertainty: Uncertainty;
  firedHoursPerYear: number;
  /** The site's hours (when a profile is stored and the ambient is drawn from it). */
  profile: {
    temperatureK: Float64Array;
    relativeHumidity: Float64Array;
    pressureKPa: Float64Array | null;
    cumulativeHours: Float64Array;
  } | null;
};

/** What a chunk of draws gives, merged in draw order by the caller. */
export type DrawPartial = {
  from: number;
  to: number;
  /** firstPlace[j]: draws (fractions for ties) in which candidate j ranks first. */
  firstPlace: Float64Array;
  /** rankCounts[j * n + r]: draws in which candidate j takes position r (0 = first). */
  rankCounts: Float64Array;
  refused: Int32Array;
  /** Per candidate, per draw (NaN where refused): efficiency, net work kJ/kg, annual fuel t. */
  efficiency: Float64Array;
  netWork: Float64Array;
  annualFuel: Float64Array;
  /** Draws in which at least one candidate had a total (the first place went to someone). */
  ranked: number;
  evaluations: number;
};

const tolerance = 1e-9;
const same = (a: number, b: number) => Math.abs(a - b) <= tolerance * Math.max(1, Math.abs(a), Math.abs(b));

/** A 32-bit mix of the run's seed and the draw's index (the murmur3 finaliser). */
function drawSeed(seed: number, index: number): number {
  let h = (seed ^ Math.imul(index + 1, 0x9e3779b1)) >>> 0;
  h ^= h >>> 16;
  h = Math.imul(h, 0x85ebca6b);
  h ^= h >>> 13;
  h = Math.imul(h, 0xc2b2ae35);
  h ^= h >>> 16;
  return h | 0;
}

function generator(seed: number, index: number) {
  const rng = xoroshiro128plus(drawSeed(seed, index));
  // The first outputs of a freshly seeded xoroshiro128+ are poorly mixed: skip them.
  for (let k = 0; k < 4; k++) uniformFloat64(rng);
  /** Uniform on [-1, 1). */
  const pm = () => 2 * uniformFloat64(rng) - 1;
  const unit = () => uniformFloat64(rng);
  return { pm, unit };
}

const clamp = (v: number, lo: number, hi: number) => Math.min(hi, Math.max(lo, v));

/** The candidate's input with this draw's values; always consumes the same draws, whatever it has. */
function perturbed(c: DrawCandidate, ambient: CycleInput['ambient'], u: Uncertainty, pm: () => number): CycleInput {
  const { input } = c;
  const dCompressor = pm() * u.compressorEfficiency;
  const dTurbine = pm() * u.turbineEfficiency;
  const dRegenerator = pm() * u.regeneratorEffectiveness;
  const loss = () => 1 + pm() * u.pressureLossFraction;
  const lIntercooler = loss();
  const lRegenAir = loss();
  const lRegenGas = loss();
  const lCombustor = loss();
  const lReheater = loss();
  const dT = pm() * u.turbineInletK;
  const compressor: CycleInput['compressor'] = {
    ...input.compressor,
    isentropicEfficiency: clamp(input.compressor.isentropicEfficiency + dCompressor, 0.05, 0.999),
    intercoolerPressureLoss:
      input.compressor.intercoolerPressureLoss === undefined
        ? undefined
        : clamp(input.compressor.intercoolerPressureLoss * lIntercooler, 0, 0.5),
  };
  if (!c.ownIntercoolTemperature) delete (compressor as { intercoolTemperatureK?: number }).intercoolTemperatureK;
  const turbine: CycleInput['turbine'] = {
    ...input.turbine,
    isentropicEfficiency: clamp(input.turbine.isentropicEfficiency + dTurbine, 0.05, 0.999),
    inletTemperatureK: input.turbine.inletTemperatureK + dT,
    reheatTemperatureK:
      input.turbine.reheatTemperatureK === undefined ? undefined : input.turbine.reheatTemperatureK + dT,
    reheaterPressureLoss:
      input.turbine.reheaterPressureLoss === undefined
        ? undefined
        : clamp(input.turbine.reheaterPressureLoss * lReheater, 0, 0.5),
  };
  return {
    ...input,
    ambient,
    compressor,
    turbine,
    regenerator: input.regenerator
      ? {
          effectiveness: clamp(input.regenerator.effectiveness + dRegenerator, 0, 0.99),
          airSidePressureLoss: clamp(input.regenerator.airSidePressureLoss * lRegenAir, 0, 0.5),
          gasSidePressureLoss: clamp(input.regenerator.gasSidePressureLoss * lRegenGas, 0, 0.5),
        }
      : input.regenerator,
    combustorPressureLoss:
      input.combustorPressureLoss === undefined ? undefined : clamp(input.combustorPressureLoss * lCombustor, 0, 0.5),
  } as CycleInput;
}

/** The hour whose cumulative hours first pass `x` (0 ≤ x < total). */
function hourAt(cumulative: Float64Array, x: number): number {
  let lo = 0;
  let hi = cumulative.length - 1;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (cumulative[mid]! > x) hi = mid;
    else lo = mid + 1;
  }
  return lo;
}

type Figures = {
  efficiency: number;
  netWork: number;
  heatRate: number | null;
  fuelFlow: number | null;
  /** The engine's result, read by key for the measured criteria. */
  values: Readonly<Record<string, unknown>>;
};

function figuresOf(input: CycleInput): Figures | null {
  try {
    const r = evaluateCycle(input, { paths: false });
    return {
      efficiency: r.thermalEfficiency,
      netWork: r.netWorkKJPerKg,
      heatRate: r.heatRateKJPerKWh,
      fuelFlow: r.fuelMassFlowKgPerS,
      values: r as unknown as Readonly<Record<string, unknown>>,
    };
  } catch {
    return null;
  }
}

/** Whether a higher value of a measured figure is better (as the comparison matrix has it). */
export type BestEnd = Record<string, 'highest' | 'lowest'>;

/** Runs draws [from, to) of a job. */
export function runDraws(job: DrawJob, bestEnd: BestEnd): DrawPartial {
  const { candidates, criteria, marks, uncertainty: u } = job;
  const n = candidates.length;
  const count = job.to - job.from;
  const out: DrawPartial = {
    from: job.from,
    to: job.to,
    firstPlace: new Float64Array(n),
    rankCounts: new Float64Array(n * n),
    refused: new Int32Array(n),
    efficiency: new Float64Array(n * count).fill(Number.NaN),
    netWork: new Float64Array(n * count).fill(Number.NaN),
    annualFuel: new Float64Array(n * count).fill(Number.NaN),
    ranked: 0,
    evaluations: 0,
  };
  const base = candidates[0]?.input.ambient;
  if (!base) return out;
  // Nominal heat rate at a drawn ambient, to scale a candidate's year by its drawn heat rate.
  const nominalHeatRate = new Map<string, number | null>();
  const nominalAt = (j: number, ambient: CycleInput['ambient']) => {
    // On a 1 K × 0.1 grid of ambient: the ratio of heat rates varies slowly with the ambient.
    const tK = Math.round(ambient.temperatureK);
    const rh = Math.round(ambient.relativeHumidity * 10) / 10;
    const key = `${j}:${tK}:${rh}`;
    if (!nominalHeatRate.has(key)) {
      const c = candidates[j]!;
      const at = { ...ambient, temperatureK: tK, relativeHumidity: rh };
      const input = { ...c.input, ambient: at, compressor: { ...c.input.compressor } } as CycleInput;
      if (!c.ownIntercoolTemperature)
        delete (input.compressor as { intercoolTemperatureK?: number }).intercoolTemperatureK;
      nominalHeatRate.set(key, figuresOf(input)?.heatRate ?? null);
      out.evaluations++;
    }
    return nominalHeatRate.get(key)!;
  };

  const totals = new Float64Array(n);
  const hasTotal = new Uint8Array(n);
  for (let i = job.from; i < job.to; i++) {
    const slot = i - job.from;
    const { pm, unit } = generator(job.seed, i);

    // The ambient of this draw, common to every candidate.
    let ambient: CycleInput['ambient'];
    const hourPick = unit();
    const swing = pm();
    if (job.profile && u.ambientFromProfile) {
      const p = job.profile;
      const h = hourAt(p.cumulativeHours, hourPick * p.cumulativeHours[p.cumulativeHours.length - 1]!);
      ambient = { ...base, temperatureK: p.temperatureK[h]!, relativeHumidity: p.relativeHumidity[h]! };
      if (p.pressureKPa) {
        ambient = { ...ambient, pressureKPa: p.pressureKPa[h]! };
        delete (ambient as { elevationM?: number }).elevationM;
      }
    } else {
      ambient = { ...base, temperatureK: base.temperatureK + swing * u.ambientK };
    }

    // Weights ×(1 ± f); the totals renormalise over what is scored.
    const weights = criteria.map((c) => Math.max(0, c.weight * (1 + pm() * u.weightFactor)));

    const figures = candidates.map((c) => {
      const f = figuresOf(perturbed(c, ambient, u, pm));
      out.evaluations++;
      return f;
    });

    for (let j = 0; j < n; j++) {
      const f = figures[j];
      if (!f) {
        out.refused[j]!++;
        continue;
      }
      out.efficiency[j * count + slot] = f.efficiency;
      out.netWork[j * count + slot] = f.netWork;
      const c = candidates[j]!;
      if (c.yearFuelTonnes !== null && f.heatRate !== null) {
        const nominal = nominalAt(j, ambient);
        if (nominal) out.annualFuel[j * count + slot] = (c.yearFuelTonnes * f.heatRate) / nominal;
      } else if (f.fuelFlow !== null) {
        // No profile: the fired hours at this draw's ambient (kg/s × 3600 s/h ÷ 1000 kg/t).
        out.annualFuel[j * count + slot] = (f.fuelFlow * 3600 * job.firedHoursPerYear) / 1000;
      }
    }

    // Cell values: measured criteria pre-scored from this draw's figures, then the team's marks.
    totals.fill(0);
    hasTotal.fill(0);
    const weightScored = new Float64Array(n);
    criteria.forEach((criterion, k) => {
      const w = weights[k]!;
      let pre: Array<number | null> | null = null;
      if (criterion.measure) {
        const values = figures.map((f) => {
          const v = f?.values[criterion.measure!];
          return typeof v === 'number' && Number.isFinite(v) ? v : null;
        });
        const known = values.filter((v): v is number => v !== null);
        pre = values.map(() => null);
        if (known.length >= 2) {
          const hi = Math.max(...known);
          const lo = Math.min(...known);
          if (!same(hi, lo)) {
            const [worst, best] = bestEnd[criterion.measure] === 'lowest' ? [hi, lo] : [lo, hi];
            pre = values.map((v) => (v === null ? null : 1 + (4 * (v - worst)) / (best - worst)));
          }
        }
      }
      for (let j = 0; j < n; j++) {
        const own = marks[k]?.[j] ?? [];
        const p = pre ? pre[j]! : null;
        const pick = unit();
        if (!figures[j]) continue;
        // A scorer who left a measured criterion alone takes the pre-score as their mark.
        const spare = p === null ? 0 : Math.max(0, job.scorers - own.length);
        const size = own.length + spare;
        let value: number | null;
        if (size === 0) value = p;
        else if (u.scoreSpread) {
          const m = Math.min(size - 1, Math.floor(pick * size));
          value = m < own.length ? own[m]! : p;
        } else {
          let sum = 0;
          for (const s of own) sum += s;
          value = (sum + spare * (p ?? 0)) / size;
        }
        if (value === null || w <= 0) continue;
        totals[j] += w * value;
        weightScored[j] += w;
        hasTotal[j] = 1;
      }
    });
    for (let j = 0; j < n; j++) if (hasTotal[j]) totals[j] /= weightScored[j]!;

    // Rank: higher total first; equal totals share their positions evenly; no total, last.
    const order = Array.from({ length: n }, (_, j) => j).sort((a, b) => {
      if (!hasTotal[a] || !hasTotal[b]) return hasTotal[b]! - hasTotal[a]!;
      return totals[b]! - totals[a]!;
    });
    if (n > 0 && hasTotal[order[0]!]) out.ranked++;
    let pos = 0;
    while (pos < n) {
      let end = pos + 1;
      const a = order[pos]!;
      while (
        end < n &&
        hasTotal[a] === hasTotal[order[end]!] &&
        (!hasTotal[a] || same(totals[a]!, totals[order[end]!]!))
      )
        end++;
      const share = 1 / (end - pos);
      for (let q = pos; q < end; q++) {
        const j = order[q]!;
        for (let r = pos; r < end; r++) out.rankCounts[j * n + r] += share;
        if (pos === 0 && hasTotal[j]) out.firstPlace[j] += share;
      }
      pos = end;
    }
  }
  return out;
}
