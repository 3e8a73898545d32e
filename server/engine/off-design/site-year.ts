import type { CycleInput } from '../cycles/types';
import { EngineInputError } from '../errors';
import {
  fixMachine,
  humidAirDensity,
  offDesignPoint,
  specificFigures,
  type FixedMachine,
  type OffDesignPoint,
  type SpecificFigures,
} from './fixed-machine';

/**
 * A candidate's site year: the fixed machine's rating curve against the ambient temperature
 * and its year over an hourly ambient profile. A first-order estimate without component maps,
 * for comparing candidates.
 */

/** The rating curve spans −30 °C to +45 °C (a cold inland winter to a hot desert summer). */
export const RATING_FROM_K = 243.15;
export const RATING_TO_K = 318.15;
/** Curve step, K (at most 5 K). */
export const RATING_STEP_K = 5;

/** Interpolation grid of the year: 1 K of temperature and 0.1 of relative humidity. */
export const GRID_STEP_K = 1;
export const GRID_STEP_RH = 0.1;

/** An hourly ambient profile. Arrays of one length; a row stands for `weightHours[i]` hours (1 when absent). */
export interface AmbientProfile {
  readonly temperatureK: ArrayLike<number>;
  /** 0–1 */
  readonly relativeHumidity: ArrayLike<number>;
  /** Per hour, kPa; absent: every hour at the design ambient pressure. */
  readonly pressureKPa?: ArrayLike<number> | null;
  readonly weightHours?: ArrayLike<number> | null;
}

export interface RatingPoint {
  readonly ambientK: number;
  readonly netPowerKW: number;
  readonly heatRateKJPerKWh: number;
  readonly exhaustTemperatureK: number;
}

export interface AnnualFigures {
  readonly energyMWh: number;
  readonly fuelTonnes: number;
  readonly co2Tonnes: number;
  /** Heat input over electricity sent out across the fired hours, kJ/kWh. */
  readonly meanHeatRateKJPerKWh: number;
  /** Fired hours in which the machine cannot give the required power. */
  readonly shortfallHours: number;
  /** Profile hours (the calendar) in which it could not. */
  readonly shortfallProfileHours: number;
  readonly firedHours: number;
}

/**
 * Ambient temperatures of the rating curve: −30 °C to +45 °C every 5 K, with the design
 * ambient itself inserted (a point within 0.01 K of a step is replaced by it).
 */
export function ratingTemperaturesK(designK: number): number[] {
  const points: number[] = [];
  for (let t = RATING_FROM_K; t <= RATING_TO_K + 1e-9; t += RATING_STEP_K) {
    const rounded = Math.round(t * 100) / 100;
    if (Math.abs(rounded - designK) > 0.01) points.push(rounded);
  }
  points.push(designK);
  return points.sort((a, b) => a - b);
}

/**
 * The rating curve at the design humidity and pressure. Points where the engine refuses the
 * cycle (it can give no net work there) are left out.
 */
export function ratingCurve(machine: FixedMachine): RatingPoint[] {
  const { relativeHumidity, pressureKPa } = machine.designAmbient;
  const curve: RatingPoint[] = [];
  for (const temperatureK of ratingTemperaturesK(machine.designAmbient.temperatureK)) {
    const p = tryPoint(machine, { temperatureK, relativeHumidity, pressureKPa });
    if (p)
      curve.push({
        ambientK: temperatureK,
        netPowerKW: p.netPowerKW,
        heatRateKJPerKWh: p.heatRateKJPerKWh,
        exhaustTemperatureK: p.exhaustTemperatureK,
      });
  }
  return curve;
}

function tryPoint(machine: FixedMachine, ambient: Parameters<typeof offDesignPoint>[1]): OffDesignPoint | null {
  try {
    return offDesignPoint(machine, ambient);
  } catch (error) {
    if (error instanceof EngineInputError) return null;
    throw error;
  }
}

/** Per-hour inlet densities of a profile, kg/m³ (the same for every candidate: compute once). */
export function profileDensities(profile: AmbientProfile, designPressureKPa: number): Float64Array {
  const n = profile.temperatureK.length;
  const out = new Float64Array(n);
  const p = profile.pressureKPa;
  for (let i = 0; i < n; i++)
    out[i] = humidAirDensity(profile.temperatureK[i], profile.relativeHumidity[i], p ? p[i] : designPressureKPa);
  return out;
}

/**
 * The specific figures on a grid of temperature (1 K) × relative humidity (0.1) covering the
 * profile, evaluated at the profile's mean pressure: the net specific work at a fixed pressure
 * ratio does not depend on the absolute pressure, only through the humidity ratio the
 * pressure gives at one relative humidity (a small effect; the test states the error). A node
 * the engine refuses holds NaN and the hours beside it are evaluated directly.
 */
class FiguresGrid {
  readonly t0: number;
  readonly nt: number;
  readonly rh0: number;
  readonly nrh: number;
  /** [electric, heat, fuel, co2, exhaust] per node, node (i, j) at 5 (i nrh + j). */
  readonly values: Float64Array;

