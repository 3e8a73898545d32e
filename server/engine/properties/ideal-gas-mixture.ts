import type { GasModel } from './gas-model';
import {
  COEFFICIENTS_PER_RANGE,
  POLYNOMIAL_BREAK_K,
  SPECIES,
  SPECIES_ORDER,
  STANDARD_PRESSURE_KPA,
  UNIVERSAL_GAS_CONSTANT,
} from './nasa-species';
import * as propertyPolynomial from './property-polynomial';
import type { Polynomial } from './property-polynomial';

/** Amount of each species, kmol, in SPECIES_ORDER (N2, O2, Ar, CO2, H2O, CH4, H2). */
export type SpeciesAmounts = ArrayLike<number>;

export const SPECIES_COUNT = SPECIES_ORDER.length;

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
// Local copies of the imported functions, for the same reason: the methods below call them.
const {
  cpOf,
  enthalpyOf,
  fillPolynomial,
  newPolynomial,
  standardEntropyOf,
  temperatureFromEnthalpyOf,
  temperatureFromStandardEntropyOf,
} = propertyPolynomial;
const BREAK_K = POLYNOMIAL_BREAK_K;
const RU = UNIVERSAL_GAS_CONSTANT;
const P0_KPA = STANDARD_PRESSURE_KPA;
const HIGH = COEFFICIENTS_PER_RANGE;

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

/**
 * An ideal-gas mixture of fixed composition with NASA 9-coefficient species data
 * (see nasa-species.ts; valid 200–6000 K). Properties per kg of mixture.
 * Reference states: enthalpy absolute (elements zero at 298.15 K, so formation enthalpies
 * included); entropy absolute (third law) at 100 kPa, including the ideal entropy of
 * mixing −R Σ xᵢ ln xᵢ, so states of different composition sit on one entropy scale.
 */
export class IdealGasMixture implements GasModel {
  molarMassKgPerKmol = 0;
  gasConstantKJPerKgK = 0;
  /** The specific properties as one property polynomial (see property-polynomial.ts), kJ/kg units. */
  readonly polynomial: Polynomial = newPolynomial();

  /**
   * `amounts`: kmol of each species in SPECIES_ORDER, none negative, sum positive.
   * `coefficients` and `massKg` may be passed when already known (extensiveCoefficients
   * and massOfAmounts of the same amounts), as the burner does.
   */
  constructor(amounts: SpeciesAmounts, coefficients?: ArrayLike<number>, massKg?: number) {
    this.setComposition(amounts, coefficients, massKg);
  }

  /**
   * Makes this mixture one of other amounts, in place (arguments as for the constructor).
   * For scratch mixtures that the cycle reuses from one evaluation to the next: a new
   * mixture allocates its polynomial, which costs more than filling it.
   */
  setComposition(amounts: SpeciesAmounts, coefficients?: ArrayLike<number>, massKg?: number): void {
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
    fillPolynomial(this.polynomial, c, 1 / mass, mixingEntropy * this.gasConstantKJPerKgK);
  }

  /** cp(T) = R (a1 T⁻² + a2 T⁻¹ + a3 + a4 T + … + a7 T⁴), kJ/(kg·K). Valid 200–6000 K. */
  cpKJPerKgK(temperatureK: number): number {
    return cpOf(this.polynomial, temperatureK);
  }

  /** Absolute h(T), kJ/kg (form in nasa-species.ts). Valid 200–6000 K. */
  enthalpyKJPerKg(temperatureK: number): number {
    return enthalpyOf(this.polynomial, temperatureK);
  }

  /** Absolute s°(T) at 100 kPa with mixing, kJ/(kg·K). Valid 200–6000 K. */
  standardEntropyKJPerKgK(temperatureK: number): number {
    return standardEntropyOf(this.polynomial, temperatureK);
  }

  /** s(T, p) = s°(T) − R ln(p / 100 kPa), kJ/(kg·K). */
  entropyKJPerKgK(temperatureK: number, pressureKPa: number): number {
    return standardEntropyOf(this.polynomial, temperatureK) - this.gasConstantKJPerKgK * Math.log(pressureKPa / P0_KPA);
  }

  /**
   * T(h) by safeguarded Halley steps (see property-polynomial.ts), to 1e-12 relative; two
   * or three steps from a guess within a few hundred kelvin.
   */
  temperatureFromEnthalpy(enthalpyKJPerKg: number, guessK = 800): number {
    return temperatureFromEnthalpyOf(this.polynomial, enthalpyKJPerKg, guessK);
  }

  /** T(s°) by the same safeguarded iteration (ds°/dT = cp / T > 0). */
  temperatureFromStandardEntropy(standardEntropyKJPerKgK: number, guessK = 800): number {
    return temperatureFromStandardEntropyOf(this.polynomial, standardEntropyKJPerKgK, guessK);
  }
}
