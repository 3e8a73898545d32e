import { EngineInputError } from '../errors';
import { fuelSensibleHeat as fuelSensibleHeatImported, type Fuel } from '../processes/combustion';
import type { ResolvedInput } from './resolve-input';
import type { CycleWarning } from './types';

// Local copies: an imported binding is a getter call once transpiled (README, Speed).
const fuelSensibleHeat = fuelSensibleHeatImported;

/** kJ per kWh and per MWh. */
const KJ_PER_KWH = 3600;
const KJ_PER_MWH = 3.6e6;

/** What the cycle's heat went into and came from, kJ per kg of compressor inlet air. */
export interface CycleEnergies {
  readonly compressorWorkKJ: number;
  readonly turbineWorkKJ: number;
  /** Combustion mode: fuel burnt, kg per kg of inlet air. Air modes: unused. */
  readonly fuelBurntKg: number;
  /** Air modes: the enthalpy rise in the combustor and in the reheaters. */
  readonly combustorHeatKJ: number;
  readonly reheatHeatKJ: number;
  /** kmol of O2 per kg of inlet air (bounds the fuel of the air modes). */
  readonly oxygenKmolPerKg: number;
}

/** The performance figures of CycleResult (README, Definitions). */
export interface PerformanceFigures {
  readonly netWorkKJPerKg: number;
  readonly heatInputKJPerKg: number;
  readonly thermalEfficiency: number;
  readonly backWorkRatio: number;
  readonly fuelAirRatio: number | null;
  readonly fuelLowerHeatingValueKJPerKg: number | null;
  readonly airMassFlowKgPerS: number | null;
  readonly fuelMassFlowKgPerS: number | null;
  readonly heatRateKJPerKWh: number | null;
  readonly co2KgPerMWh: number | null;
}

/**
 * Heat input, efficiency, flows, heat rate and CO2.
 * Heat input: with the fuel burning in the gas, fuel × (LHV + the fuel's sensible heat above
 * 298.15 K); in the air modes, the enthalpy rise in combustor and reheaters, and with a fuel
 * given its flow is that heat over the same LHV + sensible heat (refused, naming the burner
 * temperature, when that is more fuel than the air's oxygen can burn).
 * η = w_net / q_in; heat rate = 3600 q_in / (w_net η_gen) kJ/kWh; air flow = P / (w_net η_gen);
 * CO2 = carbon of the fuel as CO2 per MWh of electricity. Without net work the flows, heat
 * rate and CO2 are null and `no-net-work` is warned.
 */
export function performanceFigures(
  r: ResolvedInput,
  fuel: Fuel | null,
  fuelBurnsInGas: boolean,
  e: CycleEnergies,
  warnings: CycleWarning[],
): PerformanceFigures {
  let heatInputKJ: number;
  let fuelAirRatio: number | null = null;
  const fuelHeat = fuel && r.fuel ? fuel.lowerHeatingValueKJPerKg + fuelSensibleHeat(fuel, r.fuel.temperatureK) : 0;
  if (fuelBurnsInGas && fuel) {
    fuelAirRatio = e.fuelBurntKg;
    heatInputKJ = e.fuelBurntKg * fuelHeat;
  } else {
    heatInputKJ = e.combustorHeatKJ + e.reheatHeatKJ;
    if (fuel) {
      fuelAirRatio = heatInputKJ / fuelHeat;
      checkAirModeFuel(r, fuel, fuelAirRatio, e.combustorHeatKJ / fuelHeat, e.oxygenKmolPerKg);
    }
  }
  const netWorkKJ = e.turbineWorkKJ - e.compressorWorkKJ;
  let airMassFlowKgPerS: number | null = null;
  let fuelMassFlowKgPerS: number | null = null;
  let heatRateKJPerKWh: number | null = null;
  let co2KgPerMWh: number | null = null;
  if (netWorkKJ > 0) {
    const electricKJ = netWorkKJ * r.generatorEfficiency;
    airMassFlowKgPerS = r.netPowerKW / electricKJ;
    heatRateKJPerKWh = (KJ_PER_KWH * heatInputKJ) / electricKJ;
    if (fuelAirRatio !== null && fuel) {
      fuelMassFlowKgPerS = airMassFlowKgPerS * fuelAirRatio;
      co2KgPerMWh = (fuelAirRatio * fuel.co2KgPerKgFuel * KJ_PER_MWH) / electricKJ;
    }
  } else {
    warnings.push({
      code: 'no-net-work',
      message:
        'The turbines give no more work than the compressors take, so no air flow can deliver the required power.',
    });
  }
  return {
    netWorkKJPerKg: netWorkKJ,
    heatInputKJPerKg: heatInputKJ,
    thermalEfficiency: netWorkKJ / heatInputKJ,
    backWorkRatio: e.compressorWorkKJ / e.turbineWorkKJ,
    fuelAirRatio,
    fuelLowerHeatingValueKJPerKg: fuel ? fuel.lowerHeatingValueKJPerKg : null,
    airMassFlowKgPerS,
    fuelMassFlowKgPerS,
    heatRateKJPerKWh,
    co2KgPerMWh,
  };
}

/**
 * Air modes with a fuel: the fuel–air ratio may not exceed the stoichiometric one (the fuel
 * that burns all the oxygen of the inlet air), as in the combustion mode. Refused naming the
 * turbine inlet temperature when the combustor alone needs too much, else the reheat temperature.
 */
function checkAirModeFuel(
  r: ResolvedInput,
  fuel: Fuel,
  fuelAirRatio: number,
  combustorFuelAirRatio: number,
  oxygenKmolPerKg: number,
): void {
  const stoichiometric = oxygenKmolPerKg * fuel.fuelKgPerKmolOxygen;
  if (fuelAirRatio <= stoichiometric) return;
  const combustorAlone = combustorFuelAirRatio > stoichiometric;
  throw new EngineInputError(
    combustorAlone ? 'turbine.inletTemperatureK' : 'turbine.reheatTemperatureK',
    `The heat added would need a fuel–air ratio of ${fuelAirRatio.toFixed(4)}, more than the oxygen of the air can burn (stoichiometric ${stoichiometric.toFixed(4)}); lower the ${combustorAlone ? 'turbine inlet' : 'reheat'} temperature.`,
  );
}