  constructor(design: CycleInput, minK: number, maxK: number, minRH: number, maxRH: number, pressureKPa: number) {
    this.t0 = Math.floor(minK / GRID_STEP_K) * GRID_STEP_K;
    this.nt = Math.max(2, Math.ceil((maxK - this.t0) / GRID_STEP_K - 1e-9) + 1);
    this.rh0 = Math.floor(minRH / GRID_STEP_RH + 1e-9) * GRID_STEP_RH;
    this.nrh = Math.max(2, Math.ceil((maxRH - this.rh0) / GRID_STEP_RH - 1e-9) + 1);
    this.values = new Float64Array(this.nt * this.nrh * 5);
    for (let i = 0; i < this.nt; i++)
      for (let j = 0; j < this.nrh; j++) {
        const k = 5 * (i * this.nrh + j);
        const relativeHumidity = Math.min(1, Math.max(0, this.rh0 + j * GRID_STEP_RH));
        let f: SpecificFigures | null = null;
        try {
          f = specificFigures(design, { temperatureK: this.t0 + i * GRID_STEP_K, relativeHumidity, pressureKPa });
        } catch (error) {
          if (!(error instanceof EngineInputError)) throw error;
        }
        this.values[k] = f ? f.electricKJPerKg : NaN;
        this.values[k + 1] = f ? f.heatKJPerKg : NaN;
        this.values[k + 2] = f ? f.fuelPerKg : NaN;
        this.values[k + 3] = f ? f.co2PerKg : NaN;
        this.values[k + 4] = f ? f.exhaustTemperatureK : NaN;
      }
  }

  /** Bilinear interpolation into `out` (5 numbers); false where a corner is missing. */
  at(temperatureK: number, relativeHumidity: number, out: Float64Array): boolean {
    let x = (temperatureK - this.t0) / GRID_STEP_K;
    let y = (relativeHumidity - this.rh0) / GRID_STEP_RH;
    let i = Math.floor(x);
    let j = Math.floor(y);
    if (i >= this.nt - 1) i = this.nt - 2;
    if (j >= this.nrh - 1) j = this.nrh - 2;
    if (i < 0) i = 0;
    if (j < 0) j = 0;
    x -= i;
    y -= j;
    const v = this.values;
    const a = 5 * (i * this.nrh + j);
    const b = a + 5;
    const c = a + 5 * this.nrh;
    const d = c + 5;
    const wa = (1 - x) * (1 - y);
    const wb = (1 - x) * y;
    const wc = x * (1 - y);
    const wd = x * y;
    for (let m = 0; m < 5; m++) out[m] = wa * v[a + m] + wb * v[b + m] + wc * v[c + m] + wd * v[d + m];
    return out[0] === out[0];
  }
}

/** The hourly profile's summary. */
export function profileSummary(profile: AmbientProfile) {
  const t = profile.temperatureK;
  const w = profile.weightHours;
  let minK = Infinity;
  let maxK = -Infinity;
  let sum = 0;
  let hours = 0;
  for (let i = 0; i < t.length; i++) {
    const h = w ? w[i] : 1;
    if (t[i] < minK) minK = t[i];
    if (t[i] > maxK) maxK = t[i];
    sum += t[i] * h;
    hours += h;
  }
  return { hours, minK, maxK, meanK: sum / hours };
}

export interface SiteYearOptions {
  /** Fired hours per year, spread over the profile's hours in proportion to what each stands for. */
  readonly firedHoursPerYear: number;
  /** Per-hour inlet densities (profileDensities), shared by the candidates of one profile. */
  readonly densities?: Float64Array;
  /** Evaluate every hour directly instead of on the grid (for checking the grid). */
  readonly direct?: boolean;
}

/**
 * The fixed machine's year. Each profile hour i gets firedHoursPerYear × weight_i / Σ weight
 * fired hours. In an hour where the machine could give more than the required power it runs
 * at the required power (part load), taken at the full-load heat rate of that ambient — a
 * first-order assumption: a real machine's heat rate rises at part load. An hour where it
 * gives less is a shortfall hour and runs at its full-load power.
 */
