import type { GasModel } from '../properties/gas-model';
import { stateAt, stateFromEnthalpy, type FlowState } from './flow-state';

/**
 * Heating or cooling of one stream to a set temperature with a fractional pressure loss
 * (intercooler, air-mode combustor or reheater): p_out = p_in (1 − loss). Units K, kPa.
 */
export function changeTemperature(gas: GasModel, inlet: FlowState, outletK: number, pressureLoss: number): FlowState {
  return stateAt(gas, outletK, inlet.pressureKPa * (1 - pressureLoss));
}

export interface RegeneratorStreams {
  /** Gas and state of the cold (air) side inlet, and its mass per kg of compressor inlet air. */
  readonly coldGas: GasModel;
  readonly coldInlet: FlowState;
  readonly coldMass: number;
  /** Gas and state of the hot (turbine exhaust) side inlet, and its mass per kg of inlet air. */
  readonly hotGas: GasModel;
  readonly hotInlet: FlowState;
  readonly hotMass: number;
}

export interface RegeneratorOutcome {
  readonly coldOutlet: FlowState;
  readonly hotOutlet: FlowState;
  /** Heat passed from the hot to the cold stream, kJ per kg of compressor inlet air (negative if the air is cooled). */
  readonly dutyKJ: number;
}

/**
 * Counterflow regenerator with effectiveness on enthalpy: Q = ε Q_max, where Q_max is the
 * smaller of m_c [h_c(T_h,in) − h_c(T_c,in)] (cold stream heated to the hot inlet
 * temperature) and m_h [h_h(T_h,in) − h_h(T_c,in)] (hot stream cooled to the cold inlet
 * temperature). Cold outlet h_c,in + Q / m_c; hot outlet from the energy balance
 * h_h,in − Q / m_h. Pressure losses as fractions of each side's inlet pressure.
 * If the hot inlet is colder than the cold inlet, both maxima are negative and Q is the
 * one of smaller magnitude: the heat then flows from the air to the exhaust.
 */
export function regenerate(
  streams: RegeneratorStreams,
  effectiveness: number,
  airSidePressureLoss: number,
  gasSidePressureLoss: number,
): RegeneratorOutcome {
  const { coldGas, coldInlet, coldMass, hotGas, hotInlet, hotMass } = streams;
  const coldMax = coldMass * (coldGas.enthalpyKJPerKg(hotInlet.temperatureK) - coldInlet.enthalpyKJPerKg);
  const hotMax = hotMass * (hotInlet.enthalpyKJPerKg - hotGas.enthalpyKJPerKg(coldInlet.temperatureK));
  const qMax = Math.abs(coldMax) <= Math.abs(hotMax) ? coldMax : hotMax;
  const dutyKJ = effectiveness * qMax;
  const coldOutlet = stateFromEnthalpy(
    coldGas,
    coldInlet.enthalpyKJPerKg + dutyKJ / coldMass,
    coldInlet.pressureKPa * (1 - airSidePressureLoss),
    coldInlet.temperatureK + effectiveness * (hotInlet.temperatureK - coldInlet.temperatureK),
  );
  const hotOutlet = stateFromEnthalpy(
    hotGas,
    hotInlet.enthalpyKJPerKg - dutyKJ / hotMass,
    hotInlet.pressureKPa * (1 - gasSidePressureLoss),
    hotInlet.temperatureK - effectiveness * (hotInlet.temperatureK - coldInlet.temperatureK),
  );
  return { coldOutlet, hotOutlet, dutyKJ };
}
