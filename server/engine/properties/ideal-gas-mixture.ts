import type { GasModel } from './gas-model';
import {
  COEFFICIENTS_PER_RANGE,
  POLYNOMIAL_BREAK_K,
  SPECIES,
  SPECIES_ORDER,
  STANDARD_PRESSURE_KPA,
  UNIVERSAL_GAS_CONSTANT,
} from './nasa-species';

/** Amount of each species, kmol, in SPECIES_ORDER (N2, O2, Ar, CO2, H2O, CH4, H2). */
export type SpeciesAmounts = ArrayLike<number>;

export const SPECIES_COUNT = 7;

/** Length of an extensive coefficient set: 9 numbers (a1…a7, b1, b2) for each of two ranges. */
export const EXTENSIVE_LENGTH = 2 * COEFFICIENTS_PER_RANGE;

// Module-local copies of the species data. The hot paths below read these instead of the
// imported bindings: a transpiled import is a property getter on every read, which cost
// more than the arithmetic itself.
const MOLAR_MASSES = Float64Array.from(SPECIES_ORDER, (name) => SPECIES[name].molarMass);
/** Ru × [low a1…a7 b1 b2, high a1…a7 b1 b2] per species, kJ/(kmol·K) units. */
const MOLAR_COEFFICIENTS = SPECIES_ORDER.map((name) => {
  const c = new Float64Array(EXTENSIVE_LENGTH);
  for (let k = 0; k < COEFFICIENTS_PER_RANGE; k++) {
    c[k] = UNIVERSAL_GAS_CONSTANT * SPECIES[name].low[k];
    c[COEFFICIENTS_PER_RANGE + k] = UNIVERSAL_GAS_CONSTANT * SPECIES[name].high[k];
  }
  return c;
});
const BREAK_K = POLYNOMIAL_BREAK_K;
const RU = UNIVERSAL_GAS_CONSTANT;
const P0_KPA = STANDARD_PRESSURE_KPA;
const HIGH = COEFFICIENTS_PER_RANGE;

/** Bounds of the temperature inversions, K: wide enough to reach just past the data range,
 * so a state outside 200–6000 K is found and then reported by the cycle, not hidden. */
const INVERSION_MIN_K = 50;
const INVERSION_MAX_K = 20000;
const INVERSION_RELATIVE_TOLERANCE = 1e-12;
const ACCEPT_STEP_RELATIVE = 1e-6;

/** Mass of the amounts, kg. */
export function massOfAmounts(amounts: SpeciesAmounts): number {
  let massKg = 0;
  for (let i = 0; i < SPECIES_COUNT; i++) massKg += amounts[i] * MOLAR_MASSES[i];
  return massKg;
}

/**
 * The polynomial of a set of amounts: since cp/R is linear in the coefficients, Σ nᵢ cpᵢ,
 * Σ nᵢ hᵢ and Σ nᵢ s°ᵢ are each one 9-coefficient polynomial per range. Returns the 18
 * numbers Σ nᵢ Ru aᵢ [low a1…a7 b1 b2, high a1…a7 b1 b2] (kJ, kJ/K units). Negative
 * amounts are allowed (a change of composition, such as one kg of fuel burnt).
 */
export function extensiveCoefficients(amounts: SpeciesAmounts): Float64Array {
  const coefficients = new Float64Array(EXTENSIVE_LENGTH);
  for (let i = 0; i < SPECIES_COUNT; i++) {
    const n = amounts[i];
    if (n === 0) continue;
    const c = MOLAR_COEFFICIENTS[i];
    for (let k = 0; k < EXTENSIVE_LENGTH; k++) coefficients[k] += n * c[k];
  }
  return coefficients;
}

/**
 * Total enthalpy Σ nᵢ hᵢ(T), kJ, from extensive coefficients (see extensiveCoefficients):
 * H = −a1/T + a2 ln T + a3 T + a4 T²/2 + a5 T³/3 + a6 T⁴/4 + a7 T⁵/5 + b1. Valid 200–6000 K.
 */
