import type { GasModel } from '../properties/gas-model';
import { STANDARD_PRESSURE_KPA } from '../properties/nasa-species';
import * as propertyPolynomial from '../properties/property-polynomial';

// Local copies of imported bindings (each is a getter call once transpiled).
const { enthalpyWithLog, standardEntropyWithLog } = propertyPolynomial;
const P0_KPA = STANDARD_PRESSURE_KPA;

/** A point of the flow: temperature K, pressure kPa, specific enthalpy kJ/kg and entropy kJ/(kg·K) of the gas there. */
export interface FlowState {
  readonly temperatureK: number;
  readonly pressureKPa: number;
  readonly enthalpyKJPerKg: number;
  readonly entropyKJPerKgK: number;
}

/** The full state of `gas` at temperature (K) and pressure (kPa): h(T), s(T, p) = s°(T) − R ln(p / 100 kPa). */
export function stateAt(gas: GasModel, temperatureK: number, pressureKPa: number): FlowState {
  // One logarithm of T serves both h and s° (from the gas's polynomial, equal to its methods).
  const lnT = Math.log(temperatureK);
  const p = gas.polynomial;
  return {
    temperatureK,
    pressureKPa,
    enthalpyKJPerKg: enthalpyWithLog(p, temperatureK, lnT),
    entropyKJPerKgK:
      standardEntropyWithLog(p, temperatureK, lnT) - gas.gasConstantKJPerKgK * Math.log(pressureKPa / P0_KPA),
  };
}

/** The full state of `gas` at specific enthalpy (kJ/kg) and pressure (kPa); `guessK` seeds the inversion. */
export function stateFromEnthalpy(
  gas: GasModel,
  enthalpyKJPerKg: number,
  pressureKPa: number,
  guessK?: number,
): FlowState {
  const temperatureK = gas.temperatureFromEnthalpy(enthalpyKJPerKg, guessK);
  return {
    temperatureK,
    pressureKPa,
    enthalpyKJPerKg,
    entropyKJPerKgK: gas.entropyKJPerKgK(temperatureK, pressureKPa),
  };
}
