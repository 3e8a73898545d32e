import {
  DEFAULT_FIRED_HOURS_PER_YEAR,
  type CandidateParameters,
  type CandidatePreset,
  type Criterion,
  type DesignBasisInput,
} from '@/server/contracts/board';

/**
 * Starting points for a new candidate and for a new review's design basis. Every value is
 * common practice (the "Defaults and ranges" table of the product brief, from memory), a
 * starting point the engineer tunes — not data of any machine.
 *
 * Left out on purpose: the intercooling temperature (defaults to the ambient temperature)
 * and the reheat temperature (defaults to the turbine inlet temperature), so both follow
 * the design basis and the turbine inlet when those change.
 */

/** Compressor stage isentropic efficiency: typical 0.86–0.90 (common practice). */
const compressorEfficiency = 0.88;
/** Turbine stage isentropic efficiency: typical 0.88–0.92 (common practice). */
const turbineEfficiency = 0.9;
/** Combustor (and reheater) pressure loss: typical 3–5 % of the inlet pressure (common practice). */
const burnerPressureLoss = 0.04;
/** Intercooler pressure loss: typical 1–2 % (common practice). */
const intercoolerPressureLoss = 0.015;
/** Regenerator: effectiveness typical 0.80–0.90, pressure loss 2–4 % each side (common practice). */
const regenerator = { effectiveness: 0.85, airSidePressureLoss: 0.03, gasSidePressureLoss: 0.03 };
/** Turbine inlet temperature of heavy-duty and aeroderivative machines: 1500–1700 K (common practice). */
const heavyDutyInletK = 1600;
/** A regenerated hot section runs cooler (the regenerator's hot inlet): the low end of 1500–1700 K (common practice). */
const regeneratedInletK = 1500;

export const presetParameters: Record<CandidatePreset, CandidateParameters> = {
  // Simple heavy-duty machine: overall pressure ratio 15–24 (common practice).
  simple: {
    compressor: {
      stages: 1,
      pressureRatio: 20,
      isentropicEfficiency: compressorEfficiency,
      intercoolerPressureLoss: 0,
    },
    regenerator: null,
    combustorPressureLoss: burnerPressureLoss,
    turbine: {
      stages: 1,
      inletTemperatureK: heavyDutyInletK,
      isentropicEfficiency: turbineEfficiency,
      reheaterPressureLoss: 0,
    },
  },
  // Regenerative: best efficiency at low ratios, 4–10 (common practice).
  regenerative: {
    compressor: { stages: 1, pressureRatio: 8, isentropicEfficiency: compressorEfficiency, intercoolerPressureLoss: 0 },
    regenerator: { ...regenerator },
    combustorPressureLoss: burnerPressureLoss,
    turbine: {
      stages: 1,
      inletTemperatureK: regeneratedInletK,
      isentropicEfficiency: turbineEfficiency,
      reheaterPressureLoss: 0,
    },
  },
  // Intercooled: two compressor stages; intercooling pays at ratios above the simple cycle's (common practice).
  intercooled: {
    compressor: { stages: 2, pressureRatio: 30, isentropicEfficiency: compressorEfficiency, intercoolerPressureLoss },
    regenerator: null,
    combustorPressureLoss: burnerPressureLoss,
    turbine: {
      stages: 1,
      inletTemperatureK: heavyDutyInletK,
      isentropicEfficiency: turbineEfficiency,
      reheaterPressureLoss: 0,
    },
  },
  // Reheat (sequential combustion): two turbine stages at a high overall ratio (common practice).
  reheat: {
    compressor: {
      stages: 1,
      pressureRatio: 30,
      isentropicEfficiency: compressorEfficiency,
      intercoolerPressureLoss: 0,
    },
    regenerator: null,
    combustorPressureLoss: burnerPressureLoss,
    turbine: {
      stages: 2,
      inletTemperatureK: heavyDutyInletK,
      isentropicEfficiency: turbineEfficiency,
      reheaterPressureLoss: burnerPressureLoss,
    },
  },
  // Intercooled + reheat + regenerative: the regenerator wants a moderate ratio, about 10 (common practice).
  'intercooled-reheat-regenerative': {
    compressor: { stages: 2, pressureRatio: 10, isentropicEfficiency: compressorEfficiency, intercoolerPressureLoss },
    regenerator: { ...regenerator },
    combustorPressureLoss: burnerPressureLoss,
    turbine: {
      stages: 2,
      inletTemperatureK: regeneratedInletK,
      isentropicEfficiency: turbineEfficiency,
      reheaterPressureLoss: burnerPressureLoss,
    },
  },
};

/** A fresh copy of a preset's parameters (stored rows never share objects). */
export function parametersOf(preset: CandidatePreset): CandidateParameters {
  return structuredClone(presetParameters[preset]);
}

/**
 * The six criteria every review starts with. Weights sum to 100 (our choice): the measured
 * figures carry 60, the judged ones 40. Ids are fixed words so that a basis that was never
 * stored reads the same on every request; criteria added later get a uuid.
 */
export const defaultCriteria: Criterion[] = [
  { id: 'efficiency', name: 'Efficiency', weight: 25, measure: 'thermalEfficiency' },
  { id: 'specific-work', name: 'Specific work', weight: 15, measure: 'netWorkKJPerKg' },
  { id: 'co2', name: 'CO2', weight: 20, measure: 'co2KgPerMWh' },
  { id: 'complexity', name: 'Complexity', weight: 15, measure: null },
  { id: 'maintainability', name: 'Maintainability', weight: 15, measure: null },
  { id: 'first-cost', name: 'First-cost class', weight: 10, measure: null },
];

/**
 * The design basis of a review nobody has set yet (common practice): ISO reference ambient
 * (15 °C, 101.325 kPa, 60 % RH), pipeline natural gas taken as methane at 25 °C, combustion
 * products as the working fluid, 50 MW net, a generator efficiency of 0.985 (typical
 * 0.98–0.99), a turbine inlet limit of 1700 K (the top of the heavy-duty range) and an
 * exhaust window of 700–900 K (hot enough for a heat-recovery boiler, below its usual
 * material limit), and 6000 fired hours a year (a mid-merit plant).
 */
export const defaultDesignBasis: Omit<DesignBasisInput, 'criteria'> = {
  ambient: { temperatureK: 288.15, pressureKPa: 101.325, relativeHumidity: 0.6 },
  fuel: { hydrogenVolumeFraction: 0, temperatureK: 298.15 },
  fluid: 'combustion',
  netPowerKW: 50_000,
  generatorEfficiency: 0.985,
  limits: { maxTurbineInletTemperatureK: 1700, exhaustTemperatureMinK: 700, exhaustTemperatureMaxK: 900 },
  firedHoursPerYear: DEFAULT_FIRED_HOURS_PER_YEAR,
};
