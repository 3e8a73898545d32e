/**
 * Pressure of the ISA standard atmosphere (ISO 2533:1975 / ICAO Doc 7488) at a
 * geopotential elevation, kPa. Troposphere (to 11 km): p = p0 (1 − L h / T0)^(g0 M / (R* L)),
 * with p0 = 101.325 kPa, T0 = 288.15 K, L = 0.0065 K/m, g0 M / (R* L) = 5.25588;
 * lower stratosphere (11–20 km, isothermal 216.65 K): p = p11 exp(−g0 M (h − 11 km) / (R* T11)).
 * Valid −1000 m to 20 000 m. Only the pressure is taken from it; the site temperature is
 * an input of its own.
 */
export const ISA_MIN_ELEVATION_M = -1000;
export const ISA_MAX_ELEVATION_M = 20000;

const P0_KPA = 101.325;
const T0_K = 288.15;
const LAPSE_K_PER_M = 0.0065;
const G0 = 9.80665;
const MOLAR_MASS_AIR = 0.0289644; // kg/mol, as ISA defines it
const R_STAR = 8.31432; // J/(mol·K), as ISA defines it
const EXPONENT = (G0 * MOLAR_MASS_AIR) / (R_STAR * LAPSE_K_PER_M);
const TROPOPAUSE_M = 11000;
const T11_K = T0_K - LAPSE_K_PER_M * TROPOPAUSE_M;
const P11_KPA = P0_KPA * Math.pow(T11_K / T0_K, EXPONENT);

export function isaPressureKPa(elevationM: number): number {
  if (elevationM <= TROPOPAUSE_M) {
    return P0_KPA * Math.pow(1 - (LAPSE_K_PER_M * elevationM) / T0_K, EXPONENT);
  }
  return P11_KPA * Math.exp((-G0 * MOLAR_MASS_AIR * (elevationM - TROPOPAUSE_M)) / (R_STAR * T11_K));
}
