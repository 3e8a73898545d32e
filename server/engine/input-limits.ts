/**
 * Input limits and defaults of the engine, written once: the engine checks against these,
 * and the request contracts (server/contracts/cycle.ts) import them. Plain numbers only,
 * so the app's forms can import this file without the engine. SI units (K, kPa, m, kW).
 */
import { ISA_MAX_ELEVATION_M, ISA_MIN_ELEVATION_M } from './properties/isa-atmosphere';
import { POLYNOMIAL_MAX_K, POLYNOMIAL_MIN_K } from './properties/nasa-species';

/** Temperatures of inputs and of every state: the range of the property data, K. */
export const MIN_TEMPERATURE_K = POLYNOMIAL_MIN_K;
export const MAX_TEMPERATURE_K = POLYNOMIAL_MAX_K;

/**
 * Fuel gas temperature at the burner, K. Pipeline gas arrives near ground temperature
 * (down to about −40 °C in cold climates) and fuel-gas performance heaters raise it to
 * about 200–230 °C (common practice); 230–600 K covers both with margin and stays well
 * below the autoignition temperature of methane, about 850 K (from memory).
 */
export const MIN_FUEL_TEMPERATURE_K = 230;
export const MAX_FUEL_TEMPERATURE_K = 600;

/**
 * Ambient pressure given directly, kPa: the standard atmosphere gives 5.5 kPa at 20 000 m
 * and 113.9 kPa at −1000 m (the elevation range below); 5–120 kPa adds room for weather
 * and test cells.
 */
export const MIN_AMBIENT_PRESSURE_KPA = 5;
export const MAX_AMBIENT_PRESSURE_KPA = 120;

/** Elevation, m: the range of the standard atmosphere model (ISA, ISO 2533). */
export const MIN_ELEVATION_M = ISA_MIN_ELEVATION_M;
export const MAX_ELEVATION_M = ISA_MAX_ELEVATION_M;

/**
 * Overall compressor pressure ratio: above 1, at most 200. The highest ratios in service
 * are about 50–60 (common practice); 200 leaves room for studies while every pressure
 * stays below 24 MPa (the ideal-gas model grows less exact at such pressures).
 */
export const MAX_PRESSURE_RATIO = 200;

/** Stages of the compressor and of the turbine, each 1–100 (the forms offer 1–4). */
export const MAX_STAGES = 100;

/** Required net power, kW: above 0 and at most 10 GW (the largest single units are about 600 MW, from memory). */
export const MAX_NET_POWER_KW = 1e7;

/** Defaults filled in when left out. */
export const DEFAULT_INTERCOOLER_PRESSURE_LOSS = 0;
export const DEFAULT_REHEATER_PRESSURE_LOSS = 0;
// The intercooling temperature defaults to the ambient temperature and the reheat
// temperature to the turbine inlet temperature (defaults that follow other inputs).

/** Points of a sweep, both ends included. */
export const MIN_SWEEP_POINTS = 2;
export const MAX_SWEEP_POINTS = 1000;
