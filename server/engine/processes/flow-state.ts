import type { GasModel } from '../properties/gas-model';

/** A point of the flow: temperature K, pressure kPa, specific enthalpy kJ/kg and entropy kJ/(kg·K) of the gas there. */
export interface FlowState {
  readonly temperatureK: number;
  readonly pressureKPa: number;
  readonly enthalpyKJPerKg: number;
  readonly entropyKJPerKgK: number;
}

/** The full state of `gas` at temperature (K) and pressure (kPa). */
export function stateAt(gas: GasModel, temperatureK: number, pressureKPa: number): FlowState {
  return {
    temperatureK,
    pressureKPa,
    enthalpyKJPerKg: gas.enthalpyKJPerKg(temperatureK),
    entropyKJPerKgK: gas.entropyKJPerKgK(temperatureK, pressureKPa),
  };
}

/** The full state of `gas` at specific enthalpy (kJ/kg) and pressure (kPa); `guessK` seeds the inversion. */
export function stateFromEnthalpy(gas: GasModel, enthalpyKJPerKg: number, pressureKPa: number, guessK?: number): FlowState {
  const temperatureK = gas.temperatureFromEnthalpy(enthalpyKJPerKg, guessK);
  return {
    temperatureK,
    pressureKPa,
    enthalpyKJPerKg,
    entropyKJPerKgK: gas.entropyKJPerKgK(temperatureK, pressureKPa),
  };
}
