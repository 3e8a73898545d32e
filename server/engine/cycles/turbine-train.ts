/**
 * The hot section as numbers only: combustor, turbine stages and reheaters for a given
 * combustor inlet enthalpy, then the regenerator duty that exhaust would give. This is the
 * inner loop of the engine (the regenerator loop of the combustion mode runs it several
 * times per evaluation), so it works on scalars and reused scratch arrays: no state
 * objects, no mixtures, no labels. The cycle builds its states once, from the last pass.
 *
 * Everything is extensive, per kg of compressor inlet air (kJ, kJ/K): burning w kg of fuel
 * in the air gives products whose property polynomial is air + w × change (see
 * property-polynomial.ts), so a burner is one weighted sum and the per-kg division is never
 * needed. An expansion at fixed composition keeps its per-kg form multiplied by the mass:
 *   S(T2s) = S(T1) + Ru n ln(p2/p1)   (n: kmol of gas, so Ru n = mass × R),
 *   H2 = H1 − η (H1 − H(T2s)).
 * The entropy of mixing is left out: at fixed composition it cancels from S(T2s) − S(T1).
 */
import { EngineInputError } from '../errors';
import { MAX_STAGES, MAX_TEMPERATURE_K, MIN_TEMPERATURE_K } from '../input-limits';
import { burnFuelInto, fuelEnthalpyAt, type Fuel, type GasStream } from '../processes/combustion';
import type { FlowState } from '../processes/flow-state';
import type { GasModel } from '../properties/gas-model';
import { SPECIES_INDEX, UNIVERSAL_GAS_CONSTANT } from '../properties/nasa-species';
import * as propertyPolynomial from '../properties/property-polynomial';
import type { Polynomial } from '../properties/property-polynomial';
import { productGas } from './cycle-gases';
import type { ResolvedInput } from './resolve-input';
import { REHEATER_LABELS, stageLabels, TURBINE_LABELS, type StateRecord } from './state-records';

// Local copies of the imported functions: once transpiled, every read of an imported binding
// is a getter call, which the optimiser does not always inline, and these run in every pass.
const {
  blendPolynomials,
  cpOf,
  enthalpyOf,
  enthalpyWithLog,
  newPolynomial,
  standardEntropyWithLog,
  temperatureFromEnthalpyOf,
  temperatureFromStandardEntropyOf,
} = propertyPolynomial;

// Local copies: an imported binding is a property getter once transpiled, read per stage.
const MIN_K = MIN_TEMPERATURE_K;
const MAX_K = MAX_TEMPERATURE_K;
const RU = UNIVERSAL_GAS_CONSTANT;
const OXYGEN = SPECIES_INDEX.O2;

/** What a pass needs, fixed for one evaluation. Enthalpies kJ and entropies kJ/K per kg of inlet air. */
export interface TrainSetup {
  /** Property polynomial of the compressor inlet air, per kg of it (no mixing term needed). */
  readonly air: Polynomial;
  readonly airMoles: number;
  /** Polynomial of the change per kg of fuel burnt; null when no fuel burns in the gas (air modes). */
  readonly change: Polynomial | null;
  readonly changeMoles: number;
  /** Fuel that would burn all the oxygen of the air, kg per kg of air. */
  readonly maxFuelKg: number;
  readonly stages: number;
  readonly inletK: number;
  readonly reheatK: number;
  readonly efficiency: number;
  /** ln(p_exit / p_inlet) of each stage (negative). */
  readonly logStagePressureRatio: number;
  /** Air and change enthalpy and s° at the turbine inlet and reheat temperatures. */
  readonly airEnthalpyAtInlet: number;
  readonly airEntropyAtInlet: number;
  readonly changeEnthalpyAtInlet: number;
  readonly changeEntropyAtInlet: number;
  readonly airEnthalpyAtReheat: number;
  readonly airEntropyAtReheat: number;
  readonly changeEnthalpyAtReheat: number;
  readonly changeEntropyAtReheat: number;
  /** Heat the fuel gives per kg when its products leave at the turbine inlet / reheat temperature (fuelRelease). */
  readonly releaseToInlet: number;
  readonly releaseToReheat: number;
  /** Regenerator: effectiveness, cold inlet (compressor exit) temperature and enthalpy, and the change's enthalpy there. */
  readonly effectiveness: number;
  readonly coldInletK: number;
  readonly coldInletEnthalpy: number;
  readonly changeEnthalpyAtColdInlet: number;
}

