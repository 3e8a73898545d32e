import type { GasModel } from '../properties/gas-model';
import { stateFromEnthalpy, type FlowState } from './flow-state';

/**
 * Temperatures of the last stage compressed with a seed, K (zero before the first): a stage
 * of the same ratio and efficiency behind an intercooler has nearly the same temperature
 * ratios, so they seed its inversions (one step instead of two or three, and no power).
 */
export interface StageSeed {
  inletK: number;
  isentropicK: number;
  exitK: number;
}

/** A seed for the first of a series of like stages. */
export function newStageSeed(): StageSeed {
  return { inletK: 0, isentropicK: 0, exitK: 0 };
}

/**
 * One adiabatic compression stage of pressure ratio `pressureRatio` (> 1) and isentropic
 * efficiency η (0 < η ≤ 1):
 *   s°(T2s) = s°(T1) + R ln(p2/p1),   h2 = h1 + (h2s − h1) / η.
 * Same gas throughout; units K, kPa, kJ/kg. `seed` (optional) carries the temperatures of
 * the previous like stage in and out (see StageSeed); it only speeds the inversions up.
 */
export function compress(
  gas: GasModel,
  inlet: FlowState,
  pressureRatio: number,
  isentropicEfficiency: number,
  seed?: StageSeed,
): FlowState {
  const exitPressureKPa = inlet.pressureKPa * pressureRatio;
  const scale = seed && seed.inletK > 0 ? inlet.temperatureK / seed.inletK : 0;
  const isentropicExitK =
    scale > 0
      ? gas.temperatureFromStandardEntropy(
          gas.standardEntropyKJPerKgK(inlet.temperatureK) + gas.gasConstantKJPerKgK * Math.log(pressureRatio),
          seed!.isentropicK * scale,
        )
      : isentropicExitTemperature(gas, inlet.temperatureK, pressureRatio);
  const isentropicEnthalpy = gas.enthalpyKJPerKg(isentropicExitK);
  const exitEnthalpy = inlet.enthalpyKJPerKg + (isentropicEnthalpy - inlet.enthalpyKJPerKg) / isentropicEfficiency;
  // Seed T(h) from the like stage, or one linear step from the isentropic exit (cp there needs no logarithm).
  const guessK =
    scale > 0
      ? seed!.exitK * scale
      : isentropicExitK + (exitEnthalpy - isentropicEnthalpy) / gas.cpKJPerKgK(isentropicExitK);
  const exit = stateFromEnthalpy(gas, exitEnthalpy, exitPressureKPa, guessK);
  if (seed) {
    seed.inletK = inlet.temperatureK;
    seed.isentropicK = isentropicExitK;
    seed.exitK = exit.temperatureK;
  }
  return exit;
}

/**
 * Temperature after an isentropic change of pressure by `pressureRatio` (p_exit / p_inlet),
 * from s°(T2) = s°(T1) + R ln(ratio). Works for compression (ratio > 1) and expansion (< 1).
 */
export function isentropicExitTemperature(gas: GasModel, inletK: number, pressureRatio: number): number {
  const rise = gas.gasConstantKJPerKgK * Math.log(pressureRatio);
  const target = gas.standardEntropyKJPerKgK(inletK) + rise;
  // Seed with the constant-cp answer at the inlet cp, T1 r^(R/cp), written with the logarithm already taken.
  const guess = inletK * Math.exp(rise / gas.cpKJPerKgK(inletK));
  return gas.temperatureFromStandardEntropy(target, guess);
}
