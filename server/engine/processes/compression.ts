import type { GasModel } from '../properties/gas-model';
import { type FlowState, stateFromEnthalpy } from './flow-state';

/**
 * One adiabatic compression stage of pressure ratio `pressureRatio` (> 1) and isentropic
 * efficiency η (0 < η ≤ 1):
 *   s°(T2s) = s°(T1) + R ln(p2/p1),   h2 = h1 + (h2s − h1) / η.
 * Same gas throughout; units K, kPa, kJ/kg.
 */
export function compress(gas: GasModel, inlet: FlowState, pressureRatio: number, isentropicEfficiency: number): FlowState {
  const exitPressureKPa = inlet.pressureKPa * pressureRatio;
  const isentropicExitK = isentropicExitTemperature(gas, inlet.temperatureK, pressureRatio);
  const isentropicEnthalpy = gas.enthalpyKJPerKg(isentropicExitK);
  const exitEnthalpy = inlet.enthalpyKJPerKg + (isentropicEnthalpy - inlet.enthalpyKJPerKg) / isentropicEfficiency;
  // Seed T(h) one linear step from the isentropic exit (cp there needs no logarithm): saves a Newton step.
  const guessK = isentropicExitK + (exitEnthalpy - isentropicEnthalpy) / gas.cpKJPerKgK(isentropicExitK);
  return stateFromEnthalpy(gas, exitEnthalpy, exitPressureKPa, guessK);
}

/**
 * Temperature after an isentropic change of pressure by `pressureRatio` (p_exit / p_inlet),
 * from s°(T2) = s°(T1) + R ln(ratio). Works for compression (ratio > 1) and expansion (< 1).
 */
export function isentropicExitTemperature(gas: GasModel, inletK: number, pressureRatio: number): number {
  const target = gas.standardEntropyKJPerKgK(inletK) + gas.gasConstantKJPerKgK * Math.log(pressureRatio);
  // Seed with the constant-cp answer at the inlet cp.
  const guess = inletK * Math.pow(pressureRatio, gas.gasConstantKJPerKgK / gas.cpKJPerKgK(inletK));
  return gas.temperatureFromStandardEntropy(target, guess);
}
