import psychrolib from 'psychrolib';

import { evaluateStagedCycle } from '../cycles/staged-cycle';
import type { CycleInput } from '../cycles/types';
import { EngineInputError } from '../errors';
import { PSYCHROMETRIC_MAX_K, PSYCHROMETRIC_MIN_K } from '../properties/humid-air';
import { isaPressureKPa } from '../properties/isa-atmosphere';

/**
 * A fixed machine off its design ambient: a first-order estimate without component maps,
 * for comparing candidates. The machine is sized at the design ambient for the required net
 * power (the engine's air flow there). Running at constant speed, its compressor then takes
 * the same inlet VOLUME flow at every ambient, so the mass flow follows the inlet density of
 * the humid air; pressure ratio, turbine inlet temperature, efficiencies and pressure losses
 * keep their design values. The net power at another ambient is that mass flow times the net
 * specific work the cycle gives at that ambient.
 */

/** Gas constant of dry air, J/(kg·K) (ASHRAE Handbook — Fundamentals, from memory). */
const R_DRY_AIR = 287.042;
/** Ratio of the molar masses of dry air and water, 28.966 / 18.015 (from memory). */
const MOLAR_MASS_RATIO = 1.607858;

export interface Ambient {
  readonly temperatureK: number;
  /** 0–1 */
  readonly relativeHumidity: number;
  readonly pressureKPa: number;
}

/** One operating point of the fixed machine at full load (the most it can give there). */
export interface OffDesignPoint {
  readonly ambientK: number;
  /** Electrical net power at full load, kW. */
  readonly netPowerKW: number;
  readonly heatRateKJPerKWh: number;
  readonly exhaustTemperatureK: number;
  readonly airMassFlowKgPerS: number;
  /** Fuel flow, kg/s; 0 in the air modes without a fuel. */
  readonly fuelMassFlowKgPerS: number;
  /** CO2 from the fuel, kg/s. */
  readonly co2KgPerS: number;
}

/** Figures per kg of compressor inlet air at one ambient: what the year interpolates. */
export interface SpecificFigures {
  /** Electrical net work (generator included), kJ per kg of inlet air. */
  readonly electricKJPerKg: number;
  /** Heat input, kJ per kg of inlet air. */
  readonly heatKJPerKg: number;
  /** Fuel, kg per kg of inlet air (0 without a fuel). */
  readonly fuelPerKg: number;
  /** CO2, kg per kg of inlet air. */
  readonly co2PerKg: number;
  readonly exhaustTemperatureK: number;
}

/** The ambient pressure of a cycle input: given, or the ISA pressure at its elevation. */
export function ambientPressureKPa(input: CycleInput): number {
  if (input.ambient.pressureKPa !== undefined) return input.ambient.pressureKPa;
  if (input.ambient.elevationM !== undefined) return isaPressureKPa(input.ambient.elevationM);
  throw new EngineInputError('ambient.pressureKPa', 'Give the ambient pressure or the elevation.');
}

/**
 * Density of humid air, kg/m³: ρ = p (1 + W) / (R_da T (1 + 1.607858 W)), the ideal-gas
 * mixture of dry air and vapour (ASHRAE Handbook — Fundamentals, from memory); W from
 * psychrolib.
 */
export function humidAirDensity(temperatureK: number, relativeHumidity: number, pressureKPa: number): number {
  let w = 0;
  if (relativeHumidity > 0) {
    if (!(temperatureK >= PSYCHROMETRIC_MIN_K && temperatureK <= PSYCHROMETRIC_MAX_K))
      throw new EngineInputError(
        'ambient.temperatureK',
        `Humid air is computed from ${PSYCHROMETRIC_MIN_K} K to ${PSYCHROMETRIC_MAX_K} K.`,
      );
    w = psychrolib.GetHumRatioFromRelHum(temperatureK - 273.15, relativeHumidity, pressureKPa * 1000);
  }
  return (pressureKPa * 1000 * (1 + w)) / (R_DRY_AIR * temperatureK * (1 + MOLAR_MASS_RATIO * w));
}

