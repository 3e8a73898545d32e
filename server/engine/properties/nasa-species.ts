/**
 * Ideal-gas species data: NASA 9-coefficient polynomials.
 *
 * Source: McBride, Zehe & Gordon, "NASA Glenn Coefficients for Calculating Thermodynamic
 * Properties of Individual Species", NASA TP-2002-211556 (2002), the NASA Glenn
 * thermodynamic database; coefficients from memory. Their self-consistency is checked in
 * tests/engine/properties.test.ts: the two ranges of each set meet at 1000 K, and each set
 * gives the published formation enthalpy and third-law entropy at 298.15 K. Every set used here has two ranges, 200–1000 K and 1000–6000 K,
 * so all species share the 1000 K break:
 *
 *   cp/R  = a1 T⁻² + a2 T⁻¹ + a3 + a4 T + a5 T² + a6 T³ + a7 T⁴
 *   h/R   = −a1 T⁻¹ + a2 ln T + a3 T + a4 T²/2 + a5 T³/3 + a6 T⁴/4 + a7 T⁵/5 + b1
 *   s°/R  = −a1 T⁻²/2 − a2 T⁻¹ + a3 ln T + a4 T + a5 T²/2 + a6 T³/3 + a7 T⁴/4 + b2
 *
 * A 7-coefficient set in the form of McBride, Gordon & Reno (NASA TM-4513, 1993) is the
 * special case a1 = a2 = 0 (see fromSevenCoefficients). Each set carries its own absolute
 * reference, so sets of either form mix soundly: enthalpy is absolute, zero for the
 * elements in their reference states at 298.15 K, so h(298.15 K) of a compound is its
 * enthalpy of formation; s° is the third-law entropy at the standard pressure of 1 bar
 * (100 kPa).
 */

/** Universal gas constant, kJ/(kmol·K) (CODATA 2018, exact). */
export const UNIVERSAL_GAS_CONSTANT = 8.314462618;

/** Lower and upper limits of the polynomial data and their common break, K. */
export const POLYNOMIAL_MIN_K = 200;
export const POLYNOMIAL_BREAK_K = 1000;
export const POLYNOMIAL_MAX_K = 6000;

/** Standard-state pressure of the s° data, kPa. */
export const STANDARD_PRESSURE_KPA = 100;

/** Numbers per range: a1…a7, b1, b2. */
export const COEFFICIENTS_PER_RANGE = 9;

export type SpeciesName = 'N2' | 'O2' | 'Ar' | 'CO2' | 'H2O' | 'CH4' | 'H2';

export interface NasaSpecies {
  readonly name: SpeciesName;
  /** Molar mass, kg/kmol (IUPAC standard atomic weights). */
  readonly molarMass: number;
  /** a1…a7, b1, b2 for 200–1000 K. */
  readonly low: readonly number[];
  /** a1…a7, b1, b2 for 1000–6000 K. */
  readonly high: readonly number[];
}

/**
 * A 7-coefficient range a1…a7 (TM-4513 form: cp/R = a1 + a2 T + … + a5 T⁴, b1 = a6,
 * b2 = a7) written in the 9-coefficient form: [0, 0, a1, a2, a3, a4, a5, a6, a7].
 */
export function fromSevenCoefficients(a: readonly number[]): number[] {
  if (a.length !== 7) throw new RangeError('A 7-coefficient range has seven numbers.');
  return [0, 0, ...a];
}

/**
 * The one species index of the engine: mixtures hold their amounts in arrays in this order.
 * Modules that read amounts by species take their index from here (as local copies).
 */
export const SPECIES_INDEX = { N2: 0, O2: 1, Ar: 2, CO2: 3, H2O: 4, CH4: 5, H2: 6 } as const satisfies Record<
  SpeciesName,
  number
>;

/** Species in the order of SPECIES_INDEX. */
export const SPECIES_ORDER: readonly SpeciesName[] = ['N2', 'O2', 'Ar', 'CO2', 'H2O', 'CH4', 'H2'];

