import { compress as compressImported, newStageSeed as newStageSeedImported } from '../processes/compression';
import type { FlowState } from '../processes/flow-state';
import { changeTemperature as changeTemperatureImported } from '../processes/heat-exchange';
import type { GasModel } from '../properties/gas-model';
import type { ResolvedInput } from './resolve-input';
import {
  COMPRESSOR_LABELS,
  INTERCOOLER_LABELS,
  stageLabels as stageLabelsImported,
  type StateRecord,
} from './state-records';
import { checkStageExit as checkStageExitImported } from './turbine-train';
import type { CycleWarning } from './types';

// Local copies: an imported binding is a getter call once transpiled (README, Speed).
const compress = compressImported;
const newStageSeed = newStageSeedImported;
const changeTemperature = changeTemperatureImported;
const stageLabels = stageLabelsImported;
const checkStageExit = checkStageExitImported;

/** What the compressor train delivers: its exit state and the work it took, kJ per kg of inlet air. */
export interface CompressorTrainOutcome {
  readonly exit: FlowState;
  readonly workKJ: number;
}

/**
 * N-stage intercooled compression from `inlet` (README, Staging): N equal stage ratios whose
 * product, less the intercooler losses, is the overall ratio, r = r_s^N (1 − Δp_ic)^(N−1);
 * between stages the air is cooled to the intercooling temperature. Appends the stage and
 * intercooler exits to `records`; warns when the intercooler would heat the air. Throws
 * EngineInputError (field compressor.pressureRatio) for a stage exit, actual or isentropic,
 * outside the property data.
 */
export function compressorTrain(
  r: ResolvedInput,
  gas: GasModel,
  inlet: FlowState,
  records: StateRecord[],
  warnings: CycleWarning[],
): CompressorTrainOutcome {
  const n = r.compressorStages;
  const stageRatio = Math.pow(r.pressureRatio / Math.pow(1 - r.intercoolerPressureLoss, n - 1), 1 / n);
  let workKJ = 0;
  let current = inlet;
  const compressorLabels = stageLabels(COMPRESSOR_LABELS, 'compressor', n, ' exit');
  const intercoolerLabels = stageLabels(INTERCOOLER_LABELS, 'intercooler', n, ' exit');
  const seed = newStageSeed();
  for (let i = 1; i <= n; i++) {
    const exit = compress(gas, current, stageRatio, r.compressorEfficiency, seed);
    // The seed holds this stage's isentropic exit temperature.
    checkStageExit(seed.isentropicK, 'compressor', i, true);
    checkStageExit(exit.temperatureK, 'compressor', i, false);
    workKJ += exit.enthalpyKJPerKg - current.enthalpyKJPerKg;
    records.push({ label: compressorLabels[i], state: exit, gas, mass: 1, process: 'compression', burnt: false });
    current = exit;
    if (i < n) {
      if (r.intercoolTemperatureK > exit.temperatureK && i === 1) {
        warnings.push({
          code: 'intercooler-heats-air',
          field: 'compressor.intercoolTemperatureK',
          message:
            'The intercooling temperature is above the compressor stage exit temperature, so the intercooler heats the air.',
        });
      }
      const cooled = changeTemperature(gas, exit, r.intercoolTemperatureK, r.intercoolerPressureLoss);
      records.push({
        label: intercoolerLabels[i],
        state: cooled,
        gas,
        mass: 1,
        process: 'heat-rejection',
        burnt: false,
      });
      current = cooled;
    }
  }
  return { exit: current, workKJ };
}