export function enthalpyOfCoefficients(coefficients: ArrayLike<number>, temperatureK: number): number {
  const o = temperatureK < BREAK_K ? 0 : HIGH;
  const c = coefficients;
  const t = temperatureK;
  return (
    -c[o] / t +
    c[o + 1] * Math.log(t) +
    t * (c[o + 2] + t * (c[o + 3] / 2 + t * (c[o + 4] / 3 + t * (c[o + 5] / 4 + t * (c[o + 6] / 5))))) +
    c[o + 7]
  );
}

// Layout of the per-kg numbers of one range in IdealGasMixture, pre-divided so each
// property is one Horner chain (u = 1/T):
//   cp = (p0 u + p1) u + p2 + T(p3 + T(p4 + T(p5 + T p6)))
//   h  = p7 u + p8 ln T + T(p9 + T(p10 + T(p11 + T(p12 + T p13)))) + p14
//   s° = (p15 u + p16) u + p17 ln T + T(p18 + T(p19 + T(p20 + T p21))) + p22
const RANGE_LENGTH = 23;

function perKgRange(c: ArrayLike<number>, o: number, k: number, mixingEntropy: number): number[] {
  const a1 = c[o] * k;
  const a2 = c[o + 1] * k;
  const a3 = c[o + 2] * k;
  const a4 = c[o + 3] * k;
  const a5 = c[o + 4] * k;
  const a6 = c[o + 5] * k;
  const a7 = c[o + 6] * k;
  // One array literal: this runs once per burner in every evaluation, and a small literal
  // array is the cheapest thing to allocate and to read back.
  return [
    a1, a2, a3, a4, a5, a6, a7,
    -a1, a2, a3, a4 / 2, a5 / 3, a6 / 4, a7 / 5, c[o + 7] * k,
    -a1 / 2, -a2, a3, a4, a5 / 2, a6 / 3, a7 / 4, c[o + 8] * k + mixingEntropy,
  ];
}

/**
 * An ideal-gas mixture of fixed composition with NASA 9-coefficient species data
 * (see nasa-species.ts; valid 200–6000 K). Properties per kg of mixture.
 * Reference states: enthalpy absolute (elements zero at 298.15 K, so formation enthalpies
 * included); entropy absolute (third law) at 100 kPa, including the ideal entropy of
 * mixing −R Σ xᵢ ln xᵢ, so states of different composition sit on one entropy scale.
 */
export class IdealGasMixture implements GasModel {
  readonly molarMassKgPerKmol: number;
  readonly gasConstantKJPerKgK: number;
  private readonly low: number[];
  private readonly high: number[];

  /**
   * `amounts`: kmol of each species in SPECIES_ORDER, none negative, sum positive.
   * `coefficients` and `massKg` may be passed when already known (extensiveCoefficients
   * and massOfAmounts of the same amounts), as the burner does.
   */
  constructor(amounts: SpeciesAmounts, coefficients?: ArrayLike<number>, massKg?: number) {
    let total = 0;
    for (let i = 0; i < SPECIES_COUNT; i++) {
      if (!(amounts[i] >= 0)) throw new RangeError('Species amounts must be zero or positive.');
      total += amounts[i];
    }
    if (!(total > 0)) throw new RangeError('A mixture needs a positive amount of gas.');
    const mass = massKg ?? massOfAmounts(amounts);
    const c = coefficients ?? extensiveCoefficients(amounts);
    this.molarMassKgPerKmol = mass / total;
    this.gasConstantKJPerKgK = RU / this.molarMassKgPerKmol;
    let mixingEntropy = 0;
    for (let i = 0; i < SPECIES_COUNT; i++) {
      const x = amounts[i] / total;
      if (x > 0) mixingEntropy -= x * Math.log(x);
    }
    mixingEntropy *= this.gasConstantKJPerKgK;
    const k = 1 / mass;
    this.low = perKgRange(c, 0, k, mixingEntropy);
    this.high = perKgRange(c, HIGH, k, mixingEntropy);
  }

  /** cp(T) = R (a1 T⁻² + a2 T⁻¹ + a3 + a4 T + … + a7 T⁴), kJ/(kg·K). Valid 200–6000 K. */
  cpKJPerKgK(temperatureK: number): number {
    const c = temperatureK < BREAK_K ? this.low : this.high;
    const t = temperatureK;
    const u = 1 / t;
    return (c[0] * u + c[1]) * u + c[2] + t * (c[3] + t * (c[4] + t * (c[5] + t * c[6])));
  }