/** The design input with another ambient (the pressure given, no elevation). */
export function atAmbient(design: CycleInput, ambient: Ambient): CycleInput {
  return {
    ...design,
    ambient: {
      temperatureK: ambient.temperatureK,
      pressureKPa: ambient.pressureKPa,
      relativeHumidity: ambient.relativeHumidity,
    },
  };
}

/** The cycle at one ambient, per kg of inlet air (throws EngineInputError where it cannot run). */
export function specificFigures(design: CycleInput, ambient: Ambient): SpecificFigures {
  const r = evaluateStagedCycle(atAmbient(design, ambient), { paths: false });
  if (!(r.netWorkKJPerKg > 0) || r.airMassFlowKgPerS === null)
    throw new EngineInputError('ambient.temperatureK', 'The cycle gives no net work at this ambient.');
  const electric = r.netWorkKJPerKg * design.generatorEfficiency;
  const fuelPerKg = r.fuelMassFlowKgPerS === null ? 0 : r.fuelMassFlowKgPerS / r.airMassFlowKgPerS;
  // kg CO2 per kg air = kg/MWh × MWh per kg air (1 MWh = 3.6e6 kJ)
  const co2PerKg = r.co2KgPerMWh === null ? 0 : (r.co2KgPerMWh * electric) / 3.6e6;
  return {
    electricKJPerKg: electric,
    heatKJPerKg: r.heatInputKJPerKg,
    fuelPerKg,
    co2PerKg,
    exhaustTemperatureK: r.exhaustTemperatureK,
  };
}

/** A machine sized at its design ambient: the inlet volume flow it keeps everywhere. */
export interface FixedMachine {
  readonly design: CycleInput;
  readonly designAmbient: Ambient;
  /** Compressor inlet volume flow, m³/s. */
  readonly inletVolumeFlowM3PerS: number;
  /** The required net power it was sized for, kW. */
  readonly requiredKW: number;
}

/**
 * Sizes the machine: the engine's air flow for the required net power at the design ambient,
 * over the inlet density there.
 */
export function fixMachine(design: CycleInput): FixedMachine {
  const designAmbient: Ambient = {
    temperatureK: design.ambient.temperatureK,
    relativeHumidity: design.ambient.relativeHumidity,
    pressureKPa: ambientPressureKPa(design),
  };
  const r = evaluateStagedCycle(design, { paths: false });
  if (r.airMassFlowKgPerS === null)
    throw new EngineInputError('turbine.inletTemperatureK', 'The cycle gives no net work at the design ambient.');
  const density = humidAirDensity(
    designAmbient.temperatureK,
    designAmbient.relativeHumidity,
    designAmbient.pressureKPa,
  );
  return {
    design,
    designAmbient,
    inletVolumeFlowM3PerS: r.airMassFlowKgPerS / density,
    requiredKW: design.netPowerKW,
  };
}

/** The point a set of specific figures makes at a given inlet air flow. */
export function pointOf(ambientK: number, figures: SpecificFigures, airMassFlowKgPerS: number): OffDesignPoint {
  return {
    ambientK,
    netPowerKW: airMassFlowKgPerS * figures.electricKJPerKg,
    heatRateKJPerKWh: (3600 * figures.heatKJPerKg) / figures.electricKJPerKg,
    exhaustTemperatureK: figures.exhaustTemperatureK,
    airMassFlowKgPerS,
    fuelMassFlowKgPerS: airMassFlowKgPerS * figures.fuelPerKg,
    co2KgPerS: airMassFlowKgPerS * figures.co2PerKg,
  };
}

/** The fixed machine at full load at one ambient (the direct evaluation, no interpolation). */
export function offDesignPoint(machine: FixedMachine, ambient: Ambient): OffDesignPoint {
  const figures = specificFigures(machine.design, ambient);
  const density = humidAirDensity(ambient.temperatureK, ambient.relativeHumidity, ambient.pressureKPa);
  return pointOf(ambient.temperatureK, figures, machine.inletVolumeFlowM3PerS * density);
}