/**
 * The numbers of one pass. States of the hot section in flow order: combustor exit, turbine
 * 1 exit, reheater 1 exit, …, turbine M exit (2M of them).
 */
export interface TrainPass {
  readonly temperatureK: Float64Array;
  /** Extensive enthalpy, kJ per kg of inlet air. */
  readonly enthalpy: Float64Array;
  /** Fuel burnt upstream of each state, kg per kg of inlet air. */
  readonly fuelKg: Float64Array;
  /** Isentropic exit temperature of each stage (index 1…M), kept to seed the next pass. */
  readonly isentropicK: Float64Array;
  /** The isentropic and actual exit temperatures of each stage one pass further back, and the
   * combustor inlet enthalpies of the last two passes: the next pass extrapolates from them. */
  readonly previousIsentropicK: Float64Array;
  readonly previousExitK: Float64Array;
  inletEnthalpy: number;
  previousInletEnthalpy: number;
  count: number;
  /** Air modes: enthalpy added in the reheaters. */
  reheatHeatKJ: number;
  /** Combustion: the polynomial of the gas after the last burner (scratch, overwritten by each pass). */
  readonly gas: Polynomial;
  /** Passes run in this evaluation, so far. */
  passes: number;
}

function newTrainPass(): TrainPass {
  const states = 2 * MAX_STAGES;
  return {
    temperatureK: new Float64Array(states),
    enthalpy: new Float64Array(states),
    fuelKg: new Float64Array(states),
    isentropicK: new Float64Array(MAX_STAGES + 1),
    previousIsentropicK: new Float64Array(MAX_STAGES + 1),
    previousExitK: new Float64Array(MAX_STAGES + 1),
    inletEnthalpy: 0,
    previousInletEnthalpy: 0,
    count: 0,
    reheatHeatKJ: 0,
    gas: newPolynomial(),
    passes: 0,
  };
}

// One scratch pass, sized for the most stages. The engine is synchronous and a pass never
// outlives its evaluation, so one shared set of arrays serves every evaluation without
// allocating (allocation and collection cost more than the arithmetic of a pass).
const SHARED_PASS = newTrainPass();

/** The scratch pass for a new evaluation (valid until the next evaluation starts). */
export function freshTrainPass(): TrainPass {
  SHARED_PASS.passes = 0;
  return SHARED_PASS;
}

/**
 * Runs combustor, turbine stages and reheaters for the combustor inlet enthalpy
 * `combustorInletEnthalpy` (kJ per kg of air) into `pass`. Throws EngineInputError for a
 * burner that cannot reach its temperature, a reheat not above the stage exit, or a state
 * outside the property data.
 */
