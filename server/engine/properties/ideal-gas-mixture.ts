import type { GasModel } from './gas-model';
import {
  POLYNOMIAL_BREAK_K,
  SPECIES,
  SPECIES_ORDER,
  STANDARD_PRESSURE_KPA,
  UNIVERSAL_GAS_CONSTANT,
} from './nasa-species';

/** Amount of each species, kmol, in SPECIES_ORDER (N2, O2, Ar, CO2, H2O, CH4, H2). */
export type SpeciesAmounts = ArrayLike<number>;

export const SPECIES_COUNT = 7;

// Module-local copies of the species data. The hot paths below read these instead of the
// imported bindings: a transpiled import is a property getter on every read, which cost
// more than the arithmetic itself.
const MOLAR_MASSES = Float64Array.from(SPECIES_ORDER, (name) => SPECIES[name].molarMass);
/** Ru × [low a1…a7, high a1…a7] per species, kJ/(kmol·K) units. */
const MOLAR_COEFFICIENTS = SPECIES_ORDER.map((name) => {
  const c = new Float64Array(14);
  for (let k = 0; k < 7; k++) {
    c[k] = UNIVERSAL_GAS_CONSTANT * SPECIES[name].low[k];
    c[7 + k] = UNIVERSAL_GAS_CONSTANT * SPECIES[name].high[k];
  }
  return c;
});
const BREAK_K = POLYNOMIAL_BREAK_K;
const RU = UNIVERSAL_GAS_CONSTANT;
const P0_KPA = STANDARD_PRESSURE_KPA;

/** Bounds of the temperature inversions, K: wide enough to reach just past the data range,
 * so a state outside 200–6000 K is found and then reported by the cycle, not hidden. */
const INVERSION_MIN_K = 50;
const INVERSION_MAX_K = 20000;
const INVERSION_RELATIVE_TOLERANCE = 1e-12;

/** Mass of the amounts, kg. */
export function massOfAmounts(amounts: SpeciesAmounts): number {
  let massKg = 0;
  for (let i = 0; i < SPECIES_COUNT; i++) massKg += amounts[i] * MOLAR_MASSES[i];
  return massKg;
}

/**
 * The polynomial of a set of amounts: since cp/R is linear in the coefficients, Σ nᵢ cpᵢ,
 * Σ nᵢ hᵢ and Σ nᵢ s°ᵢ are each one 7-coefficient polynomial per range. Returns the 14
 * numbers Σ nᵢ Ru aᵢ [low a1…a7, high a1…a7] (kJ, kJ/K units). Negative amounts are
 * allowed (a change of composition, such as one kg of fuel burnt).
 */
export function extensiveCoefficients(amounts: SpeciesAmounts): Float64Array {
  const coefficients = new Float64Array(14);
  for (let i = 0; i < SPECIES_COUNT; i++) {
    const n = amounts[i];
    if (n === 0) continue;
    const c = MOLAR_COEFFICIENTS[i];
    for (let k = 0; k < 14; k++) coefficients[k] += n * c[k];
  }
  return coefficients;
}

/**
 * Total enthalpy Σ nᵢ hᵢ(T), kJ, from extensive coefficients (see extensiveCoefficients).
 * Valid 200–6000 K.
 */
export function enthalpyOfCoefficients(coefficients: ArrayLike<number>, temperatureK: number): number {
  const o = temperatureK < BREAK_K ? 0 : 7;
  const c = coefficients;
  const t = temperatureK;
  return t * (c[o] + t * (c[o + 1] / 2 + t * (c[o + 2] / 3 + t * (c[o + 3] / 4 + t * (c[o + 4] / 5))))) + c[o + 5];
}

/**
 * An ideal-gas mixture of fixed composition with NASA 7-coefficient species data
 * (see nasa-species.ts; valid 200–6000 K). Properties per kg of mixture.
 * Reference states: enthalpy absolute (elements zero at 298.15 K, so formation enthalpies
 * included); entropy absolute (third law) at 100 kPa, including the ideal entropy of
 * mixing −R Σ xᵢ ln xᵢ, so states of different composition sit on one entropy scale.
 */
