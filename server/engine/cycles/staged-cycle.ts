import { EngineInputError } from '../errors';
import { burnFuelInto, fuelEnthalpyAt, makeFuel, makeStream, type Fuel, type GasStream } from '../processes/combustion';
import { compress, newStageSeed } from '../processes/compression';
import { stateAt, stateFromEnthalpy, type FlowState } from '../processes/flow-state';
import { changeTemperature } from '../processes/heat-exchange';
import { ConstantCpAir } from '../properties/constant-cp-air';
import type { GasModel } from '../properties/gas-model';
import { humidAir } from '../properties/humid-air';
import { IdealGasMixture } from '../properties/ideal-gas-mixture';
import { enthalpyOf, enthalpyWithLog, standardEntropyWithLog } from '../properties/property-polynomial';
import { resolveInput, type ResolvedInput } from './resolve-input';
import { isobarPath, polytropicPath } from './t-s-paths';
import {
  checkStageExit,
  freshTrainPass,
  regeneratorDuty,
  runTrain,
  type TrainPass,
  type TrainSetup,
} from './turbine-train';
import type {
  CycleInput,
  CycleResult,
  CycleWarning,
  EvaluateOptions,
  PathKind,
  ProcessPath,
  StatePoint,
} from './types';

/** Above this burner exit temperature the products dissociate noticeably, which complete combustion ignores (common practice). */
const DISSOCIATION_WARNING_K = 2200;
const DEFAULT_POINTS_PER_PROCESS = 16;

/** One state in flow order, with the gas there and how the flow got to it. */
interface StateRecord {
  readonly label: string;
  readonly state: FlowState;
  readonly gas: GasModel;
  /** kg of gas per kg of compressor inlet air. */
  readonly mass: number;
  /** The process from the previous state to this one (none for the first). */
  readonly process: PathKind | null;
  /** True when the composition changed on the way in (a burner). */
  readonly burnt: boolean;
}

// The inlet air and the fuel model depend only on the ambient and the fuel blend. Sweeps
// and the board re-evaluate many cycles at one site, so the last of each is kept (they
// are immutable, so sharing them is safe and keeps evaluation free of hidden state).
interface InletAir {
  /** The ambient it was made for. */
  readonly temperatureK: number;
  readonly pressureKPa: number;
  readonly relativeHumidity: number;
  /** The air as a stream (1 kg per kg of inlet air), for burning fuel in; its gas is the inlet air's. */
  readonly stream: GasStream;
}
let cachedAir: InletAir | null = null;
let cachedFuel: Fuel | null = null;
const CONSTANT_CP_AIR = new ConstantCpAir();

function inletAir(r: ResolvedInput): InletAir {
  const t = r.ambientTemperatureK;
  const p = r.ambientPressureKPa;
  const rh = r.relativeHumidity;
  // Compared as numbers: a string key would cost three number-to-text conversions per evaluation.
  if (cachedAir && cachedAir.temperatureK === t && cachedAir.pressureKPa === p && cachedAir.relativeHumidity === rh)
    return cachedAir;
  cachedAir = {
    temperatureK: t,
    pressureKPa: p,
    relativeHumidity: rh,
    stream: makeStream(humidAir(t, p, rh).amountsPerKg),
  };
  return cachedAir;
}

function fuelFor(hydrogenVolumeFraction: number): Fuel {
  if (cachedFuel && cachedFuel.hydrogenVolumeFraction === hydrogenVolumeFraction) return cachedFuel;
  cachedFuel = makeFuel(hydrogenVolumeFraction);
  return cachedFuel;
}

function numbered(label: string, i: number, count: number): string {
  return count > 1 ? `${label} ${i}` : label;
}

// Stage labels of each part by stage count, filled on first use: building the strings would
// cost more than the rest of a small evaluation, and one list per part keeps each lookup a
// plain array read (a lookup by part name would be a generic property lookup).
const COMPRESSOR_LABELS: (readonly string[])[] = [];
const INTERCOOLER_LABELS: (readonly string[])[] = [];
const TURBINE_LABELS: (readonly string[])[] = [];
const REHEATER_LABELS: (readonly string[])[] = [];

