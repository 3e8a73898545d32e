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

export const SPECIES_COUNT = SPECIES_ORDER.length;
const MOLAR_MASSES = SPECIES_ORDER.map((name) => SPECIES[name].molarMass);

/** Bounds of the temperature inversions, K: wide enough to reach just past the data range,
 * so a state outside 200–6000 K is found and then reported by the cycle, not hidden. */
const INVERSION_MIN_K = 50;
const INVERSION_MAX_K = 20000;
const INVERSION_RELATIVE_TOLERANCE = 1e-13;

/**
 * Collapses the species polynomials of an amount vector into one set per range, on the
 * basis of the vector's total mass: since cp/R is linear in the coefficients, a mixture's
 * cp, h and s° (without the mixing term) are a single 7-coefficient polynomial.
 * Returns the 14 numbers scaled to kJ/kg units: [low a1…a7, high a1…a7] × Ru / mass.
 * Negative amounts are allowed here (a change of composition, such as one kg of fuel burnt).
 */
export function collapseCoefficients(amounts: SpeciesAmounts): { coefficients: Float64Array; massKg: number } {
  let massKg = 0;
  for (let i = 0; i < SPECIES_COUNT; i++) massKg += amounts[i] * MOLAR_MASSES[i];
  const coefficients = new Float64Array(14);
  for (let i = 0; i < SPECIES_COUNT; i++) {
    const n = amounts[i];
    if (n === 0) continue;
    const species = SPECIES[SPECIES_ORDER[i]];
    for (let k = 0; k < 7; k++) {
      coefficients[k] += n * species.low[k];
      coefficients[7 + k] += n * species.high[k];
    }
  }
  const scale = UNIVERSAL_GAS_CONSTANT / massKg;
  for (let k = 0; k < 14; k++) coefficients[k] *= scale;
  return { coefficients, massKg };
}

/**
 * Total enthalpy Σ nᵢ hᵢ(T), kJ, of a collapsed set (see collapseCoefficients) multiplied back
 * by its mass: the enthalpy of the amounts themselves. Valid 200–6000 K.
 */
export function enthalpyOfCoefficients(coefficients: Float64Array, temperatureK: number): number {
  const o = temperatureK < POLYNOMIAL_BREAK_K ? 0 : 7;
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
  private readonly cpLow: Float64Array;
  private readonly cpHigh: Float64Array;
  private readonly hLow: Float64Array;
  private readonly hHigh: Float64Array;
  private readonly sLow: Float64Array;
  private readonly sHigh: Float64Array;

  /** `amounts`: kmol of each species in SPECIES_ORDER, none negative, sum positive. */
  constructor(amounts: SpeciesAmounts) {
    let total = 0;
    for (let i = 0; i < SPECIES_COUNT; i++) {
      if (!(amounts[i] >= 0)) throw new RangeError('Species amounts must be zero or positive.');
      total += amounts[i];
    }
    if (!(total > 0)) throw new RangeError('A mixture needs a positive amount of gas.');
    const { coefficients, massKg } = collapseCoefficients(amounts);
    this.molarMassKgPerKmol = massKg / total;
    this.gasConstantKJPerKgK = UNIVERSAL_GAS_CONSTANT / this.molarMassKgPerKmol;
    const fractions: number[] = [];
    let mixingEntropy = 0;
    for (let i = 0; i < SPECIES_COUNT; i++) {
      const x = amounts[i] / total;
      fractions.push(x);
      if (x > 0) mixingEntropy -= x * Math.log(x);
    }
    this.moleFractions = fractions;
    mixingEntropy *= this.gasConstantKJPerKgK;
    const split = (o: number) => {
      const a = coefficients.subarray(o, o + 7);
      return {
        cp: Float64Array.of(a[0], a[1], a[2], a[3], a[4]),
        h: Float64Array.of(a[0], a[1] / 2, a[2] / 3, a[3] / 4, a[4] / 5, a[5]),
        s: Float64Array.of(a[0], a[1], a[2] / 2, a[3] / 3, a[4] / 4, a[6] + mixingEntropy),
      };
    };
    const low = split(0);
    const high = split(7);
    this.cpLow = low.cp;
    this.cpHigh = high.cp;
    this.hLow = low.h;
    this.hHigh = high.h;
    this.sLow = low.s;
    this.sHigh = high.s;
  }

  /** cp(T), kJ/(kg·K). Valid 200–6000 K. */
  cpKJPerKgK(temperatureK: number): number {
    const c = temperatureK < POLYNOMIAL_BREAK_K ? this.cpLow : this.cpHigh;
    const t = temperatureK;
    return c[0] + t * (c[1] + t * (c[2] + t * (c[3] + t * c[4])));
  }

  /** Absolute h(T), kJ/kg. Valid 200–6000 K. */
  enthalpyKJPerKg(temperatureK: number): number {
    const c = temperatureK < POLYNOMIAL_BREAK_K ? this.hLow : this.hHigh;
    const t = temperatureK;
    return t * (c[0] + t * (c[1] + t * (c[2] + t * (c[3] + t * c[4])))) + c[5];
  }

  /** Absolute s°(T) at 100 kPa with mixing, kJ/(kg·K). Valid 200–6000 K. */
  standardEntropyKJPerKgK(temperatureK: number): number {
    const c = temperatureK < POLYNOMIAL_BREAK_K ? this.sLow : this.sHigh;
    const t = temperatureK;
    return c[0] * Math.log(t) + t * (c[1] + t * (c[2] + t * (c[3] + t * c[4]))) + c[5];
  }

  /** s(T, p) = s°(T) − R ln(p / 100 kPa), kJ/(kg·K). */
  entropyKJPerKgK(temperatureK: number, pressureKPa: number): number {
    return this.standardEntropyKJPerKgK(temperatureK) - this.gasConstantKJPerKgK * Math.log(pressureKPa / STANDARD_PRESSURE_KPA);
  }

  /**
   * T(h) by Newton's method (dh/dT = cp > 0), kept inside a bracket that shrinks with every
   * step, falling back to bisection if a step leaves it. Converges to 1e-13 relative in
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
      const slope = entropy ? this.cpKJPerKgK(t) / t : this.cpKJPerKgK(t);
      let next = t - residual / slope;
      if (!(next > lo && next < hi) || !(slope > 0)) next = 0.5 * (lo + hi);
      if (Math.abs(next - t) <= INVERSION_RELATIVE_TOLERANCE * t) return next;
      if (hi - lo <= INVERSION_RELATIVE_TOLERANCE * t) return 0.5 * (lo + hi);
      t = next;
    }
    return t;
  }
}
