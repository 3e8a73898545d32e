import type { Polynomial } from './property-polynomial';

/**
 * What the processes need from a working fluid: specific properties on a mass basis.
 * Units: K, kPa, kJ/kg, kJ/(kg·K).
 */
export interface GasModel {
  /** Molar mass, kg/kmol. */
  readonly molarMassKgPerKmol: number;
  /** Specific gas constant R = Ru / M, kJ/(kg·K). */
  readonly gasConstantKJPerKgK: number;
  /** The same cp, h and s° as one property polynomial per kg (property-polynomial.ts), for
   * the loops that evaluate many points (turbine train, T-s paths). */
  readonly polynomial: Polynomial;
  /** Specific heat at constant pressure, kJ/(kg·K). */
  cpKJPerKgK(temperatureK: number): number;
  /** Specific enthalpy, kJ/kg (reference state stated by each model). */
  enthalpyKJPerKg(temperatureK: number): number;
  /** Specific entropy at the standard pressure of 100 kPa, kJ/(kg·K). */
  standardEntropyKJPerKgK(temperatureK: number): number;
  /** Specific entropy s(T, p) = s°(T) − R ln(p / 100 kPa), kJ/(kg·K). */
  entropyKJPerKgK(temperatureK: number, pressureKPa: number): number;
  /** Inverse of enthalpyKJPerKg, to 1e-9 relative or better. `guessK` speeds it up. */
  temperatureFromEnthalpy(enthalpyKJPerKg: number, guessK?: number): number;
  /** Inverse of standardEntropyKJPerKgK, to 1e-9 relative or better. */
  temperatureFromStandardEntropy(standardEntropyKJPerKgK: number, guessK?: number): number;
}
