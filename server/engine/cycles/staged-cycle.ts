import { EngineInputError } from '../errors';
import * as flowState from '../processes/flow-state';
import type { GasModel } from '../properties/gas-model';
import { SPECIES_INDEX } from '../properties/nasa-species';
import * as compressorTrainModule from './compressor-train';
import * as cycleGases from './cycle-gases';
import * as cycleWarnings from './cycle-warnings';
import * as performance from './performance';
import * as regeneratorCoupling from './regenerator-coupling';
import * as resolveInputModule from './resolve-input';
import type { StateRecord } from './state-records';
import * as stateRecords from './state-records';
import * as tsPaths from './t-s-paths';
import * as turbineTrain from './turbine-train';
import type { CycleInput, CycleResult, CycleWarning, EvaluateOptions } from './types';

// Local copies: an imported binding is a getter call once transpiled (README, Speed).
const { stateAt } = flowState;
const { compressorTrain } = compressorTrainModule;
const { CONSTANT_CP_AIR, fuelFor, inletAir } = cycleGases;
const { inputWarnings, resultWarnings } = cycleWarnings;
const { performanceFigures } = performance;
const { regeneratorColdOutlet, regeneratorHotOutlet, solveTurbineTrain } = regeneratorCoupling;
const { resolveInput } = resolveInputModule;
const { statePoints } = stateRecords;
const { cyclePaths } = tsPaths;
const { freshTrainPass, trainSetup, turbineTrainRecords } = turbineTrain;

const DEFAULT_POINTS_PER_PROCESS = 16;
const OXYGEN = SPECIES_INDEX.O2;

/**
 * Evaluates the general staged cycle (see README): N-stage intercooled compression,
 * optional regenerator, combustor, M-stage expansion with reheat, exhaust to ambient.
 * Results per kg of compressor inlet air. Throws EngineInputError on impossible input.
 */
