/**
 * Input and result shapes of the engine. SI throughout: K, kPa, kJ/kg, kJ/(kg·K), kg/s, kW.
 * Pressure losses are fractions of the inlet pressure of the part; efficiencies and
 * effectiveness are fractions.
 */

export type WorkingFluid = 'variable-cp-air' | 'combustion' | 'constant-cp-air';

export interface CycleInput {
  readonly ambient: {
    readonly temperatureK: number;
    /** Give the pressure, or the elevation (ISA standard atmosphere), not both. */
    readonly pressureKPa?: number;
    readonly elevationM?: number;
    /** 0–1 */
    readonly relativeHumidity: number;
  };
  readonly fluid: WorkingFluid;
  /** Needed for `combustion`; in the air modes it only converts heat input to a fuel flow. */
  readonly fuel?: {
    /** Volume (mole) fraction of hydrogen in a methane–hydrogen blend, 0–1. */
    readonly hydrogenVolumeFraction: number;
    readonly temperatureK: number;
  } | null;
  readonly compressor: {
    /** 1–100 */
    readonly stages: number;
    /** Delivery over inlet pressure, intercooler losses included; > 1. */
    readonly pressureRatio: number;
    readonly isentropicEfficiency: number;
    /** Default: the ambient temperature. */
    readonly intercoolTemperatureK?: number;
    /** Default 0. */
    readonly intercoolerPressureLoss?: number;
  };
  readonly regenerator?: {
    readonly effectiveness: number;
    readonly airSidePressureLoss: number;
    readonly gasSidePressureLoss: number;
  } | null;
  readonly combustorPressureLoss: number;
  readonly turbine: {
    /** 1–100 */
    readonly stages: number;
    readonly inletTemperatureK: number;
    readonly isentropicEfficiency: number;
    /** Default: the turbine inlet temperature. */
    readonly reheatTemperatureK?: number;
    /** Default 0. */
    readonly reheaterPressureLoss?: number;
  };
  readonly generatorEfficiency: number;
  readonly netPowerKW: number;
  /** Limits of the design basis, for warnings only. */
  readonly limits?: {
    readonly maxTurbineInletTemperatureK?: number;
    readonly exhaustTemperatureMinK?: number;
    readonly exhaustTemperatureMaxK?: number;
  } | null;
}

export interface StatePoint {
  /** 1, 2, 3 … in flow order. */
  readonly n: number;
  readonly label: string;
  readonly temperatureK: number;
  readonly pressureKPa: number;
  /** Per kg of the gas at this point (see README for the reference states). */
  readonly enthalpyKJPerKg: number;
  readonly entropyKJPerKgK: number;
  /** kg of gas flowing here per kg of compressor inlet air (1 + fuel burnt upstream). */
  readonly massFlowRatio: number;
}

export type PathKind =
  'compression' | 'expansion' | 'heat-addition' | 'heat-rejection' | 'regenerator-heating' | 'regenerator-cooling';

/** One process drawn on the T-s diagram: points along the true curve, both ends included. */
export interface ProcessPath {
  readonly kind: PathKind;
  /** State numbers at its ends; `to` is 1 for the exhaust returning to ambient. */
  readonly from: number;
  readonly to: number;
  readonly temperatureK: number[];
  readonly entropyKJPerKgK: number[];
}

export interface CycleWarning {
  readonly code:
    | 'regenerator-cools-air'
    | 'turbine-inlet-above-limit'
    | 'exhaust-below-window'
    | 'exhaust-above-window'
    | 'no-net-work'
    | 'intercooler-heats-air'
    | 'dissociation-neglected'
    | 'outside-typical-range'
    | 'humidity-ignored';
  readonly message: string;
  /** The input the warning concerns, when there is one. */
  readonly field?: string;
}

export interface CycleResult {
  readonly states: StatePoint[];
  /** All per kg of compressor inlet air. */
  readonly compressorWorkKJPerKg: number;
  readonly turbineWorkKJPerKg: number;
  readonly netWorkKJPerKg: number;
  readonly heatInputKJPerKg: number;
  /** Net shaft work over heat input. */
  readonly thermalEfficiency: number;
  readonly backWorkRatio: number;
  /** 0 without a regenerator. */
  readonly regeneratorDutyKJPerKg: number;
  /** Where the gas leaves the plant (after the regenerator if there is one). */
  readonly exhaustTemperatureK: number;
  /** kg fuel per kg compressor inlet air; null in the air modes without a fuel. */
  readonly fuelAirRatio: number | null;
  /** Lower heating value used, kJ/kg; null without a fuel. */
  readonly fuelLowerHeatingValueKJPerKg: number | null;
  /** For the required net electrical power; null when the cycle gives no net work. */
  readonly airMassFlowKgPerS: number | null;
  readonly fuelMassFlowKgPerS: number | null;
  /** Heat input per kWh of electricity (generator efficiency included), kJ/kWh. */
  readonly heatRateKJPerKWh: number | null;
  /** CO2 from the fuel per MWh of electricity, kg/MWh. */
  readonly co2KgPerMWh: number | null;
  /** Present unless the evaluation was asked to leave them out. */
  readonly paths: ProcessPath[];
  readonly warnings: CycleWarning[];
}

export interface EvaluateOptions {
  /** Compute the T-s paths (default true). */
  readonly paths?: boolean;
  /** Points per process on the T-s paths, ends included (default 16, 2–200). */
  readonly pointsPerProcess?: number;
}
