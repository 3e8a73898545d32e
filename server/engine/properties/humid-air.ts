import psychrolib from 'psychrolib';

import { EngineInputError } from '../errors';
import { dryAirAmounts } from './dry-air';
import { IdealGasMixture, massOfAmounts } from './ideal-gas-mixture';
import { SPECIES, SPECIES_INDEX } from './nasa-species';

// psychrolib keeps its unit system as module state: it is set here, once, and nowhere else.
psychrolib.SetUnitSystem(psychrolib.SI);

/** Range of psychrolib's saturation pressure correlation (ASHRAE Handbook, 2017), K. */
export const PSYCHROMETRIC_MIN_K = 173.15;
export const PSYCHROMETRIC_MAX_K = 473.15;

const H2O_INDEX = SPECIES_INDEX.H2O;

export interface HumidAir {
  /** The gas: dry air plus water vapour. */
  readonly gas: IdealGasMixture;
  /** Humidity ratio, kg water / kg dry air. */
  readonly humidityRatio: number;
  /** Species amounts, kmol per kg of humid air, in SPECIES_ORDER. */
  readonly amountsPerKg: Float64Array;
}

/**
 * Humid air at ambient temperature (K), pressure (kPa) and relative humidity (0–1).
 * Humidity ratio from psychrolib (ASHRAE psychrometric functions, SI), i.e.
 * W = 0.621945 · RH·p_ws(T) / (p − RH·p_ws(T)); the vapour joins the dry air as the
 * ideal-gas species H2O. Valid for 173.15–473.15 K while RH·p_ws stays below p.
 */
export function humidAir(temperatureK: number, pressureKPa: number, relativeHumidity: number): HumidAir {
  let humidityRatio = 0;
  if (relativeHumidity > 0) {
    if (!(temperatureK >= PSYCHROMETRIC_MIN_K && temperatureK <= PSYCHROMETRIC_MAX_K)) {
      throw new EngineInputError(
        'ambient.temperatureK',
        `Humid air can be computed from ${PSYCHROMETRIC_MIN_K} K to ${PSYCHROMETRIC_MAX_K} K; ${temperatureK} K is outside.`,
      );
    }
    const vapourPressureKPa = (relativeHumidity * psychrolib.GetSatVapPres(temperatureK - 273.15)) / 1000;
    if (!(vapourPressureKPa < 0.99 * pressureKPa)) {
      throw new EngineInputError(
        'ambient.relativeHumidity',
        `The water vapour pressure (${vapourPressureKPa.toPrecision(4)} kPa) would reach the ambient pressure; the air cannot hold that humidity.`,
      );
    }
    humidityRatio = psychrolib.GetHumRatioFromRelHum(temperatureK - 273.15, relativeHumidity, pressureKPa * 1000);
  }
  const amounts = dryAirAmounts();
  // kmol of dry air per kg of dry air
  const dryMass = massOfAmounts(amounts);
  for (let i = 0; i < amounts.length; i++) amounts[i] /= dryMass;
  amounts[H2O_INDEX] = humidityRatio / SPECIES.H2O.molarMass;
  // Now per (1 + W) kg of humid air: scale to per kg.
  const perKg = 1 / (1 + humidityRatio);
  for (let i = 0; i < amounts.length; i++) amounts[i] *= perKg;
  return { gas: new IdealGasMixture(amounts), humidityRatio, amountsPerKg: amounts };
}
