import { EngineInputError } from '../errors';
import { type BurnOutcome, type Fuel, type GasStream, burnForRise, fuelRelease, makeFuel, makeStream } from '../processes/combustion';
import { compress } from '../processes/compression';
import { expand } from '../processes/expansion';
import { type FlowState, stateAt } from '../processes/flow-state';
import { type RegeneratorOutcome, changeTemperature, regenerate } from '../processes/heat-exchange';
import { ConstantCpAir } from '../properties/constant-cp-air';
import type { GasModel } from '../properties/gas-model';
import { humidAir } from '../properties/humid-air';
import { POLYNOMIAL_MAX_K as DATA_MAX_K, POLYNOMIAL_MIN_K as DATA_MIN_K } from '../properties/nasa-species';
import { type ResolvedInput, resolveInput } from './resolve-input';
import { changingCompositionPath, isobarPath, polytropicPath } from './t-s-paths';
import type { CycleInput, CycleResult, CycleWarning, EvaluateOptions, PathKind, ProcessPath, StatePoint } from './types';

/** Above this burner exit temperature the products dissociate noticeably, which complete combustion ignores (common practice). */
const DISSOCIATION_WARNING_K = 2200;
const DEFAULT_POINTS_PER_PROCESS = 16;
// Local copies: an imported binding is a getter once transpiled, and these are read per stage.
const POLYNOMIAL_MIN_K = DATA_MIN_K;
const POLYNOMIAL_MAX_K = DATA_MAX_K;

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

interface HotSection {
  readonly records: StateRecord[];
  readonly turbineWorkKJ: number;
  /** Air modes: enthalpy added in the reheaters, kJ per kg of inlet air. */
  readonly reheatHeatKJ: number;
  /** Fuel burnt in combustor and reheaters, kg per kg of inlet air (combustion mode). */
  readonly fuelKg: number;
  readonly last: StateRecord;
}

// The inlet air and the fuel model depend only on the ambient and the fuel blend. Sweeps
// and the board re-evaluate many cycles at one site, so the last of each is kept (they
// are immutable, so sharing them is safe and keeps evaluation free of hidden state).
let cachedAir: { key: string; gas: GasModel; stream: GasStream } | null = null;
let cachedFuel: Fuel | null = null;
const CONSTANT_CP_AIR = new ConstantCpAir();

function inletAir(r: ResolvedInput): { gas: GasModel; stream: GasStream } {
  const key = `${r.ambientTemperatureK}|${r.ambientPressureKPa}|${r.relativeHumidity}`;
  if (cachedAir && cachedAir.key === key) return cachedAir;
  const humid = humidAir(r.ambientTemperatureK, r.ambientPressureKPa, r.relativeHumidity);
  const stream = makeStream(humid.amountsPerKg, 0);
  cachedAir = { key, gas: stream.gas, stream };
  return cachedAir;
}

function fuelFor(hydrogenVolumeFraction: number): Fuel {
  if (cachedFuel && cachedFuel.hydrogenVolumeFraction === hydrogenVolumeFraction) return cachedFuel;
  cachedFuel = makeFuel(hydrogenVolumeFraction);
  return cachedFuel;
}

function checkTemperature(temperatureK: number, field: string, what: string): void {
  if (!(temperatureK >= POLYNOMIAL_MIN_K && temperatureK <= POLYNOMIAL_MAX_K)) {
    throw new EngineInputError(
      field,
      `${what} would be ${Number.isFinite(temperatureK) ? temperatureK.toFixed(1) + ' K' : 'undefined'}, outside the range of the property data (${POLYNOMIAL_MIN_K}–${POLYNOMIAL_MAX_K} K).`,
    );
  }
}

function burnOrThrow(outcome: BurnOutcome, field: string, what: string, inletK: number, outletK: number): GasStream {
  if (outcome.ok) return outcome.products;
  if (outcome.reason === 'not-above-inlet') {
    throw new EngineInputError(field, `${what} (${outletK} K) must be above the gas temperature entering it (${inletK.toFixed(1)} K).`);
  }
  throw new EngineInputError(
    field,
    `Reaching ${outletK} K would need more fuel than the oxygen in the gas can burn; lower the temperature.`,
  );
}

function numbered(label: string, i: number, count: number): string {
  return count > 1 ? `${label} ${i}` : label;
}

