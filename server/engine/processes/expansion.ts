import type { GasModel } from '../properties/gas-model';
import { isentropicExitTemperature } from './compression';
import { stateFromEnthalpy, type FlowState } from './flow-state';

/**
 * One adiabatic expansion stage of expansion ratio `expansionRatio` (p_inlet / p_exit > 1)
 * and isentropic efficiency η (0 < η ≤ 1):
 *   s°(T2s) = s°(T1) − R ln(p1/p2),   h2 = h1 − η (h1 − h2s).
 * Same gas throughout; units K, kPa, kJ/kg.
 */
export function expand(
  gas: GasModel,
  inlet: FlowState,
  expansionRatio: number,
  isentropicEfficiency: number,
): FlowState {
  const exitPressureKPa = inlet.pressureKPa / expansionRatio;
  const isentropicExitK = isentropicExitTemperature(gas, inlet.temperatureK, 1 / expansionRatio);
  const isentropicEnthalpy = gas.enthalpyKJPerKg(isentropicExitK);
  const exitEnthalpy = inlet.enthalpyKJPerKg - isentropicEfficiency * (inlet.enthalpyKJPerKg - isentropicEnthalpy);
  // Seed T(h) one linear step from the isentropic exit (cp there needs no logarithm): saves a Newton step.
  const guessK = isentropicExitK + (exitEnthalpy - isentropicEnthalpy) / gas.cpKJPerKgK(isentropicExitK);
  return stateFromEnthalpy(gas, exitEnthalpy, exitPressureKPa, guessK);
}