export const SPECIES: Readonly<Record<SpeciesName, NasaSpecies>> = {
  // N2, TP-2002-211556 set (from memory)
  N2: {
    name: 'N2',
    molarMass: 28.0134,
    low: [
      2.210371497e4, -3.81846182e2, 6.08273836, -8.53091441e-3, 1.384646189e-5, -9.62579362e-9, 2.519705809e-12,
      7.10846086e2, -1.076003744e1,
    ],
    high: [
      5.87712406e5, -2.239249073e3, 6.06694922, -6.1396855e-4, 1.491806679e-7, -1.923105485e-11, 1.061954386e-15,
      1.283210415e4, -1.586640027e1,
    ],
  },
  // O2, TP-2002-211556 set (from memory)
  O2: {
    name: 'O2',
    molarMass: 31.9988,
    low: [
      -3.42556342e4, 4.84700097e2, 1.119010961, 4.29388924e-3, -6.83630052e-7, -2.0233727e-9, 1.039040018e-12,
      -3.39145487e3, 1.84969947e1,
    ],
    high: [
      -1.037939022e6, 2.344830282e3, 1.819732036, 1.267847582e-3, -2.188067988e-7, 2.053719572e-11, -8.19346705e-16,
      -1.689010929e4, 1.738716506e1,
    ],
  },
  // Ar, TP-2002-211556 set (from memory). The low range
  // is exactly cp/R = 5/2 (monatomic); the high range carries the tiny electronic terms.
  Ar: {
    name: 'Ar',
    molarMass: 39.948,
    low: [0, 0, 2.5, 0, 0, 0, 0, -7.45375e2, 4.37967491],
    high: [
      2.010538475e1, -5.99266107e-2, 2.500069401, -3.99214116e-8, 1.20527214e-11, -1.819015576e-15, 1.078576636e-19,
      -7.44993961e2, 4.37918011,
    ],
  },
  // CO2, TP-2002-211556 set (from memory)
  CO2: {
    name: 'CO2',
    molarMass: 44.0095,
    low: [
      4.94365054e4, -6.26411601e2, 5.30172524, 2.503813816e-3, -2.127308728e-7, -7.68998878e-10, 2.849677801e-13,
      -4.52819846e4, -7.04827944,
    ],
    high: [
      1.176962419e5, -1.788791477e3, 8.29152319, -9.22315678e-5, 4.86367688e-9, -1.891053312e-12, 6.33003659e-16,
      -3.90835059e4, -2.652669281e1,
    ],
  },
  // H2O (gas), TP-2002-211556 set (from memory)
  H2O: {
    name: 'H2O',
    molarMass: 18.01528,
    low: [
      -3.94796083e4, 5.75573102e2, 9.31782653e-1, 7.22271286e-3, -7.34255737e-6, 4.95504349e-9, -1.336933246e-12,
      -3.30397431e4, 1.724205775e1,
    ],
    high: [
      1.034972096e6, -2.412698562e3, 4.64611078, 2.291998307e-3, -6.83683048e-7, 9.42646893e-11, -4.82238053e-15,
      -1.384286509e4, -7.97814851,
    ],
  },
  // CH4, TP-2002-211556 set (from memory)
  CH4: {
    name: 'CH4',
    molarMass: 16.04246,
    low: [
      -1.766850998e5, 2.78618102e3, -1.20257785e1, 3.91761929e-2, -3.61905443e-5, 2.026853043e-8, -4.97670549e-12,
      -2.33131436e4, 8.90432275e1,
    ],
    high: [
      3.73004276e6, -1.383501485e4, 2.049107091e1, -1.961974759e-3, 4.72731304e-7, -3.72881469e-11, 1.623737207e-15,
      7.53206691e4, -1.219124889e2,
    ],
  },
  // H2, TP-2002-211556 set (from memory)
  H2: {
    name: 'H2',
    molarMass: 2.01588,
    low: [
      4.07832321e4, -8.00918604e2, 8.21470201, -1.269714457e-2, 1.753605076e-5, -1.20286027e-8, 3.36809349e-12,
      2.682484665e3, -3.043788844e1,
    ],
    high: [
      5.60812801e5, -8.37150474e2, 2.975364532, 1.252249124e-3, -3.74071619e-7, 5.9366252e-11, -3.6069941e-15,
      5.33982441e3, -2.202774769,
    ],
  },
};

function coefficientsAt(species: NasaSpecies, temperatureK: number): readonly number[] {
  return temperatureK < POLYNOMIAL_BREAK_K ? species.low : species.high;
}

/** Molar cp, kJ/(kmol·K), from the 9-term polynomial above. Valid 200–6000 K. */
export function speciesMolarCp(name: SpeciesName, temperatureK: number): number {
  const a = coefficientsAt(SPECIES[name], temperatureK);
  const t = temperatureK;
  const u = 1 / t;
  return UNIVERSAL_GAS_CONSTANT * ((a[0] * u + a[1]) * u + a[2] + t * (a[3] + t * (a[4] + t * (a[5] + t * a[6]))));
}

/** Molar absolute enthalpy, kJ/kmol (elements zero at 298.15 K). Valid 200–6000 K. */
export function speciesMolarEnthalpy(name: SpeciesName, temperatureK: number): number {
  const a = coefficientsAt(SPECIES[name], temperatureK);
  const t = temperatureK;
  return (
    UNIVERSAL_GAS_CONSTANT *
    (-a[0] / t +
      a[1] * Math.log(t) +
      t * (a[2] + t * (a[3] / 2 + t * (a[4] / 3 + t * (a[5] / 4 + t * (a[6] / 5))))) +
      a[7])
  );
}

/** Molar standard-state entropy s°(T) at 100 kPa, kJ/(kmol·K). Valid 200–6000 K. */
export function speciesMolarEntropy(name: SpeciesName, temperatureK: number): number {
  const a = coefficientsAt(SPECIES[name], temperatureK);
  const t = temperatureK;
  const u = 1 / t;
  return (
    UNIVERSAL_GAS_CONSTANT *
    (((-a[0] / 2) * u - a[1]) * u +
      a[2] * Math.log(t) +
      t * (a[3] + t * (a[4] / 2 + t * (a[5] / 3 + t * (a[6] / 4)))) +
      a[8])
  );
}

/** Enthalpy of formation at 298.15 K, kJ/kmol, read from the same polynomials. */
export function enthalpyOfFormation(name: SpeciesName): number {
  return speciesMolarEnthalpy(name, 298.15);
}
