import type { GasModel } from './gas-model';
import { STANDARD_PRESSURE_KPA } from './nasa-species';
import { constantCpPolynomial } from './property-polynomial';

/** Ratio of specific heats of the cold-air standard. */
export const CONSTANT_CP_K = 1.4;
/** cp of the cold-air standard, kJ/(kg·K). */
export const CONSTANT_CP_KJ_PER_KG_K = 1.005;
const REFERENCE_K = 298.15;
const P0_KPA = STANDARD_PRESSURE_KPA; // local copy: imported bindings are getters once transpiled

/**
 * Cold-air standard for quick estimates: constant cp = 1.005 kJ/(kg·K) and k = 1.4, so
 * R = cp (k − 1) / k = 0.28714 kJ/(kg·K). References: h = 0 and s = 0 at 298.15 K and
 * 100 kPa (h = cp (T − 298.15), s° = cp ln(T / 298.15)). No humidity, no fuel.
 */
export class ConstantCpAir implements GasModel {
  readonly gasConstantKJPerKgK = (CONSTANT_CP_KJ_PER_KG_K * (CONSTANT_CP_K - 1)) / CONSTANT_CP_K;
  readonly molarMassKgPerKmol = 8.314462618 / this.gasConstantKJPerKgK;
  /** h and s° above as a polynomial (a3 = cp, b1 = −cp·298.15, b2 = −cp ln 298.15); equal to round-off. */
  readonly polynomial = constantCpPolynomial(CONSTANT_CP_KJ_PER_KG_K, REFERENCE_K);

  cpKJPerKgK(): number {
    return CONSTANT_CP_KJ_PER_KG_K;
  }
  enthalpyKJPerKg(temperatureK: number): number {
    return CONSTANT_CP_KJ_PER_KG_K * (temperatureK - REFERENCE_K);
  }
  standardEntropyKJPerKgK(temperatureK: number): number {
    return CONSTANT_CP_KJ_PER_KG_K * Math.log(temperatureK / REFERENCE_K);
  }
  entropyKJPerKgK(temperatureK: number, pressureKPa: number): number {
    return this.standardEntropyKJPerKgK(temperatureK) - this.gasConstantKJPerKgK * Math.log(pressureKPa / P0_KPA);
  }
  /** Closed form T = 298.15 + h / cp. */
  temperatureFromEnthalpy(enthalpyKJPerKg: number): number {
    return REFERENCE_K + enthalpyKJPerKg / CONSTANT_CP_KJ_PER_KG_K;
  }
  /** Closed form T = 298.15 exp(s° / cp). */
  temperatureFromStandardEntropy(standardEntropyKJPerKgK: number): number {
    return REFERENCE_K * Math.exp(standardEntropyKJPerKgK / CONSTANT_CP_KJ_PER_KG_K);
  }
}
