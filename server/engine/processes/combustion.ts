import { IdealGasMixture, SPECIES_COUNT, enthalpyOfCoefficients } from '../properties/ideal-gas-mixture';
import { SPECIES, SPECIES_ORDER, UNIVERSAL_GAS_CONSTANT, speciesMolarEnthalpy } from '../properties/nasa-species';

const O2 = 1;
const CO2 = 3;
const H2O = 4;
const LHV_REFERENCE_K = 298.15;

/**
 * A methane–hydrogen fuel gas, burnt completely:
 *   CH4 + 2 O2 → CO2 + 2 H2O,   H2 + ½ O2 → H2O   (water as vapour).
 * `hydrogenVolumeFraction` x (0–1) is the mole (= ideal-gas volume) fraction of H2.
 */
export interface Fuel {
  readonly hydrogenVolumeFraction: number;
  /** kg/kmol */
  readonly molarMassKgPerKmol: number;
  /** Lower heating value at 298.15 K, kJ per kg of fuel, from the NASA formation enthalpies. */
  readonly lowerHeatingValueKJPerKg: number;
  /** kg of CO2 formed per kg of fuel burnt. */
  readonly co2KgPerKgFuel: number;
  /** Change of the gas, kmol of each species (SPECIES_ORDER), per kg of fuel burnt (O2 negative). */
  readonly changePerKg: Float64Array;
  /** The same change as a collapsed enthalpy polynomial (kJ per kg of fuel burnt): Σ νᵢ hᵢ(T). */
  readonly changeCoefficients: Float64Array;
  /** Absolute enthalpy of the unburnt fuel, kJ/kg, at a temperature in K. */
  enthalpyKJPerKg(temperatureK: number): number;
}

/** Builds the fuel model for a hydrogen volume fraction 0–1 (validity 200–6000 K for its enthalpy). */
export function makeFuel(hydrogenVolumeFraction: number): Fuel {
  const x = hydrogenVolumeFraction;
  const methane = 1 - x;
  const molarMass = methane * SPECIES.CH4.molarMass + x * SPECIES.H2.molarMass;
  const change = new Float64Array(SPECIES_COUNT);
  change[O2] = -(2 * methane + 0.5 * x) / molarMass;
  change[CO2] = methane / molarMass;
  change[H2O] = (2 * methane + x) / molarMass;
  const changeCoefficients = extensiveCoefficients(change);
  const enthalpyKJPerKg = (temperatureK: number) =>
    (methane * speciesMolarEnthalpy('CH4', temperatureK) + x * speciesMolarEnthalpy('H2', temperatureK)) / molarMass;
  // LHV = H(reactants) − H(products) at 298.15 K, per kg of fuel; products' water as vapour.
  const lowerHeatingValueKJPerKg =
    enthalpyKJPerKg(LHV_REFERENCE_K) - enthalpyOfCoefficients(changeCoefficients, LHV_REFERENCE_K);
  return {
    hydrogenVolumeFraction: x,
    molarMassKgPerKmol: molarMass,
    lowerHeatingValueKJPerKg,
    co2KgPerKgFuel: (methane * SPECIES.CO2.molarMass) / molarMass,
    changePerKg: change,
    changeCoefficients,
    enthalpyKJPerKg,
  };
}

/** Σ nᵢ (aᵢ × Ru) for both ranges: the polynomial of the amounts themselves (kJ, kJ/K). */
export function extensiveCoefficients(amounts: ArrayLike<number>): Float64Array {
  const coefficients = new Float64Array(14);
  for (let i = 0; i < SPECIES_COUNT; i++) {
    const n = amounts[i];
    if (n === 0) continue;
    const species = SPECIES[SPECIES_ORDER[i]];
    for (let k = 0; k < 7; k++) {
      coefficients[k] += n * UNIVERSAL_GAS_CONSTANT * species.low[k];
      coefficients[7 + k] += n * UNIVERSAL_GAS_CONSTANT * species.high[k];
    }
  }
  return coefficients;
}

/** A gas stream as amounts per kg of compressor inlet air. */
export interface GasStream {
  /** kmol of each species (SPECIES_ORDER) per kg of compressor inlet air. */
  readonly amounts: Float64Array;
  /** kg of gas per kg of compressor inlet air. */
  readonly mass: number;
  /** kg of fuel already burnt in it per kg of compressor inlet air. */
  readonly fuelBurnt: number;
  /** The stream's properties per kg of gas. */
  readonly gas: IdealGasMixture;
  /** Σ nᵢ hᵢ polynomial of the stream (kJ per kg of inlet air). */
  readonly coefficients: Float64Array;
}

/** A stream from its amounts (kmol per kg of inlet air); `fuelBurnt` in kg per kg of inlet air. */
export function makeStream(amounts: Float64Array, fuelBurnt: number): GasStream {
  let mass = 0;
  for (let i = 0; i < SPECIES_COUNT; i++) mass += amounts[i] * SPECIES[SPECIES_ORDER[i]].molarMass;
  return { amounts, mass, fuelBurnt, gas: new IdealGasMixture(amounts), coefficients: extensiveCoefficients(amounts) };
}

export type BurnOutcome =
  | { readonly ok: true; readonly fuelKg: number; readonly products: GasStream }
  | { readonly ok: false; readonly reason: 'not-above-inlet' | 'too-much-fuel'; readonly fuelKg: number };

/**
 * Burns fuel in a stream until it leaves at `outletK`, adiabatically. The products are
 * linear in the fuel burnt, so the absolute-enthalpy balance
 *   H_s(T_in) + m_f h_f(T_f) = H_s(T_out) + m_f Σ νᵢ hᵢ(T_out)
 * gives the fuel mass directly:
 *   m_f = [H_s(T_out) − H_s(T_in)] / [h_f(T_f) − Σ νᵢ hᵢ(T_out)]   (kg per kg of inlet air).
 * Fails (no number) if the outlet is not above the inlet or if the oxygen would run out.
 */
export function burnToTemperature(stream: GasStream, inletK: number, outletK: number, fuel: Fuel, fuelK: number): BurnOutcome {
  if (!(outletK > inletK)) return { ok: false, reason: 'not-above-inlet', fuelKg: 0 };
  const rise = enthalpyOfCoefficients(stream.coefficients, outletK) - enthalpyOfCoefficients(stream.coefficients, inletK);
  const release = fuel.enthalpyKJPerKg(fuelK) - enthalpyOfCoefficients(fuel.changeCoefficients, outletK);
  const fuelKg = rise / release;
  if (!(release > 0) || !(stream.amounts[O2] + fuelKg * fuel.changePerKg[O2] >= 0)) {
    return { ok: false, reason: 'too-much-fuel', fuelKg };
  }
  const amounts = new Float64Array(SPECIES_COUNT);
  for (let i = 0; i < SPECIES_COUNT; i++) amounts[i] = stream.amounts[i] + fuelKg * fuel.changePerKg[i];
  // Rounding can leave −1e-20 of O2 at exactly stoichiometric burning.
  if (amounts[O2] < 0) amounts[O2] = 0;
  return { ok: true, fuelKg, products: makeStream(amounts, stream.fuelBurnt + fuelKg) };
}