/** What the hot section needs, fixed for one evaluation. */
interface HotContext {
  readonly r: ResolvedInput;
  readonly airGas: GasModel;
  /** The inlet air as a stream, when fuel burns in it (combustion mode); otherwise null. */
  readonly airStream: GasStream | null;
  readonly fuel: Fuel | null;
  readonly turbineInletKPa: number;
  readonly expansionRatio: number;
  readonly turbineLabels: readonly string[];
  readonly reheaterLabels: readonly string[];
  /** Combustion mode: inlet air enthalpy at the turbine inlet temperature (kJ/kg), and the
   * heat released per kg of fuel whose products leave at the turbine inlet and at the
   * reheat temperature (kJ/kg); fixed for the evaluation, so computed once. */
  readonly airEnthalpyAtTurbineInlet: number;
  readonly releaseToTurbineInlet: number;
  readonly releaseToReheat: number;
}

// Labels by part name, then by stage count; filled on first use. A string key would cost
// a string build per lookup, several times per evaluation.
const labelCache: Record<string, (readonly string[])[]> = {};

/** Labels "turbine 1 exit", … for `count` stages (index 1…count), made once per name and count. */
function stageLabels(name: string, count: number, suffix: string): readonly string[] {
  const byCount = (labelCache[name] ??= []);
  let labels = byCount[count];
  if (!labels) {
    const made = [''];
    for (let i = 1; i <= count; i++) made.push(numbered(name, i, count) + suffix);
    labels = byCount[count] = made;
  }
  return labels;
}

/**
 * Combustor, turbine stages and reheaters for a given combustor inlet temperature (K).
 * A module function rather than a closure in evaluateStagedCycle: it runs several times
 * per evaluation, and a closure would be re-created (and re-named by the transpiler) on
 * every call.
 */
function hotSection(c: HotContext, combustorInletK: number, combustorInletEnthalpy: number): HotSection {
  const r = c.r;
  const fuel = c.fuel;
  const m = r.turbineStages;
  const out: StateRecord[] = [];
  let stream: GasStream | null = null;
  let gas: GasModel = c.airGas;
  let mass = 1;
  if (c.airStream && fuel) {
    // Per kg of inlet air the air stream's enthalpy is its specific enthalpy.
    const outcome =
      r.turbineInletTemperatureK > combustorInletK
        ? burnForRise(c.airStream, c.airEnthalpyAtTurbineInlet - combustorInletEnthalpy, c.releaseToTurbineInlet, fuel)
        : NOT_ABOVE_INLET;
    stream = burnOrThrow(outcome, 'turbine.inletTemperatureK', 'The turbine inlet temperature', combustorInletK, r.turbineInletTemperatureK);
    gas = stream.gas;
    mass = stream.mass;
  }
  let state = stateAt(gas, r.turbineInletTemperatureK, c.turbineInletKPa);
  out.push({ label: 'combustor exit', state, gas, mass, process: 'heat-addition', burnt: stream !== null });
  let turbineWorkKJ = 0;
  let reheatHeatKJ = 0;
  for (let j = 1; j <= m; j++) {
    const exit = expand(gas, state, c.expansionRatio, r.turbineEfficiency);
    checkStageTemperature(exit.temperatureK, 'turbine', j);
    turbineWorkKJ += mass * (state.enthalpyKJPerKg - exit.enthalpyKJPerKg);
    out.push({ label: c.turbineLabels[j], state: exit, gas, mass, process: 'expansion', burnt: false });
    state = exit;
    if (j < m) {
      if (!(r.reheatTemperatureK > exit.temperatureK)) {
        throw new EngineInputError(
          'turbine.reheatTemperatureK',
          `The reheat temperature (${r.reheatTemperatureK} K) must be above the turbine ${j} exit temperature (${exit.temperatureK.toFixed(1)} K).`,
        );
      }
      if (stream && fuel) {
        // The reheat temperature is above the exit (checked just above).
        const rise = mass * (gas.enthalpyKJPerKg(r.reheatTemperatureK) - exit.enthalpyKJPerKg);
        const outcome = burnForRise(stream, rise, c.releaseToReheat, fuel);
        stream = burnOrThrow(outcome, 'turbine.reheatTemperatureK', 'The reheat temperature', exit.temperatureK, r.reheatTemperatureK);
        gas = stream.gas;
        mass = stream.mass;
      }
      const reheated = changeTemperature(gas, exit, r.reheatTemperatureK, r.reheaterPressureLoss);
      if (!stream) reheatHeatKJ += reheated.enthalpyKJPerKg - exit.enthalpyKJPerKg;
      out.push({ label: c.reheaterLabels[j], state: reheated, gas, mass, process: 'heat-addition', burnt: stream !== null });
      state = reheated;
    }
  }
  return { records: out, turbineWorkKJ, reheatHeatKJ, fuelKg: stream ? stream.fuelBurnt : 0, last: out[out.length - 1] };
}