export function runTrain(s: TrainSetup, combustorInletEnthalpy: number, pass: TrainPass): void {
  const change = s.change;
  // Air modes: the gas is the air throughout. Combustion: a scratch polynomial re-blended at each burner.
  const gas = change ? pass.gas : s.air;
  let fuelKg = 0;
  if (change) {
    const rise = s.airEnthalpyAtInlet - combustorInletEnthalpy;
    if (!(rise > 0)) {
      const inletK = temperatureFromEnthalpyOf(s.air, combustorInletEnthalpy, s.coldInletK);
      throw new EngineInputError(
        'turbine.inletTemperatureK',
        `The turbine inlet temperature (${s.inletK} K) must be above the gas temperature entering it (${inletK.toFixed(1)} K).`,
      );
    }
    fuelKg = burntToReach(s, rise, s.releaseToInlet, 0, 'turbine.inletTemperatureK', s.inletK);
    blendPolynomials(pass.gas, s.air, change, fuelKg);
  }
  let t = s.inletK;
  let h = s.airEnthalpyAtInlet + fuelKg * s.changeEnthalpyAtInlet;
  let entropy = s.airEntropyAtInlet + fuelKg * s.changeEntropyAtInlet;
  record(pass, 0, t, h, fuelKg);
  let reheatHeatKJ = 0;
  const m = s.stages;
  // Seeds of the inversions. From the third pass on, each temperature is extrapolated
  // linearly in the combustor inlet enthalpy from the last two passes (the passes close in
  // on the answer, so this lands within a hundredth of a kelvin or so: one step); on the
  // second pass, the first pass's value; on the first pass, the temperature ratios of the
  // stage before (stages behind a reheat start where the first started), and for the first
  // stage the constant-cp answer. The choice is written out for each of the two inversions
  // rather than through a shared helper: the first-pass seeds differ, and each is computed
  // only on the branch that takes it.
  const passes = pass.passes;
  const span = pass.inletEnthalpy - pass.previousInletEnthalpy;
  const extrapolation = span !== 0 ? (combustorInletEnthalpy - pass.inletEnthalpy) / span : 0;
  let isentropicRatio = 0;
  let exitRatio = 0;
  for (let j = 1; j <= m; j++) {
    // Isentropic exit: S(T2s) = S(T1) + Ru n ln(p2/p1).
    const rn = RU * (s.airMoles + fuelKg * s.changeMoles);
    const lastIsentropicK = pass.isentropicK[j];
    const isentropicGuess =
      passes >= 2
        ? lastIsentropicK + extrapolation * (lastIsentropicK - pass.previousIsentropicK[j])
        : passes === 1
          ? lastIsentropicK
          : j > 1
            ? t * isentropicRatio
            : t * Math.exp((s.logStagePressureRatio * rn) / cpOf(gas, t));
    const isentropicK = temperatureFromStandardEntropyOf(gas, entropy + rn * s.logStagePressureRatio, isentropicGuess);
    const isentropicEnthalpy = enthalpyOf(gas, isentropicK);
    const exitEnthalpy = h - s.efficiency * (h - isentropicEnthalpy);
    // T(h), seeded likewise; the first stage of the first pass takes one linear step from the isentropic exit.
    const k = 2 * j - 1;
    const lastExitK = pass.temperatureK[k];
    const exitGuess =
      passes >= 2
        ? lastExitK + extrapolation * (lastExitK - pass.previousExitK[j])
        : passes === 1
          ? lastExitK
          : j > 1
            ? t * exitRatio
            : isentropicK + (exitEnthalpy - isentropicEnthalpy) / cpOf(gas, isentropicK);
    const exitK = temperatureFromEnthalpyOf(gas, exitEnthalpy, exitGuess);
    isentropicRatio = isentropicK / t;
    exitRatio = exitK / t;
    pass.previousIsentropicK[j] = lastIsentropicK;
    pass.previousExitK[j] = lastExitK;
    checkStageExit(isentropicK, 'turbine', j, true);
    checkStageExit(exitK, 'turbine', j, false);
    pass.isentropicK[j] = isentropicK;
    record(pass, k, exitK, exitEnthalpy, fuelKg);
    h = exitEnthalpy;
    if (j === m) break;
    if (!(s.reheatK > exitK)) {
      throw new EngineInputError(
        'turbine.reheatTemperatureK',
        `The reheat temperature (${s.reheatK} K) must be above the turbine ${j} exit temperature (${exitK.toFixed(1)} K).`,
      );
    }
    const reheatedAir = s.airEnthalpyAtReheat;
    if (change) {
      const rise = reheatedAir + fuelKg * s.changeEnthalpyAtReheat - h;
      fuelKg = burntToReach(s, rise, s.releaseToReheat, fuelKg, 'turbine.reheatTemperatureK', s.reheatK);
      blendPolynomials(pass.gas, s.air, change, fuelKg);
    } else {
      reheatHeatKJ += reheatedAir - h;
    }
    t = s.reheatK;
    h = reheatedAir + fuelKg * s.changeEnthalpyAtReheat;
    entropy = s.airEntropyAtReheat + fuelKg * s.changeEntropyAtReheat;
    record(pass, k + 1, t, h, fuelKg);
  }
  pass.count = 2 * m;
  pass.reheatHeatKJ = reheatHeatKJ;
  pass.previousInletEnthalpy = pass.inletEnthalpy;
  pass.inletEnthalpy = combustorInletEnthalpy;
  pass.passes = passes + 1;
}

/**
 * Regenerator duty Q = ε Q_max that the exhaust of `pass` gives air entering at the
 * compressor exit, kJ per kg of air (see regenerate in processes/heat-exchange.ts for the
 * definition; cold mass 1, hot mass 1 + fuel). Q_max is the smaller in magnitude of
 * H_air(T_h,in) − H_air(T_c,in) and H_h,in − H_h(T_c,in).
 */