export class IdealGasMixture implements GasModel {
  readonly molarMassKgPerKmol: number;
  readonly gasConstantKJPerKgK: number;
  /** Mole fractions in SPECIES_ORDER. */
  readonly moleFractions: readonly number[];
  // Coefficients pre-divided for h and s° per range, so evaluation is one Horner chain:
  // h = T(b1 + T(b2 + T(b3 + T(b4 + T b5)))) + b6; s° = b1 ln T + T(c2 + T(c3 + T(c4 + T c5))) + c7.
  private readonly cpLow: number[];
  private readonly cpHigh: number[];
  private readonly hLow: number[];
  private readonly hHigh: number[];
  private readonly sLow: number[];
  private readonly sHigh: number[];

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
    const fractions: number[] = [];
    let mixingEntropy = 0;
    for (let i = 0; i < SPECIES_COUNT; i++) {
      const x = amounts[i] / total;
      fractions.push(x);
      if (x > 0) mixingEntropy -= x * Math.log(x);
    }
    this.moleFractions = fractions;
    mixingEntropy *= this.gasConstantKJPerKgK;
    // Written out as array literals (no helper closures, no typed arrays): this runs once
    // per burner in every evaluation, and small literal arrays are the cheapest to allocate.
    const k = 1 / mass;
    this.cpLow = [c[0] * k, c[1] * k, c[2] * k, c[3] * k, c[4] * k];
    this.cpHigh = [c[7] * k, c[8] * k, c[9] * k, c[10] * k, c[11] * k];
    this.hLow = [c[0] * k, (c[1] * k) / 2, (c[2] * k) / 3, (c[3] * k) / 4, (c[4] * k) / 5, c[5] * k];
    this.hHigh = [c[7] * k, (c[8] * k) / 2, (c[9] * k) / 3, (c[10] * k) / 4, (c[11] * k) / 5, c[12] * k];
    this.sLow = [c[0] * k, c[1] * k, (c[2] * k) / 2, (c[3] * k) / 3, (c[4] * k) / 4, c[6] * k + mixingEntropy];
    this.sHigh = [c[7] * k, c[8] * k, (c[9] * k) / 2, (c[10] * k) / 3, (c[11] * k) / 4, c[13] * k + mixingEntropy];
  }

  /** cp(T), kJ/(kg·K). Valid 200–6000 K. */
  cpKJPerKgK(temperatureK: number): number {
    const c = temperatureK < BREAK_K ? this.cpLow : this.cpHigh;
    const t = temperatureK;
    return c[0] + t * (c[1] + t * (c[2] + t * (c[3] + t * c[4])));
  }

  /** Absolute h(T), kJ/kg. Valid 200–6000 K. */
  enthalpyKJPerKg(temperatureK: number): number {
    const c = temperatureK < BREAK_K ? this.hLow : this.hHigh;
    const t = temperatureK;
    return t * (c[0] + t * (c[1] + t * (c[2] + t * (c[3] + t * c[4])))) + c[5];
  }

  /** Absolute s°(T) at 100 kPa with mixing, kJ/(kg·K). Valid 200–6000 K. */
  standardEntropyKJPerKgK(temperatureK: number): number {
    const c = temperatureK < BREAK_K ? this.sLow : this.sHigh;
    const t = temperatureK;
    return c[0] * Math.log(t) + t * (c[1] + t * (c[2] + t * (c[3] + t * c[4]))) + c[5];
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
  // closures because it runs a dozen times per cycle evaluation.
  private invert(target: number, guessK: number, entropy: boolean): number {
    let lo = INVERSION_MIN_K;
    let hi = INVERSION_MAX_K;
    let t = guessK > lo && guessK < hi ? guessK : 800;
    for (let iteration = 0; iteration < 200; iteration++) {
      const value = entropy ? this.standardEntropyKJPerKgK(t) : this.enthalpyKJPerKg(t);
      const residual = value - target;
      if (residual > 0) hi = t;
      else lo = t;
      if (residual === 0) return t;
      const slope = entropy ? this.cpKJPerKgK(t) / t : this.cpKJPerKgK(t);
      let next = t - residual / slope;
      // Converged once the Newton step is at rounding level, whichever side it falls on.
      if (Math.abs(next - t) <= INVERSION_RELATIVE_TOLERANCE * t) return next;
      if (!(next > lo && next < hi) || !(slope > 0)) next = 0.5 * (lo + hi);
      if (hi - lo <= INVERSION_RELATIVE_TOLERANCE * t) return 0.5 * (lo + hi);
      t = next;
    }
    return t;
  }
}