interface RegeneratedPass {
  readonly hot: HotSection;
  readonly regenerator: RegeneratorOutcome;
}

/** One pass of the hot section at a combustor inlet temperature, then the regenerator it feeds. */
function regeneratedPass(c: HotContext, compressorExit: FlowState, combustorInletK: number): RegeneratedPass {
  const regenerator = c.r.regenerator!;
  const hot = hotSection(c, combustorInletK, c.airGas.enthalpyKJPerKg(combustorInletK));
  const outcome = regenerate(
    {
      coldGas: c.airGas,
      coldInlet: compressorExit,
      coldMass: 1,
      hotGas: hot.last.gas,
      hotInlet: hot.last.state,
      hotMass: hot.last.mass,
    },
    regenerator.effectiveness,
    regenerator.airSidePressureLoss,
    regenerator.gasSidePressureLoss,
  );
  return { hot, regenerator: outcome };
}

/**
 * Typical slope of the regenerator cold outlet with respect to the combustor inlet
 * temperature in combustion mode (a hotter inlet burns less fuel, so the exhaust and the
 * cold outlet run slightly cooler): about −0.01 over the cases the board meets. It only
 * shapes the first step of the iteration below; any value below 1 converges.
 */
const TYPICAL_COUPLING_SLOPE = -0.01;
/** The cold outlet is closed to 1e-11 relative (about 1e-8 K): the energy balance then
 * closes far better than 1e-9. */
const COUPLING_RELATIVE_TOLERANCE = 1e-11;

/**
 * Combustion mode with a regenerator: finds the combustor inlet temperature x that the
 * regenerator delivers, x = F(x), where F runs the hot section and the regenerator. F is
 * nearly linear with a small negative slope, so: one pass at the compressor exit
 * temperature, a first step using the typical slope, then secant steps. That takes four
 * passes of the turbine train where plain secant steps from the same start take five.
 * The pass whose cold outlet meets its own inlet within the tolerance is the result.
 */
function coupledHotSection(c: HotContext, compressorExit: FlowState): RegeneratedPass {
  const start = Math.min(compressorExit.temperatureK, c.r.turbineInletTemperatureK - 1);
  let x = start;
  let pass = regeneratedPass(c, compressorExit, x);
  let g = pass.regenerator.coldOutlet.temperatureK - x;
  let xPrevious = x;
  let gPrevious = g;
  x += g / (1 - TYPICAL_COUPLING_SLOPE);
  for (let iteration = 0; iteration < 50; iteration++) {
    if (Math.abs(g) <= COUPLING_RELATIVE_TOLERANCE * xPrevious) break;
    pass = regeneratedPass(c, compressorExit, x);
    g = pass.regenerator.coldOutlet.temperatureK - x;
    if (Math.abs(g) <= COUPLING_RELATIVE_TOLERANCE * x) break;
    const slope = (g - gPrevious) / (x - xPrevious);
    // A flat or non-finite secant means g is not behaving linearly: take a plain fixed-point step.
    const next = slope < 0 || slope > 0 ? x - g / slope : x + g;
    xPrevious = x;
    gPrevious = g;
    x = Number.isFinite(next) ? next : x + g;
  }
  return pass;
}

const NOT_ABOVE_INLET: BurnOutcome = { ok: false, reason: 'not-above-inlet', fuelKg: 0 };

