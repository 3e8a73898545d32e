/**
 * Ideal-gas species data: NASA 7-coefficient polynomials.
 *
 * Source: the NASA Lewis (Glenn) 7-coefficient sets in the form of McBride, Gordon & Reno,
 * "Coefficients for Calculating Thermodynamic and Transport Properties of Individual
 * Species", NASA TM-4513 (1993), as reprinted in the Burcat–Ruscic thermochemical
 * compilation; the record identifier of each set is kept beside it. Every set has two
 * ranges, 200–1000 K and 1000–6000 K, so all species share the 1000 K break:
 *
 *   cp/R  = a1 + a2 T + a3 T² + a4 T³ + a5 T⁴
 *   h/RT  = a1 + a2 T/2 + a3 T²/3 + a4 T³/4 + a5 T⁴/5 + a6/T
 *   s°/R  = a1 ln T + a2 T + a3 T²/2 + a4 T³/3 + a5 T⁴/4 + a7
 *
 * Enthalpy is absolute: zero for the elements in their reference states at 298.15 K, so
 * h(298.15 K) of a compound is its enthalpy of formation. s° is the third-law entropy at
 * the standard pressure of 1 bar (100 kPa).
 */

/** Universal gas constant, kJ/(kmol·K) (CODATA 2018, exact). */
export const UNIVERSAL_GAS_CONSTANT = 8.314462618;

/** Lower and upper limits of the polynomial data and their common break, K. */
export const POLYNOMIAL_MIN_K = 200;
export const POLYNOMIAL_BREAK_K = 1000;
export const POLYNOMIAL_MAX_K = 6000;

/** Standard-state pressure of the s° data, kPa. */
export const STANDARD_PRESSURE_KPA = 100;

export type SpeciesName = 'N2' | 'O2' | 'Ar' | 'CO2' | 'H2O' | 'CH4' | 'H2';

export interface NasaSpecies {
  readonly name: SpeciesName;
  /** Molar mass, kg/kmol (IUPAC standard atomic weights). */
  readonly molarMass: number;
  /** a1…a7 for 200–1000 K. */
  readonly low: readonly number[];
  /** a1…a7 for 1000–6000 K. */
  readonly high: readonly number[];
}

/** Species in a fixed order; mixtures hold their amounts in arrays in this order. */
export const SPECIES_ORDER: readonly SpeciesName[] = ['N2', 'O2', 'Ar', 'CO2', 'H2O', 'CH4', 'H2'];

export const SPECIES: Readonly<Record<SpeciesName, NasaSpecies>> = {
  // N2, record "G 8/02" (reference element)
  N2: {
    name: 'N2',
    molarMass: 28.0134,
    low: [3.53100528, -1.23660988e-4, -5.02999433e-7, 2.43530612e-9, -1.40881235e-12, -1.04697628e3, 2.96747038],
    high: [2.95257637, 1.3969004e-3, -4.92631603e-7, 7.86010195e-11, -4.60755204e-15, -9.23948688e2, 5.87188762],
  },
  // O2, record "RUS 89" (reference element)
  O2: {
    name: 'O2',
    molarMass: 31.9988,
    low: [3.78245636, -2.99673415e-3, 9.847302e-6, -9.68129508e-9, 3.24372836e-12, -1.06394356e3, 3.65767573],
    high: [3.66096083, 6.56365523e-4, -1.41149485e-7, 2.05797658e-11, -1.29913248e-15, -1.21597725e3, 3.41536184],
  },
  // Ar, reference element, monatomic: cp/R = 5/2 exactly
  Ar: {
    name: 'Ar',
    molarMass: 39.948,
    low: [2.5, 0, 0, 0, 0, -7.45375e2, 4.37967491],
    high: [2.5, 0, 0, 0, 0, -7.45375e2, 4.37967491],
  },
  // CO2, record "L 7/88"
  CO2: {
    name: 'CO2',
    molarMass: 44.0095,
    low: [2.356813, 8.9841299e-3, -7.1220632e-6, 2.4573008e-9, -1.4288548e-13, -4.8371971e4, 9.9009035],
    high: [4.6365111, 2.7414569e-3, -9.9589759e-7, 1.6038666e-10, -9.1619857e-15, -4.9024904e4, -1.9348955],
  },
  // H2O (gas), record "L 5/89"
  H2O: {
    name: 'H2O',
    molarMass: 18.01528,
    low: [4.1986352, -2.0364017e-3, 6.5203416e-6, -5.4879269e-9, 1.771968e-12, -3.0293726e4, -8.4900901e-1],
    high: [2.6770389, 2.9731816e-3, -7.7376889e-7, 9.4433514e-11, -4.2689991e-15, -2.9885894e4, 6.88255],
  },
  // CH4, record "L 8/88"
  CH4: {
    name: 'CH4',
    molarMass: 16.04246,
    low: [5.1498792, -1.3671008e-2, 4.918013e-5, -4.8474403e-8, 1.6669441e-11, -1.0246648e4, -4.6413244],
    high: [1.6354256, 1.0084431e-2, -3.3692369e-6, 5.349728e-10, -3.1552817e-14, -1.0005603e4, 9.9936953],
  },
  // H2, record "RUS 78" (reference element)
  H2: {
    name: 'H2',
    molarMass: 2.01588,
    low: [2.3443029, 7.9804248e-3, -1.9477917e-5, 2.0156967e-8, -7.3760289e-12, -9.1792413e2, 6.8300218e-1],
    high: [2.9328305, 8.2659802e-4, -1.4640057e-7, 1.5409851e-11, -6.8879615e-16, -8.1305582e2, -1.0243164],
  },
};

function coefficientsAt(species: NasaSpecies, temperatureK: number): readonly number[] {
  return temperatureK < POLYNOMIAL_BREAK_K ? species.low : species.high;
}

/** Molar cp, kJ/(kmol·K), from the polynomial above. Valid 200–6000 K. */
export function speciesMolarCp(name: SpeciesName, temperatureK: number): number {
  const a = coefficientsAt(SPECIES[name], temperatureK);
  const t = temperatureK;
  return UNIVERSAL_GAS_CONSTANT * (a[0] + t * (a[1] + t * (a[2] + t * (a[3] + t * a[4]))));
}

/** Molar absolute enthalpy, kJ/kmol (elements zero at 298.15 K). Valid 200–6000 K. */
export function speciesMolarEnthalpy(name: SpeciesName, temperatureK: number): number {
  const a = coefficientsAt(SPECIES[name], temperatureK);
  const t = temperatureK;
  return (
    UNIVERSAL_GAS_CONSTANT *
    (t * (a[0] + t * (a[1] / 2 + t * (a[2] / 3 + t * (a[3] / 4 + t * (a[4] / 5))))) + a[5])
  );
}

/** Molar standard-state entropy s°(T) at 100 kPa, kJ/(kmol·K). Valid 200–6000 K. */
export function speciesMolarEntropy(name: SpeciesName, temperatureK: number): number {
  const a = coefficientsAt(SPECIES[name], temperatureK);
  const t = temperatureK;
  return (
    UNIVERSAL_GAS_CONSTANT *
    (a[0] * Math.log(t) + t * (a[1] + t * (a[2] / 2 + t * (a[3] / 3 + t * (a[4] / 4)))) + a[6])
  );
}

/** Enthalpy of formation at 298.15 K, kJ/kmol, read from the same polynomials. */
export function enthalpyOfFormation(name: SpeciesName): number {
  return speciesMolarEnthalpy(name, 298.15);
}