export function regeneratorDuty(s: TrainSetup, pass: TrainPass): number {
  const last = pass.count - 1;
  const hotK = pass.temperatureK[last];
  const coldMax = enthalpyOf(s.air, hotK) - s.coldInletEnthalpy;
  // The exhaust's enthalpy at the cold inlet temperature: linear in the fuel burnt.
  const hotAtColdInlet = s.coldInletEnthalpy + pass.fuelKg[last] * s.changeEnthalpyAtColdInlet;
  const hotMax = pass.enthalpy[last] - hotAtColdInlet;
  return s.effectiveness * (Math.abs(coldMax) <= Math.abs(hotMax) ? coldMax : hotMax);
}

function record(pass: TrainPass, k: number, temperatureK: number, enthalpy: number, fuelKg: number): void {
  pass.temperatureK[k] = temperatureK;
  pass.enthalpy[k] = enthalpy;
  pass.fuelKg[k] = fuelKg;
}

/**
 * Total fuel burnt after a burner that must raise the gas's enthalpy by `rise` (kJ per kg
 * of air, positive) when each kg of fuel releases `release`: the products are linear in the
 * fuel (see burnToTemperature in processes/combustion.ts), so fuel = rise / release, no iteration.
 */
function burntToReach(
  s: TrainSetup,
  rise: number,
  release: number,
  burntBefore: number,
  field: string,
  outletK: number,
): number {
  const fuelKg = burntBefore + rise / release;
  if (!(release > 0) || !(fuelKg <= s.maxFuelKg)) {
    throw new EngineInputError(
      field,
      `Reaching ${outletK} K would need more fuel than the oxygen in the gas can burn; lower the temperature.`,
    );
  }
  return fuelKg;
}

/**
 * Refuses a stage exit temperature (compressor or turbine; the actual exit, or the isentropic
 * one the stage is computed from) outside the range of the property data, where the
 * inversions would extrapolate; the pressure ratio is what drives it there.
 */
export function checkStageExit(
  temperatureK: number,
  part: 'compressor' | 'turbine',
  stage: number,
  isentropic: boolean,
): void {
  // The message is built only on failure: this runs for every stage of every pass.
  if (!(temperatureK >= MIN_K && temperatureK <= MAX_K)) {
    throw new EngineInputError(
      'compressor.pressureRatio',
      `The ${part} ${stage} ${isentropic ? 'isentropic exit' : 'exit'} temperature would be ${Number.isFinite(temperatureK) ? temperatureK.toFixed(1) + ' K' : 'undefined'}, outside the range of the property data (${MIN_K}–${MAX_K} K); change the pressure ratio.`,
    );
  }
}

/**
 * The fixed numbers of the turbine train for one evaluation (see TrainSetup). `airStream` and
 * `fuel` are given when the fuel burns in the gas (combustion mode), null otherwise.
 */