function checkStageTemperature(temperatureK: number, part: 'compressor' | 'turbine', stage: number): void {
  // The message is built only on failure: this runs for every stage of every pass.
  if (!(temperatureK >= POLYNOMIAL_MIN_K && temperatureK <= POLYNOMIAL_MAX_K)) {
    checkTemperature(temperatureK, 'compressor.pressureRatio', `The ${part} ${stage} exit temperature`);
  }
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
  const airGas: GasModel = air ? air.gas : CONSTANT_CP_AIR;
  const fuel = r.fuel ? fuelFor(r.fuel.hydrogenVolumeFraction) : null;

  const records: StateRecord[] = [];
  const inlet = stateAt(airGas, r.ambientTemperatureK, r.ambientPressureKPa);
  records.push({ label: 'compressor inlet', state: inlet, gas: airGas, mass: 1, process: null, burnt: false });

  // Compression: N equal stage ratios whose product, less the intercooler losses, is the
  // overall ratio: r = r_s^N (1 − Δp_ic)^(N−1).
  const n = r.compressorStages;
  const stageRatio = Math.pow(r.pressureRatio / Math.pow(1 - r.intercoolerPressureLoss, n - 1), 1 / n);
  let compressorWorkKJ = 0;
  let current = inlet;
  const compressorLabels = stageLabels('compressor', n, ' exit');
  const intercoolerLabels = stageLabels('intercooler', n, ' exit');
  for (let i = 1; i <= n; i++) {
    const exit = compress(airGas, current, stageRatio, r.compressorEfficiency);
    checkStageTemperature(exit.temperatureK, 'compressor', i);
    compressorWorkKJ += exit.enthalpyKJPerKg - current.enthalpyKJPerKg;
    records.push({ label: compressorLabels[i], state: exit, gas: airGas, mass: 1, process: 'compression', burnt: false });
    current = exit;
    if (i < n) {
      if (r.intercoolTemperatureK > exit.temperatureK && i === 1) {
        warnings.push({
          code: 'intercooler-heats-air',
          field: 'compressor.intercoolTemperatureK',
          message: 'The intercooling temperature is above the compressor stage exit temperature, so the intercooler heats the air.',
        });
      }
      const cooled = changeTemperature(airGas, exit, r.intercoolTemperatureK, r.intercoolerPressureLoss);
      records.push({ label: intercoolerLabels[i], state: cooled, gas: airGas, mass: 1, process: 'heat-rejection', burnt: false });
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

  const hotContext: HotContext = {
    r,
    airGas,
    airStream: combustion && air ? air.stream : null,
    fuel: combustion ? fuel : null,
    turbineInletKPa,
    expansionRatio,
    turbineLabels: stageLabels('turbine', m, ' exit'),
    reheaterLabels: stageLabels('reheater', m, ' exit'),
    airEnthalpyAtTurbineInlet: combustion ? airGas.enthalpyKJPerKg(r.turbineInletTemperatureK) : 0,
    releaseToTurbineInlet: combustion && fuel ? fuelRelease(fuel, r.fuel!.temperatureK, r.turbineInletTemperatureK) : 0,
    releaseToReheat: combustion && fuel ? fuelRelease(fuel, r.fuel!.temperatureK, r.reheatTemperatureK) : 0,
  };

  let hot: HotSection;
  let regeneratorDutyKJ = 0;
  let coldOut: FlowState | null = null;
  let hotOut: FlowState | null = null;
  if (regenerator) {
    // In the air modes the turbine train does not depend on the combustor inlet: one pass.
    // In combustion mode the exhaust composition depends on the fuel burnt, which depends
    // on the regenerator's cold outlet: a weakly coupled loop, closed by coupledHotSection.
    const closed = combustion ? coupledHotSection(hotContext, compressorExit) : regeneratedPass(hotContext, compressorExit, compressorExit.temperatureK);
    hot = closed.hot;
    coldOut = closed.regenerator.coldOutlet;
    hotOut = closed.regenerator.hotOutlet;
    regeneratorDutyKJ = closed.regenerator.dutyKJ;
  } else {
    hot = hotSection(hotContext, compressorExit.temperatureK, compressorExit.enthalpyKJPerKg);
  }
  const combustorInlet: FlowState = coldOut ?? compressorExit;
  if (!(r.turbineInletTemperatureK > combustorInlet.temperatureK)) {
    throw new EngineInputError(
      'turbine.inletTemperatureK',
      `The turbine inlet temperature (${r.turbineInletTemperatureK} K) must be above the combustor inlet temperature (${combustorInlet.temperatureK.toFixed(1)} K).`,
    );
  }
  if (regenerator && coldOut && hotOut) {
    const co: FlowState = coldOut;
    const ho: FlowState = hotOut;
    if (hot.last.state.temperatureK < compressorExit.temperatureK) {
      warnings.push({
        code: 'regenerator-cools-air',
        field: 'regenerator',
        message: `The compressor exit (${compressorExit.temperatureK.toFixed(1)} K) is hotter than the turbine exhaust (${hot.last.state.temperatureK.toFixed(1)} K), so the regenerator would cool the air; leave it out or lower the pressure ratio.`,
      });
    }
    records.push({ label: 'regenerator cold out', state: co, gas: airGas, mass: 1, process: 'regenerator-heating', burnt: false });
    records.push(...hot.records);
    records.push({
      label: 'regenerator hot out',
      state: ho,
      gas: hot.last.gas,
      mass: hot.last.mass,
      process: 'regenerator-cooling',
      burnt: false,
    });
  } else {
    records.push(...hot.records);
  }

  // Heat input: fuel × LHV when the fuel burns in the gas; otherwise the enthalpy rise
  // in combustor and reheaters.
  let heatInputKJ: number;
  let fuelAirRatio: number | null = null;
  if (combustion && fuel) {
    fuelAirRatio = hot.fuelKg;
    heatInputKJ = hot.fuelKg * fuel.lowerHeatingValueKJPerKg;
  } else {
    heatInputKJ =
      airGas.enthalpyKJPerKg(r.turbineInletTemperatureK) - combustorInlet.enthalpyKJPerKg + hot.reheatHeatKJ;
    if (fuel) fuelAirRatio = heatInputKJ / fuel.lowerHeatingValueKJPerKg;
  }

  const exhaust = records[records.length - 1];
  const netWorkKJ = hot.turbineWorkKJ - compressorWorkKJ;
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
      message: 'The turbines give no more work than the compressors take, so no air flow can deliver the required power.',
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
    turbineWorkKJPerKg: hot.turbineWorkKJ,
    netWorkKJPerKg: netWorkKJ,
    heatInputKJPerKg: heatInputKJ,
    thermalEfficiency,
    backWorkRatio: compressorWorkKJ / hot.turbineWorkKJ,
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
    if (kind === 'compression' || kind === 'expansion') {
      paths.push(polytropicPath(b.gas, a.state, b.state, points, kind, i, i + 1));
    } else if (b.burnt) {
      paths.push(changingCompositionPath(b.gas, a.state, b.state, points, kind, i, i + 1));
    } else {
      paths.push(isobarPath(b.gas, a.state, b.state, points, kind, i, i + 1));
    }
  }
  // The exhaust returns to the ambient state outside the plant: heat rejection at ambient pressure.
  const exhaust = records[records.length - 1];
  const first = records[0];
  const closing =
    exhaust.gas === first.gas
      ? isobarPath(first.gas, exhaust.state, first.state, points, 'heat-rejection', records.length, 1)
      : changingCompositionPath(first.gas, exhaust.state, first.state, points, 'heat-rejection', records.length, 1);
  paths.push(closing);
  return paths;
}

/** Warnings from the ranges of common practice (PRODUCT defaults table). */
function typicalRangeWarnings(r: ResolvedInput, warnings: CycleWarning[]): void {
  const check = (value: number, low: number, high: number, field: string, what: string) => {
    if (value < low || value > high) {
      warnings.push({
        code: 'outside-typical-range',
        field,
        message: `${what} of ${value} is outside the usual ${low}–${high}.`,
      });
    }
  };
  check(r.compressorEfficiency, 0.75, 0.95, 'compressor.isentropicEfficiency', 'A compressor stage isentropic efficiency');
  check(r.turbineEfficiency, 0.75, 0.95, 'turbine.isentropicEfficiency', 'A turbine stage isentropic efficiency');
  check(r.combustorPressureLoss, 0.01, 0.08, 'combustorPressureLoss', 'A combustor pressure loss');
  if (r.compressorStages > 1) check(r.intercoolerPressureLoss, 0, 0.05, 'compressor.intercoolerPressureLoss', 'An intercooler pressure loss');
  if (r.regenerator) {
    check(r.regenerator.effectiveness, 0.5, 0.95, 'regenerator.effectiveness', 'A regenerator effectiveness');
    check(r.regenerator.airSidePressureLoss, 0, 0.08, 'regenerator.airSidePressureLoss', 'A regenerator air-side pressure loss');
    check(r.regenerator.gasSidePressureLoss, 0, 0.08, 'regenerator.gasSidePressureLoss', 'A regenerator gas-side pressure loss');
  }
  check(r.generatorEfficiency, 0.95, 1, 'generatorEfficiency', 'A generator efficiency');
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
