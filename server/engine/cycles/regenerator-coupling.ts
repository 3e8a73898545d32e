import { stateFromEnthalpy as stateFromEnthalpyImported, type FlowState } from '../processes/flow-state';
import type { GasModel } from '../properties/gas-model';
import { enthalpyOf as enthalpyOfImported } from '../properties/property-polynomial';
import type { ResolvedInput } from './resolve-input';
import type { StateRecord } from './state-records';
import {
  regeneratorDuty as regeneratorDutyImported,
  runTrain as runTrainImported,
  type TrainPass,
  type TrainSetup,
} from './turbine-train';
import type { CycleWarning } from './types';

// Local copies: an imported binding is a getter call once transpiled (README, Speed).
const stateFromEnthalpy = stateFromEnthalpyImported;
const enthalpyOf = enthalpyOfImported;
const regeneratorDuty = regeneratorDutyImported;
const runTrain = runTrainImported;

/**
 * Typical slope of the regenerator duty with respect to the combustor inlet enthalpy in
 * combustion mode (a hotter inlet burns less fuel, so the exhaust runs slightly cooler):
 * about −0.01 over the cases the board meets (−0.012 in the 2+2 case). It only shapes the first step of the
 * iteration below; any value below 1 converges.
 */
const TYPICAL_COUPLING_SLOPE = -0.01;
/** The loop stops when the duty meets ε Q_max to 1e-12 relative (1e-12 kJ/kg for duties
 * below 1 kJ/kg). The energy balance closes exactly whatever the tolerance (see below). */
const COUPLING_RELATIVE_TOLERANCE = 1e-12;
const MAX_COUPLING_PASSES = 50;

/**
 * Combustion mode with a regenerator: finds the combustor inlet enthalpy x (kJ/kg) that the
 * regenerator delivers, x = h_c,in + Q(x), where Q runs the turbine train at x. Q is nearly
 * linear with a small negative slope, so: one pass at the compressor exit, a first step with
 * the typical slope, then secant steps (four passes in the 2+2 case). Returns x of the last
 * pass run, whose numbers `pass` holds: the cycle takes the duty as x − h_c,in, so the energy
 * balance closes exactly and the tolerance only sets how exactly ε is met.
 */
function closeRegeneratorLoop(s: TrainSetup, pass: TrainPass): number {
  const coldIn = s.coldInletEnthalpy;
  // Start below the turbine inlet, so that the first burner has something to do.
  let x = Math.min(coldIn, enthalpyOf(s.air, s.inletK - 1));
  let xPrevious = x;
  let gPrevious = 0;
  for (let iteration = 0; iteration < MAX_COUPLING_PASSES; iteration++) {
    runTrain(s, x, pass);
    const duty = regeneratorDuty(s, pass);
    const g = coldIn + duty - x;
    if (
      iteration === MAX_COUPLING_PASSES - 1 ||
      Math.abs(g) <= COUPLING_RELATIVE_TOLERANCE * Math.max(Math.abs(duty), 1)
    )
      break;
    const slope = iteration === 0 ? TYPICAL_COUPLING_SLOPE - 1 : (g - gPrevious) / (x - xPrevious);
    // A flat or non-finite secant means g is not behaving linearly: take a plain fixed-point step.
    const next = slope < 0 || slope > 0 ? x - g / slope : x + g;
    xPrevious = x;
    gPrevious = g;
    x = Number.isFinite(next) ? next : x + g;
  }
  return x;
}

/**
 * Runs the turbine train into `pass` and returns the combustor inlet enthalpy (kJ/kg) it ran
 * with: the compressor exit's, plus the regenerator duty when there is one. One pass in the
 * air modes or without a regenerator; in combustion mode with a regenerator the exhaust
 * composition depends on the fuel burnt, which depends on the regenerator's cold outlet, a
 * weakly coupled loop closed by closeRegeneratorLoop.
 */
export function solveTurbineTrain(s: TrainSetup, pass: TrainPass, regenerator: boolean): number {
  if (regenerator && s.change) return closeRegeneratorLoop(s, pass);
  runTrain(s, s.coldInletEnthalpy, pass);
  return regenerator ? s.coldInletEnthalpy + regeneratorDuty(s, pass) : s.coldInletEnthalpy;
}

/**
 * The regenerator's cold outlet (the combustor inlet) at the enthalpy the train converged
 * on, `combustorInletEnthalpy`, and at the air-side pressure; without a regenerator, the
 * compressor exit itself. Appends the cold outlet to `records` and warns when the heat
 * would flow from the air to the exhaust.
 */
export function regeneratorColdOutlet(
  r: ResolvedInput,
  airGas: GasModel,
  compressorExit: FlowState,
  combustorInletEnthalpy: number,
  combustorInletKPa: number,
  exhaustK: number,
  records: StateRecord[],
  warnings: CycleWarning[],
): FlowState {
  const regenerator = r.regenerator;
  if (!regenerator) return compressorExit;
  const coldK = compressorExit.temperatureK;
  const coldOut = stateFromEnthalpy(
    airGas,
    combustorInletEnthalpy,
    combustorInletKPa,
    coldK + regenerator.effectiveness * (exhaustK - coldK),
  );
  if (exhaustK < coldK) {
    warnings.push({
      code: 'regenerator-cools-air',
      field: 'regenerator',
      message: `The compressor exit (${coldK.toFixed(1)} K) is hotter than the turbine exhaust (${exhaustK.toFixed(1)} K), so the regenerator would cool the air; leave it out or lower the pressure ratio.`,
    });
  }
  records.push({
    label: 'regenerator cold out',
    state: coldOut,
    gas: airGas,
    mass: 1,
    process: 'regenerator-heating',
    burnt: false,
  });
  return coldOut;
}

/**
 * The regenerator's hot outlet from the energy balance with the duty the air side received
 * (kJ per kg of inlet air), after the gas-side loss; appended to `records`. Nothing without
 * a regenerator.
 */
export function regeneratorHotOutlet(
  r: ResolvedInput,
  compressorExitK: number,
  dutyKJ: number,
  records: StateRecord[],
): void {
  const regenerator = r.regenerator;
  if (!regenerator) return;
  const hotIn = records[records.length - 1];
  const exhaustK = hotIn.state.temperatureK;
  records.push({
    label: 'regenerator hot out',
    state: stateFromEnthalpy(
      hotIn.gas,
      hotIn.state.enthalpyKJPerKg - dutyKJ / hotIn.mass,
      hotIn.state.pressureKPa * (1 - regenerator.gasSidePressureLoss),
      exhaustK - regenerator.effectiveness * (exhaustK - compressorExitK),
    ),
    gas: hotIn.gas,
    mass: hotIn.mass,
    process: 'regenerator-cooling',
    burnt: false,
  });
}
