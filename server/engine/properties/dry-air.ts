import { SPECIES_COUNT } from './ideal-gas-mixture';
import { SPECIES_INDEX } from './nasa-species';

/**
 * Dry air, mole fractions. Source: U.S. Standard Atmosphere, 1976 (NOAA/NASA/USAF),
 * table of sea-level dry-air composition: N2 0.78084, O2 0.209476, Ar 0.00934,
 * CO2 0.000314. The remaining traces (Ne, He, Kr, Xe, CH4, H2; about 0.003 % together)
 * are counted as argon, whose monatomic cp they share, so the fractions sum to one.
 * Molar mass of the result: 28.964 kg/kmol.
 */
export const DRY_AIR_MOLE_FRACTIONS = {
  N2: 0.78084,
  O2: 0.209476,
  Ar: 1 - 0.78084 - 0.209476 - 0.000314,
  CO2: 0.000314,
} as const;

/** Dry air as species amounts (kmol per kmol of dry air) in SPECIES_ORDER. */
export function dryAirAmounts(): Float64Array {
  const amounts = new Float64Array(SPECIES_COUNT);
  amounts[SPECIES_INDEX.N2] = DRY_AIR_MOLE_FRACTIONS.N2;
  amounts[SPECIES_INDEX.O2] = DRY_AIR_MOLE_FRACTIONS.O2;
  amounts[SPECIES_INDEX.Ar] = DRY_AIR_MOLE_FRACTIONS.Ar;
  amounts[SPECIES_INDEX.CO2] = DRY_AIR_MOLE_FRACTIONS.CO2;
  return amounts;
}