export function trainSetup(
  r: ResolvedInput,
  airGas: GasModel,
  airStream: GasStream | null,
  fuel: Fuel | null,
  compressorExit: FlowState,
  expansionRatio: number,
): TrainSetup {
  const polynomial = airGas.polynomial;
  const change = fuel && airStream ? fuel.changePolynomial : null;
  const inletK = r.turbineInletTemperatureK;
  const reheatK = r.reheatTemperatureK;
  const coldInletK = compressorExit.temperatureK;
  // Each of these costs a logarithm; the reheat temperature is by default the turbine inlet
  // temperature, and then its values are the inlet's.
  const sameReheat = reheatK === inletK;
  // One logarithm per temperature serves h and s° of air and change there.
  const lnInlet = Math.log(inletK);
  const lnReheat = sameReheat ? lnInlet : Math.log(reheatK);
  const airEnthalpyAtInlet = enthalpyWithLog(polynomial, inletK, lnInlet);
  const airEntropyAtInlet = standardEntropyWithLog(polynomial, inletK, lnInlet);
  const airEnthalpyAtReheat = sameReheat ? airEnthalpyAtInlet : enthalpyWithLog(polynomial, reheatK, lnReheat);
  const airEntropyAtReheat = sameReheat ? airEntropyAtInlet : standardEntropyWithLog(polynomial, reheatK, lnReheat);
  let changeEnthalpyAtInlet = 0;
  let changeEntropyAtInlet = 0;
  let changeEnthalpyAtReheat = 0;
  let changeEntropyAtReheat = 0;
  let fuelEnthalpy = 0;
  if (change && fuel && r.fuel) {
    changeEnthalpyAtInlet = enthalpyWithLog(change, inletK, lnInlet);
    changeEntropyAtInlet = standardEntropyWithLog(change, inletK, lnInlet);
    changeEnthalpyAtReheat = sameReheat ? changeEnthalpyAtInlet : enthalpyWithLog(change, reheatK, lnReheat);
    changeEntropyAtReheat = sameReheat ? changeEntropyAtInlet : standardEntropyWithLog(change, reheatK, lnReheat);
    fuelEnthalpy = fuelEnthalpyAt(fuel, r.fuel.temperatureK);
  }
  return {
    air: polynomial,
    airMoles: 1 / airGas.molarMassKgPerKmol,
    change,
    changeMoles: change && fuel ? fuel.changeMolesPerKg : 0,
    maxFuelKg: change && fuel && airStream ? airStream.amounts[OXYGEN] / -fuel.changePerKg[OXYGEN] : 0,
    stages: r.turbineStages,
    inletK,
    reheatK,
    efficiency: r.turbineEfficiency,
    logStagePressureRatio: -Math.log(expansionRatio),
    airEnthalpyAtInlet,
    airEntropyAtInlet,
    changeEnthalpyAtInlet,
    changeEntropyAtInlet,
    airEnthalpyAtReheat,
    airEntropyAtReheat,
    changeEnthalpyAtReheat,
    changeEntropyAtReheat,
    // The heat each kg of fuel gives when its products leave at T: h_f(T_fuel) − Σ νᵢ hᵢ(T) (see fuelRelease).
    releaseToInlet: fuelEnthalpy - changeEnthalpyAtInlet,
    releaseToReheat: fuelEnthalpy - changeEnthalpyAtReheat,
    effectiveness: r.regenerator ? r.regenerator.effectiveness : 0,
    coldInletK,
    coldInletEnthalpy: compressorExit.enthalpyKJPerKg,
    changeEnthalpyAtColdInlet: change && r.regenerator ? enthalpyOf(change, coldInletK) : 0,
  };
}

/**
 * The states of the hot section (combustor exit, turbine and reheater exits) from the
 * numbers of the final pass, appended to `records` with their gases: the mixtures of the
 * products are made here, once per burner, not on every pass. Returns the turbine work
 * from the states' enthalpies, kJ per kg of inlet air.
 */
export function turbineTrainRecords(
  pass: TrainPass,
  airGas: GasModel,
  airStream: GasStream | null,
  fuel: Fuel | null,
  turbineInletKPa: number,
  expansionRatio: number,
  r: ResolvedInput,
  records: StateRecord[],
): number {
  let gas = airGas;
  let mass = 1;
  let pressureKPa = turbineInletKPa;
  let turbineWorkKJ = 0;
  let previousEnthalpy = 0;
  const m = r.turbineStages;
  const turbineLabels = stageLabels(TURBINE_LABELS, 'turbine', m, ' exit');
  const reheaterLabels = stageLabels(REHEATER_LABELS, 'reheater', m, ' exit');
  for (let k = 0; k < pass.count; k++) {
    const expansion = k % 2 === 1;
    const burnt = !expansion && airStream !== null && fuel !== null;
    if (burnt) {
      const products = productGas(k / 2);
      mass = burnFuelInto(products, airStream!, pass.fuelKg[k], fuel!);
      gas = products;
    }
    if (expansion) pressureKPa /= expansionRatio;
    else if (k > 0) pressureKPa *= 1 - r.reheaterPressureLoss;
    const temperatureK = pass.temperatureK[k];
    const enthalpy = pass.enthalpy[k] / mass;
    if (expansion) turbineWorkKJ += mass * (previousEnthalpy - enthalpy);
    previousEnthalpy = enthalpy;
    records.push({
      label: k === 0 ? 'combustor exit' : expansion ? turbineLabels[(k + 1) / 2] : reheaterLabels[k / 2],
      state: {
        temperatureK,
        pressureKPa,
        enthalpyKJPerKg: enthalpy,
        entropyKJPerKgK: gas.entropyKJPerKgK(temperatureK, pressureKPa),
      },
      gas,
      mass,
      process: expansion ? 'expansion' : 'heat-addition',
      burnt,
    });
  }
  return turbineWorkKJ;
}