/** Labels "turbine 1 exit", … for `count` stages (index 1…count), made once per part and count. */
function stageLabels(byCount: (readonly string[])[], name: string, count: number, suffix: string): readonly string[] {
  let labels = byCount[count];
  if (!labels) {
    const made = [''];
    for (let i = 1; i <= count; i++) made.push(numbered(name, i, count) + suffix);
    labels = byCount[count] = made;
  }
  return labels;
}

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
function solveTurbineTrain(s: TrainSetup, pass: TrainPass, regenerator: boolean): number {
  if (regenerator && s.change) return closeRegeneratorLoop(s, pass);
  runTrain(s, s.coldInletEnthalpy, pass);
  return regenerator ? s.coldInletEnthalpy + regeneratorDuty(s, pass) : s.coldInletEnthalpy;
}

/**
 * The fixed numbers of the turbine train for one evaluation (see TrainSetup). `airStream` and
 * `fuel` are given when the fuel burns in the gas (combustion mode), null otherwise.
 */
function trainSetup(
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

const OXYGEN = 1;

// Mixtures of the products after each burner, reused from one evaluation to the next (a
// new mixture allocates its polynomial, which costs more than filling it). Safe because the
// engine is synchronous and the gases never leave an evaluation: states and paths are built
// from them before it returns, and the result carries numbers only.
const PRODUCT_GASES: IdealGasMixture[] = [];

function productGas(burner: number): IdealGasMixture {
  let gas = PRODUCT_GASES[burner];
  if (!gas) gas = PRODUCT_GASES[burner] = new IdealGasMixture([1, 0, 0, 0, 0, 0, 0]);
  return gas;
}

/**
 * The states of the hot section (combustor exit, turbine and reheater exits) from the
 * numbers of the final pass, with their gases: the mixtures of the products are made here,
 * once per burner, not on every pass. Returns the turbine work from the states' enthalpies.
 */
function hotRecords(
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

/**
 * Evaluates the general staged cycle (see README): N-stage intercooled compression,
 * optional regenerator, combustor, M-stage expansion with reheat, exhaust to ambient.
 * Results per kg of compressor inlet air. Throws EngineInputError on impossible input.
 */
export function evaluateStagedCycle(input: CycleInput, options: EvaluateOptions = {}): CycleResult {
  const r = resolveInput(input);
  const warnings: CycleWarning[] = [];
  typicalRangeWarnings(r, warnings);
  const combustion = r.fluid === 'combustion';
  const air = r.fluid === 'constant-cp-air' ? null : inletAir(r);
  const airGas: GasModel = air ? air.stream.gas : CONSTANT_CP_AIR;
  const fuel = r.fuel ? fuelFor(r.fuel.hydrogenVolumeFraction) : null;
  // The air the fuel burns in, and that fuel: in combustion mode only (the air modes use the
  // fuel for its heating value alone).
  const burnStream = combustion && air ? air.stream : null;
  const burnFuel = combustion ? fuel : null;

  const records: StateRecord[] = [];
  const inlet = stateAt(airGas, r.ambientTemperatureK, r.ambientPressureKPa);
  records.push({ label: 'compressor inlet', state: inlet, gas: airGas, mass: 1, process: null, burnt: false });

  // Compression: N equal stage ratios whose product, less the intercooler losses, is the
  // overall ratio: r = r_s^N (1 − Δp_ic)^(N−1).
  const n = r.compressorStages;
  const stageRatio = Math.pow(r.pressureRatio / Math.pow(1 - r.intercoolerPressureLoss, n - 1), 1 / n);
  let compressorWorkKJ = 0;
  let current = inlet;
  const compressorLabels = stageLabels(COMPRESSOR_LABELS, 'compressor', n, ' exit');
  const intercoolerLabels = stageLabels(INTERCOOLER_LABELS, 'intercooler', n, ' exit');
  const seed = newStageSeed();
  for (let i = 1; i <= n; i++) {
    const exit = compress(airGas, current, stageRatio, r.compressorEfficiency, seed);
    checkStageExit(exit.temperatureK, 'compressor', i);
    compressorWorkKJ += exit.enthalpyKJPerKg - current.enthalpyKJPerKg;
    records.push({
      label: compressorLabels[i],
      state: exit,
      gas: airGas,
      mass: 1,
      process: 'compression',
      burnt: false,
    });
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
      const cooled = changeTemperature(airGas, exit, r.intercoolTemperatureK, r.intercoolerPressureLoss);
      records.push({
        label: intercoolerLabels[i],
        state: cooled,
        gas: airGas,
        mass: 1,
        process: 'heat-rejection',
        burnt: false,
      });
      current = cooled;
    }
  }
  const compressorExit = current;

  // Pressures of the hot section: the last turbine exhausts at ambient pressure, or just
  // above it when the exhaust still has to pass the regenerator's gas side.
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

  const setup = trainSetup(r, airGas, burnStream, burnFuel, compressorExit, expansionRatio);
  const pass = freshTrainPass();
  const combustorInletEnthalpy = solveTurbineTrain(setup, pass, regenerator !== null);
  const last = pass.count - 1;
  const exhaustK = pass.temperatureK[last];
  // Cold outlet and duty from x itself: then the duty on the air side is exactly what the
  // burner saw, and the hot outlet follows from the energy balance with that duty.
  const regeneratorDutyKJ = combustorInletEnthalpy - compressorExit.enthalpyKJPerKg;
  const combustorInlet = regenerator
    ? stateFromEnthalpy(
        airGas,
        combustorInletEnthalpy,
        combustorInletKPa,
        compressorExit.temperatureK + regenerator.effectiveness * (exhaustK - compressorExit.temperatureK),
      )
    : compressorExit;
  if (!(r.turbineInletTemperatureK > combustorInlet.temperatureK)) {
    throw new EngineInputError(
      'turbine.inletTemperatureK',
      `The turbine inlet temperature (${r.turbineInletTemperatureK} K) must be above the combustor inlet temperature (${combustorInlet.temperatureK.toFixed(1)} K).`,
    );
  }
  if (regenerator) {
    if (exhaustK < compressorExit.temperatureK) {
      warnings.push({
        code: 'regenerator-cools-air',
        field: 'regenerator',
        message: `The compressor exit (${compressorExit.temperatureK.toFixed(1)} K) is hotter than the turbine exhaust (${exhaustK.toFixed(1)} K), so the regenerator would cool the air; leave it out or lower the pressure ratio.`,
      });
    }
    records.push({
      label: 'regenerator cold out',
      state: combustorInlet,
      gas: airGas,
      mass: 1,
      process: 'regenerator-heating',
      burnt: false,
    });
  }
  const turbineWorkKJ = hotRecords(pass, airGas, burnStream, burnFuel, turbineInletKPa, expansionRatio, r, records);
  if (regenerator) {
    const hotIn = records[records.length - 1];
    records.push({
      label: 'regenerator hot out',
      state: stateFromEnthalpy(
        hotIn.gas,
        hotIn.state.enthalpyKJPerKg - regeneratorDutyKJ / hotIn.mass,
        hotIn.state.pressureKPa * (1 - regenerator.gasSidePressureLoss),
        exhaustK - regenerator.effectiveness * (exhaustK - compressorExit.temperatureK),
      ),
      gas: hotIn.gas,
      mass: hotIn.mass,
      process: 'regenerator-cooling',
      burnt: false,
    });
  }
  const fuelBurntKg = pass.fuelKg[last];

  // Heat input: fuel × LHV when the fuel burns in the gas; otherwise the enthalpy rise
  // in combustor and reheaters.
  let heatInputKJ: number;
  let fuelAirRatio: number | null = null;
  if (combustion && fuel) {
    fuelAirRatio = fuelBurntKg;
    heatInputKJ = fuelBurntKg * fuel.lowerHeatingValueKJPerKg;
  } else {
    heatInputKJ = setup.airEnthalpyAtInlet - combustorInlet.enthalpyKJPerKg + pass.reheatHeatKJ;
    if (fuel) fuelAirRatio = heatInputKJ / fuel.lowerHeatingValueKJPerKg;
  }

  const exhaust = records[records.length - 1];
  const netWorkKJ = turbineWorkKJ - compressorWorkKJ;
  const thermalEfficiency = netWorkKJ / heatInputKJ;
  let airMassFlowKgPerS: number | null = null;
  let fuelMassFlowKgPerS: number | null = null;
  let heatRateKJPerKWh: number | null = null;
  let co2KgPerMWh: number | null = null;
  if (netWorkKJ > 0) {
    const electricKJ = netWorkKJ * r.generatorEfficiency;
    airMassFlowKgPerS = r.netPowerKW / electricKJ;
    heatRateKJPerKWh = (3600 * heatInputKJ) / electricKJ;
    if (fuelAirRatio !== null && fuel) {
      fuelMassFlowKgPerS = airMassFlowKgPerS * fuelAirRatio;
      co2KgPerMWh = (fuelAirRatio * fuel.co2KgPerKgFuel * 3.6e6) / electricKJ;
    }
  } else {
    warnings.push({
      code: 'no-net-work',
      message:
        'The turbines give no more work than the compressors take, so no air flow can deliver the required power.',
    });
  }
  resultWarnings(r, exhaust.state.temperatureK, combustion, warnings);

  const states: StatePoint[] = records.map((record, i) => ({
    n: i + 1,
    label: record.label,
    temperatureK: record.state.temperatureK,
    pressureKPa: record.state.pressureKPa,
    enthalpyKJPerKg: record.state.enthalpyKJPerKg,
    entropyKJPerKgK: record.state.entropyKJPerKgK,
    massFlowRatio: record.mass,
  }));

  return {
    states,
    compressorWorkKJPerKg: compressorWorkKJ,
    turbineWorkKJPerKg: turbineWorkKJ,
    netWorkKJPerKg: netWorkKJ,
    heatInputKJPerKg: heatInputKJ,
    thermalEfficiency,
    backWorkRatio: compressorWorkKJ / turbineWorkKJ,
    regeneratorDutyKJPerKg: regeneratorDutyKJ,
    exhaustTemperatureK: exhaust.state.temperatureK,
    fuelAirRatio,
    fuelLowerHeatingValueKJPerKg: fuel ? fuel.lowerHeatingValueKJPerKg : null,
    airMassFlowKgPerS,
    fuelMassFlowKgPerS,
    heatRateKJPerKWh,
    co2KgPerMWh,
    paths: options.paths === false ? [] : buildPaths(records, options.pointsPerProcess ?? DEFAULT_POINTS_PER_PROCESS),
    warnings,
  };
}

function buildPaths(records: StateRecord[], pointsPerProcess: number): ProcessPath[] {
  const points = Math.max(2, Math.min(200, Math.round(pointsPerProcess)));
  const paths: ProcessPath[] = [];
  for (let i = 1; i < records.length; i++) {
    const a = records[i - 1];
    const b = records[i];
    const kind = b.process!;
    paths.push(
      kind === 'compression' || kind === 'expansion'
        ? polytropicPath(b.gas, a.state, b.state, points, kind, i, i + 1)
        : isobarPath(b.gas, a.state, b.state, points, kind, i, i + 1, b.burnt),
    );
  }
  // The exhaust returns to the ambient state outside the plant: heat rejection at ambient pressure.
  const exhaust = records[records.length - 1];
  const first = records[0];
  paths.push(
    isobarPath(
      first.gas,
      exhaust.state,
      first.state,
      points,
      'heat-rejection',
      records.length,
      1,
      exhaust.gas !== first.gas,
    ),
  );
  return paths;
}

/** Warnings from the ranges of common practice (PRODUCT defaults table). */
function typicalRangeWarnings(r: ResolvedInput, warnings: CycleWarning[]): void {
  checkTypical(
    warnings,
    r.compressorEfficiency,
    0.75,
    0.95,
    'compressor.isentropicEfficiency',
    'A compressor stage isentropic efficiency',
  );
  checkTypical(
    warnings,
    r.turbineEfficiency,
    0.75,
    0.95,
    'turbine.isentropicEfficiency',
    'A turbine stage isentropic efficiency',
  );
  checkTypical(warnings, r.combustorPressureLoss, 0.01, 0.08, 'combustorPressureLoss', 'A combustor pressure loss');
  if (r.compressorStages > 1) {
    checkTypical(
      warnings,
      r.intercoolerPressureLoss,
      0,
      0.05,
      'compressor.intercoolerPressureLoss',
      'An intercooler pressure loss',
    );
  }
  if (r.regenerator) {
    checkTypical(
      warnings,
      r.regenerator.effectiveness,
      0.5,
      0.95,
      'regenerator.effectiveness',
      'A regenerator effectiveness',
    );
    checkTypical(
      warnings,
      r.regenerator.airSidePressureLoss,
      0,
      0.08,
      'regenerator.airSidePressureLoss',
      'A regenerator air-side pressure loss',
    );
    checkTypical(
      warnings,
      r.regenerator.gasSidePressureLoss,
      0,
      0.08,
      'regenerator.gasSidePressureLoss',
      'A regenerator gas-side pressure loss',
    );
  }
  checkTypical(warnings, r.generatorEfficiency, 0.95, 1, 'generatorEfficiency', 'A generator efficiency');
}

// A module function, not a closure inside typicalRangeWarnings: the transpiler names every
// closure it creates (a property definition on each call), which cost more than the checks.
function checkTypical(
  warnings: CycleWarning[],
  value: number,
  low: number,
  high: number,
  field: string,
  what: string,
): void {
  if (value < low || value > high) {
    warnings.push({
      code: 'outside-typical-range',
      field,
      message: `${what} of ${value} is outside the usual ${low}–${high}.`,
    });
  }
}

function resultWarnings(r: ResolvedInput, exhaustK: number, combustion: boolean, warnings: CycleWarning[]): void {
  const limit = r.maxTurbineInletTemperatureK;
  if (limit !== null && r.turbineInletTemperatureK > limit) {
    warnings.push({
      code: 'turbine-inlet-above-limit',
      field: 'turbine.inletTemperatureK',
      message: `The turbine inlet temperature (${r.turbineInletTemperatureK} K) is above the limit of the design basis (${limit} K).`,
    });
  }
  if (limit !== null && r.turbineStages > 1 && r.reheatTemperatureK > limit) {
    warnings.push({
      code: 'turbine-inlet-above-limit',
      field: 'turbine.reheatTemperatureK',
      message: `The reheat temperature (${r.reheatTemperatureK} K) is above the turbine inlet limit of the design basis (${limit} K).`,
    });
  }
  if (r.exhaustTemperatureMinK !== null && exhaustK < r.exhaustTemperatureMinK) {
    warnings.push({
      code: 'exhaust-below-window',
      message: `The exhaust leaves at ${exhaustK.toFixed(1)} K, below the window of the design basis (from ${r.exhaustTemperatureMinK} K).`,
    });
  }
  if (r.exhaustTemperatureMaxK !== null && exhaustK > r.exhaustTemperatureMaxK) {
    warnings.push({
      code: 'exhaust-above-window',
      message: `The exhaust leaves at ${exhaustK.toFixed(1)} K, above the window of the design basis (up to ${r.exhaustTemperatureMaxK} K).`,
    });
  }
  const hottest = Math.max(r.turbineInletTemperatureK, r.turbineStages > 1 ? r.reheatTemperatureK : 0);
  if (combustion && hottest > DISSOCIATION_WARNING_K) {
    warnings.push({
      code: 'dissociation-neglected',
      field: 'turbine.inletTemperatureK',
      message: `Above about ${DISSOCIATION_WARNING_K} K the products dissociate; complete combustion overstates the temperature reached per kg of fuel.`,
    });
  }
}