export function evaluateStagedCycle(input: CycleInput, options: EvaluateOptions = {}): CycleResult {
  const r = resolveInput(input);
  const warnings: CycleWarning[] = [];
  inputWarnings(r, warnings);

  // The gases: humid inlet air (dry in the constant-cp mode, whose air is the cold-air
  // standard), and the fuel. The fuel burns in the gas in combustion mode only; the air
  // modes take it for its heating value and to bound the heat by the air's oxygen.
  const combustion = r.fluid === 'combustion';
  const constantCp = r.fluid === 'constant-cp-air';
  const fuel = r.fuel ? fuelFor(r.fuel.hydrogenVolumeFraction) : null;
  const air =
    !constantCp || fuel
      ? inletAir(r.ambientTemperatureK, r.ambientPressureKPa, constantCp ? 0 : r.relativeHumidity)
      : null;
  const airGas: GasModel = constantCp || !air ? CONSTANT_CP_AIR : air.stream.gas;
  const burnStream = combustion && air ? air.stream : null;
  const burnFuel = combustion ? fuel : null;

  // Compression with intercooling, from the ambient state.
  const records: StateRecord[] = [];
  const inlet = stateAt(airGas, r.ambientTemperatureK, r.ambientPressureKPa);
  records.push({ label: 'compressor inlet', state: inlet, gas: airGas, mass: 1, process: null, burnt: false });
  const compression = compressorTrain(r, airGas, inlet, records, warnings);
  const compressorExit = compression.exit;
  if (!(r.turbineInletTemperatureK > compressorExit.temperatureK)) {
    throw new EngineInputError(
      'turbine.inletTemperatureK',
      `The turbine inlet temperature (${r.turbineInletTemperatureK} K) must be above the compressor delivery temperature (${compressorExit.temperatureK.toFixed(1)} K).`,
    );
  }

  // Pressures of the hot section: the last turbine exhausts at ambient pressure, or just
  // above it when the exhaust still has to pass the regenerator's gas side; the turbine
  // stages share the expansion equally: p_in (1 − Δp_rh)^(M−1) / e^M = p_exit.
  const regenerator = r.regenerator;
  const combustorInletKPa = compressorExit.pressureKPa * (1 - (regenerator ? regenerator.airSidePressureLoss : 0));
  const turbineInletKPa = combustorInletKPa * (1 - r.combustorPressureLoss);
  const lastTurbineExitKPa = r.ambientPressureKPa / (1 - (regenerator ? regenerator.gasSidePressureLoss : 0));
  const m = r.turbineStages;
  const expansionRatio = Math.pow(
    (turbineInletKPa * Math.pow(1 - r.reheaterPressureLoss, m - 1)) / lastTurbineExitKPa,
    1 / m,
  );
  if (!(expansionRatio > 1 + 1e-9)) {
    throw new EngineInputError(
      'compressor.pressureRatio',
      'After the pressure losses no expansion is left for the turbine; raise the pressure ratio or lower the losses.',
    );
  }

  // The turbine train, with the regenerator loop closed on the combustor inlet enthalpy.
  const setup = trainSetup(r, airGas, burnStream, burnFuel, compressorExit, expansionRatio);
  const pass = freshTrainPass();
  const combustorInletEnthalpy = solveTurbineTrain(setup, pass, regenerator !== null);
  const last = pass.count - 1;
  const exhaustK = pass.temperatureK[last];
  // The duty is what the burner saw; the hot outlet follows from the energy balance with it.
  const regeneratorDutyKJ = combustorInletEnthalpy - compressorExit.enthalpyKJPerKg;
  const combustorInlet = regeneratorColdOutlet(
    r,
    airGas,
    compressorExit,
    combustorInletEnthalpy,
    combustorInletKPa,
    exhaustK,
    records,
    warnings,
  );
  if (!(r.turbineInletTemperatureK > combustorInlet.temperatureK)) {
    throw new EngineInputError(
      'turbine.inletTemperatureK',
      `The turbine inlet temperature (${r.turbineInletTemperatureK} K) must be above the combustor inlet temperature (${combustorInlet.temperatureK.toFixed(1)} K).`,
    );
  }
  const turbineWorkKJ = turbineTrainRecords(
    pass,
    airGas,
    burnStream,
    burnFuel,
    turbineInletKPa,
    expansionRatio,
    r,
    records,
  );
  regeneratorHotOutlet(r, compressorExit.temperatureK, regeneratorDutyKJ, records);

  // Heat input, efficiency, flows, heat rate and CO2; then the warnings about the result.
  const figures = performanceFigures(
    r,
    fuel,
    combustion,
    {
      compressorWorkKJ: compression.workKJ,
      turbineWorkKJ,
      fuelBurntKg: pass.fuelKg[last],
      combustorHeatKJ: setup.airEnthalpyAtInlet - combustorInlet.enthalpyKJPerKg,
      reheatHeatKJ: pass.reheatHeatKJ,
      oxygenKmolPerKg: air ? air.stream.amounts[OXYGEN] : 0,
    },
    warnings,
  );
  const exhaust = records[records.length - 1];
  resultWarnings(r, exhaust.state.temperatureK, combustion, warnings);

  return {
    states: statePoints(records),
    compressorWorkKJPerKg: compression.workKJ,
    turbineWorkKJPerKg: turbineWorkKJ,
    netWorkKJPerKg: figures.netWorkKJPerKg,
    heatInputKJPerKg: figures.heatInputKJPerKg,
    thermalEfficiency: figures.thermalEfficiency,
    backWorkRatio: figures.backWorkRatio,
    regeneratorDutyKJPerKg: regeneratorDutyKJ,
    exhaustTemperatureK: exhaust.state.temperatureK,
    fuelAirRatio: figures.fuelAirRatio,
    fuelLowerHeatingValueKJPerKg: figures.fuelLowerHeatingValueKJPerKg,
    airMassFlowKgPerS: figures.airMassFlowKgPerS,
    fuelMassFlowKgPerS: figures.fuelMassFlowKgPerS,
    heatRateKJPerKWh: figures.heatRateKJPerKWh,
    co2KgPerMWh: figures.co2KgPerMWh,
    paths: options.paths === false ? [] : cyclePaths(records, options.pointsPerProcess ?? DEFAULT_POINTS_PER_PROCESS),
    warnings,
  };
}