export function annualFigures(machine: FixedMachine, profile: AmbientProfile, options: SiteYearOptions): AnnualFigures {
  const n = profile.temperatureK.length;
  const { hours } = profileSummary(profile);
  const designP = machine.designAmbient.pressureKPa;
  const densities = options.densities ?? profileDensities(profile, designP);
  const w = profile.weightHours;
  const p = profile.pressureKPa;
  const required = machine.requiredKW;
  const volume = machine.inletVolumeFlowM3PerS;
  const firedPerHour = options.firedHoursPerYear / hours;

  let grid: FiguresGrid | null = null;
  if (!options.direct && n > 0) {
    let minK = Infinity;
    let maxK = -Infinity;
    let minRH = Infinity;
    let maxRH = -Infinity;
    let pSum = 0;
    for (let i = 0; i < n; i++) {
      const t = profile.temperatureK[i];
      const rh = profile.relativeHumidity[i];
      if (t < minK) minK = t;
      if (t > maxK) maxK = t;
      if (rh < minRH) minRH = rh;
      if (rh > maxRH) maxRH = rh;
      pSum += p ? p[i] : designP;
    }
    grid = new FiguresGrid(machine.design, minK, maxK, minRH, maxRH, pSum / n);
  }

  const f = new Float64Array(5);
  let energyKWh = 0;
  let heatKJ = 0;
  let fuelKg = 0;
  let co2Kg = 0;
  let shortfallHours = 0;
  let shortfallProfileHours = 0;
  for (let i = 0; i < n; i++) {
    const t = profile.temperatureK[i];
    const rh = profile.relativeHumidity[i];
    const weight = w ? w[i] : 1;
    const fired = weight * firedPerHour;
    const airFlow = volume * densities[i];
    let electric: number;
    let heat: number;
    let fuel: number;
    let co2: number;
    if (grid && grid.at(t, rh, f)) {
      electric = f[0];
      heat = f[1];
      fuel = f[2];
      co2 = f[3];
    } else {
      let direct: SpecificFigures | null = null;
      try {
        direct = specificFigures(machine.design, {
          temperatureK: t,
          relativeHumidity: rh,
          pressureKPa: p ? p[i] : designP,
        });
      } catch (error) {
        if (!(error instanceof EngineInputError)) throw error;
      }
      if (!direct) {
        // The cycle cannot run at this ambient: no power, a shortfall hour.
        shortfallHours += fired;
        shortfallProfileHours += weight;
        continue;
      }
      electric = direct.electricKJPerKg;
      heat = direct.heatKJPerKg;
      fuel = direct.fuelPerKg;
      co2 = direct.co2PerKg;
    }
    const available = airFlow * electric;
    // Relative tolerance: at the design ambient the machine gives the required power exactly.
    if (available < required * (1 - 1e-9)) {
      shortfallHours += fired;
      shortfallProfileHours += weight;
    }
    // Capped at the required power when the machine could give more (part load at the
    // full-load heat rate of this ambient, see above).
    const power = available < required ? available : required;
    const airKg = (power / electric) * 3600 * fired; // kg of air over the fired hours of this row
    energyKWh += power * fired;
    heatKJ += heat * airKg;
    fuelKg += fuel * airKg;
    co2Kg += co2 * airKg;
  }
  return {
    energyMWh: energyKWh / 1000,
    fuelTonnes: fuelKg / 1000,
    co2Tonnes: co2Kg / 1000,
    meanHeatRateKJPerKWh: energyKWh > 0 ? heatKJ / energyKWh : 0,
    shortfallHours,
    shortfallProfileHours,
    firedHours: options.firedHoursPerYear,
  };
}

export interface SiteYearResult {
  readonly ratingCurve: RatingPoint[];
  /** Full-load capacity on the hot day (the profile's hottest hour, else +45 °C), kW. */
  readonly hotDayKW: number | null;
  readonly hotDayK: number;
  /** Full-load capacity on the cold day (the profile's coldest hour, else −30 °C), kW. */
  readonly coldDayKW: number | null;
  readonly coldDayK: number;
  readonly requiredKW: number;
  readonly annual: AnnualFigures | null;
}

/**
 * One candidate's site year from its design engine input (the design basis ambient and the
 * required power). Without a profile the rating curve and the hot and cold days at the
 * curve's ends (design humidity and pressure) are given, `annual` null.
 */
export function siteYear(design: CycleInput, profile: AmbientProfile | null, options: SiteYearOptions): SiteYearResult {
  const machine = fixMachine(design);
  const curve = ratingCurve(machine);
  const { relativeHumidity, pressureKPa } = machine.designAmbient;
  let hot = { temperatureK: RATING_TO_K, relativeHumidity, pressureKPa };
  let cold = { temperatureK: RATING_FROM_K, relativeHumidity, pressureKPa };
  if (profile && profile.temperatureK.length > 0) {
    let hi = 0;
    let lo = 0;
    for (let i = 1; i < profile.temperatureK.length; i++) {
      if (profile.temperatureK[i] > profile.temperatureK[hi]) hi = i;
      if (profile.temperatureK[i] < profile.temperatureK[lo]) lo = i;
    }
    const at = (i: number) => ({
      temperatureK: profile.temperatureK[i],
      relativeHumidity: profile.relativeHumidity[i],
      pressureKPa: profile.pressureKPa ? profile.pressureKPa[i] : pressureKPa,
    });
    hot = at(hi);
    cold = at(lo);
  }
  return {
    ratingCurve: curve,
    hotDayKW: tryPoint(machine, hot)?.netPowerKW ?? null,
    hotDayK: hot.temperatureK,
    coldDayKW: tryPoint(machine, cold)?.netPowerKW ?? null,
    coldDayK: cold.temperatureK,
    requiredKW: machine.requiredKW,
    annual: profile && profile.temperatureK.length > 0 ? annualFigures(machine, profile, options) : null,
  };
}