  /** Absolute h(T), kJ/kg (form in nasa-species.ts). Valid 200–6000 K. */
  enthalpyKJPerKg(temperatureK: number): number {
    const c = temperatureK < BREAK_K ? this.low : this.high;
    const t = temperatureK;
    return c[7] / t + c[8] * Math.log(t) + t * (c[9] + t * (c[10] + t * (c[11] + t * (c[12] + t * c[13])))) + c[14];
  }

  /** Absolute s°(T) at 100 kPa with mixing, kJ/(kg·K). Valid 200–6000 K. */
  standardEntropyKJPerKgK(temperatureK: number): number {
    const c = temperatureK < BREAK_K ? this.low : this.high;
    const t = temperatureK;
    const u = 1 / t;
    return (c[15] * u + c[16]) * u + c[17] * Math.log(t) + t * (c[18] + t * (c[19] + t * (c[20] + t * c[21]))) + c[22];
  }

  /** s(T, p) = s°(T) − R ln(p / 100 kPa), kJ/(kg·K). */
  entropyKJPerKgK(temperatureK: number, pressureKPa: number): number {
    return this.standardEntropyKJPerKgK(temperatureK) - this.gasConstantKJPerKgK * Math.log(pressureKPa / P0_KPA);
  }

  /**
   * T(h) by Newton's method (dh/dT = cp > 0), kept inside a bracket that shrinks with every
   * step, falling back to bisection if a step leaves it. Converges to 1e-12 relative (or better) in
   * two or three steps from a guess within a few hundred kelvin.
   */
  temperatureFromEnthalpy(enthalpyKJPerKg: number, guessK = 800): number {
    return this.invert(enthalpyKJPerKg, guessK, false);
  }

  /** T(s°) by the same safeguarded Newton iteration (ds°/dT = cp / T > 0). */
  temperatureFromStandardEntropy(standardEntropyKJPerKgK: number, guessK = 800): number {
    return this.invert(standardEntropyKJPerKgK, guessK, true);
  }

  // One loop for both inversions; written out rather than through a generic solver with
  // closures because it runs a dozen times per cycle evaluation. Value and slope come from
  // one pass over the coefficients (sharing 1/T and ln T), the costly part of each step.
  private invert(target: number, guessK: number, entropy: boolean): number {
    let lo = INVERSION_MIN_K;
    let hi = INVERSION_MAX_K;
    let t = guessK > lo && guessK < hi ? guessK : 800;
    for (let iteration = 0; iteration < 200; iteration++) {
      const c = t < BREAK_K ? this.low : this.high;
      const u = 1 / t;
      const lnT = Math.log(t);
      const cp = (c[0] * u + c[1]) * u + c[2] + t * (c[3] + t * (c[4] + t * (c[5] + t * c[6])));
      let value: number;
      let slope: number;
      if (entropy) {
        value = (c[15] * u + c[16]) * u + c[17] * lnT + t * (c[18] + t * (c[19] + t * (c[20] + t * c[21]))) + c[22];
        slope = cp * u;
      } else {
        value = c[7] * u + c[8] * lnT + t * (c[9] + t * (c[10] + t * (c[11] + t * (c[12] + t * c[13])))) + c[14];
        slope = cp;
      }
      const residual = value - target;
      if (residual > 0) hi = t;
      else lo = t;
      if (residual === 0) return t;
      let next = t - residual / slope;
      // Newton converges quadratically: after a step δ the error is about κ δ², with
      // κ = |f''/2f'| below 3e-3 /K for h and s° over 200–6000 K. A step under 1e-6 T thus
      // leaves an error below 1e-12 T, so the step is taken and accepted without one more
      // evaluation to confirm it (unless it crosses the 1000 K break, where the other range's
      // polynomial takes over).
      if (Math.abs(next - t) <= ACCEPT_STEP_RELATIVE * t && next > lo && next < hi && next < BREAK_K === t < BREAK_K) return next;
      if (Math.abs(next - t) <= INVERSION_RELATIVE_TOLERANCE * t) return next;
      if (!(next > lo && next < hi) || !(slope > 0)) next = 0.5 * (lo + hi);
      if (hi - lo <= INVERSION_RELATIVE_TOLERANCE * t) return 0.5 * (lo + hi);
      t = next;
    }
    return t;
  }
}
