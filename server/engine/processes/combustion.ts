import {
  enthalpyOfCoefficients,
  EXTENSIVE_LENGTH,
  extensiveCoefficients,
  IdealGasMixture,
  massOfAmounts,
  SPECIES_COUNT,
} from '../properties/ideal-gas-mixture';
import { SPECIES, SPECIES_INDEX } from '../properties/nasa-species';
import { polynomialFromCoefficients, type Polynomial } from '../properties/property-polynomial';

// Local copies of the species index (imported bindings are getters once transpiled).
const O2 = SPECIES_INDEX.O2;
const CO2 = SPECIES_INDEX.CO2;
const H2O = SPECIES_INDEX.H2O;
const CH4 = SPECIES_INDEX.CH4;
const H2 = SPECIES_INDEX.H2;
/** Reference temperature of the heating value and of the fuel's sensible heat, K. */
export const LHV_REFERENCE_K = 298.15;
// Local copies: an imported binding is a getter once transpiled, and these are read in loops.
const LENGTH = EXTENSIVE_LENGTH;
const SPECIES_IN_GAS = SPECIES_COUNT;

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
  /** The same change as an extensive polynomial (kJ per kg of fuel burnt): Σ νᵢ hᵢ(T). */
  readonly changeCoefficients: Float64Array;
  /** Extensive polynomial of 1 kg of unburnt fuel: its absolute enthalpy in kJ/kg via enthalpyOfCoefficients (200–6000 K). */
  readonly fuelCoefficients: Float64Array;
  /** The change as a property polynomial (property-polynomial.ts): kJ and kJ/K per kg of fuel burnt, no mixing term. */
  readonly changePolynomial: Polynomial;
  /** kmol of gas gained per kg of fuel burnt (Σ νᵢ). */
  readonly changeMolesPerKg: number;
  /** Absolute enthalpy of the unburnt fuel at 298.15 K, kJ/kg (the origin of its sensible heat). */
  readonly referenceEnthalpyKJPerKg: number;
  /** kg of fuel that burns all the oxygen of 1 kmol of O2: 1 / (kmol O2 per kg of fuel). */
  readonly fuelKgPerKmolOxygen: number;
}

/** Builds the fuel model for a hydrogen volume fraction 0–1. */
export function makeFuel(hydrogenVolumeFraction: number): Fuel {
  const x = hydrogenVolumeFraction;
  const methane = 1 - x;
  const molarMass = methane * SPECIES.CH4.molarMass + x * SPECIES.H2.molarMass;
  const change = new Float64Array(SPECIES_COUNT);
  change[O2] = -(2 * methane + 0.5 * x) / molarMass;
  change[CO2] = methane / molarMass;
  change[H2O] = (2 * methane + x) / molarMass;
  const changeCoefficients = extensiveCoefficients(change);
  const fuelAmounts = new Float64Array(SPECIES_COUNT);
  fuelAmounts[CH4] = methane / molarMass;
  fuelAmounts[H2] = x / molarMass;
  const fuelCoefficients = extensiveCoefficients(fuelAmounts);
  // LHV = H(reactants) − H(products) at 298.15 K, per kg of fuel; products' water as vapour.
  const lowerHeatingValueKJPerKg =
    enthalpyOfCoefficients(fuelCoefficients, LHV_REFERENCE_K) -
    enthalpyOfCoefficients(changeCoefficients, LHV_REFERENCE_K);
  return {
    hydrogenVolumeFraction: x,
    molarMassKgPerKmol: molarMass,
    lowerHeatingValueKJPerKg,
    co2KgPerKgFuel: (methane * SPECIES.CO2.molarMass) / molarMass,
    changePerKg: change,
    changeCoefficients,
    fuelCoefficients,
    changePolynomial: polynomialFromCoefficients(changeCoefficients, 1, 0),
    changeMolesPerKg: change[O2] + change[CO2] + change[H2O],
    referenceEnthalpyKJPerKg: enthalpyOfCoefficients(fuelCoefficients, LHV_REFERENCE_K),
    fuelKgPerKmolOxygen: -1 / change[O2],
  };
}

/** A gas stream, counted per kg of compressor inlet air. */
export interface GasStream {
  /** kmol of each species (SPECIES_ORDER) per kg of compressor inlet air. */
  readonly amounts: ArrayLike<number>;
  /** kg of gas per kg of compressor inlet air. */
  readonly mass: number;
  /** The stream's properties per kg of gas. */
  readonly gas: IdealGasMixture;
  /** Extensive polynomial of the stream: Σ nᵢ hᵢ in kJ per kg of inlet air. */
  readonly coefficients: ArrayLike<number>;
}

/** A stream from its amounts, kmol per kg of inlet air. */
export function makeStream(amounts: ArrayLike<number>): GasStream {
  const mass = massOfAmounts(amounts);
  const coefficients = extensiveCoefficients(amounts);
  return { amounts, mass, gas: new IdealGasMixture(amounts, coefficients, mass), coefficients };
}

export type BurnOutcome =
  | { readonly ok: true; readonly fuelKg: number; readonly products: GasStream }
  | { readonly ok: false; readonly reason: 'not-above-inlet' | 'too-much-fuel'; readonly fuelKg: number };

/**
 * Burns fuel in a stream until it leaves at `outletK`, adiabatically: the plain form of a
 * burner, which the turbine train computes on its polynomials instead. The products are
 * linear in the fuel burnt, so the absolute-enthalpy balance
 *   H_s(T_in) + m_f h_f(T_f) = H_s(T_out) + m_f Σ νᵢ hᵢ(T_out)
 * gives the fuel mass directly, with no iteration:
 *   m_f = [H_s(T_out) − H_s(T_in)] / [h_f(T_f) − Σ νᵢ hᵢ(T_out)]   (kg per kg of inlet air),
 * and the products are the stream's amounts plus m_f times the fuel's change. Fails (no
 * number) if the outlet is not above the inlet or the oxygen runs out.
 */
export function burnToTemperature(
  stream: GasStream,
  inletK: number,
  outletK: number,
  fuel: Fuel,
  fuelK: number,
): BurnOutcome {
  if (!(outletK > inletK)) return { ok: false, reason: 'not-above-inlet', fuelKg: 0 };
  const rise =
    enthalpyOfCoefficients(stream.coefficients, outletK) - enthalpyOfCoefficients(stream.coefficients, inletK);
  const release = fuelRelease(fuel, fuelK, outletK);
  const fuelKg = rise / release;
  const change = fuel.changePerKg;
  const amounts = Array.from(stream.amounts, (n, i) => n + fuelKg * change[i]);
  if (!(release > 0) || !(amounts[O2] >= 0)) return { ok: false, reason: 'too-much-fuel', fuelKg };
  return { ok: true, fuelKg, products: makeStream(amounts) };
}

/**
 * Heat the burnt fuel gives the gas per kg when its products leave at `outletK`:
 * h_f(T_f) − Σ νᵢ hᵢ(T_out), kJ per kg of fuel (the denominator above). 200–6000 K.
 */
export function fuelRelease(fuel: Fuel, fuelK: number, outletK: number): number {
  return fuelEnthalpyAt(fuel, fuelK) - enthalpyOfCoefficients(fuel.changeCoefficients, outletK);
}

/**
 * Sensible heat of the fuel above 298.15 K, kJ per kg of fuel: h_f(T_f) − h_f(298.15 K).
 * It enters the heat input beside the LHV (which is defined at 298.15 K). 200–6000 K.
 */
export function fuelSensibleHeat(fuel: Fuel, fuelK: number): number {
  return enthalpyOfCoefficients(fuel.fuelCoefficients, fuelK) - fuel.referenceEnthalpyKJPerKg;
}

/** Absolute enthalpy of the unburnt fuel at `fuelK`, kJ per kg of fuel. 200–6000 K. */
export function fuelEnthalpyAt(fuel: Fuel, fuelK: number): number {
  return enthalpyOfCoefficients(fuel.fuelCoefficients, fuelK);
}

// Scratch vectors of burnFuelInto: the mixture copies what it keeps, so they are free again on return.
const SCRATCH_AMOUNTS: number[] = [0.5, 0.5, 0.5, 0.5, 0.5, 0.5, 0.5];
const SCRATCH_COEFFICIENTS: number[] = new Array<number>(EXTENSIVE_LENGTH).fill(0.5);

/**
 * The products of burning `fuelKg` (kg per kg of inlet air) of the fuel completely in the
 * stream, written into an existing mixture (IdealGasMixture.setComposition), allocating
 * nothing: the stream's amounts and polynomial plus fuelKg times the fuel's change. Returns
 * their mass, kg per kg of inlet air. The caller checks that the oxygen suffices.
 */
export function burnFuelInto(mixture: IdealGasMixture, stream: GasStream, fuelKg: number, fuel: Fuel): number {
  const change = fuel.changePerKg;
  const n = stream.amounts;
  for (let i = 0; i < SPECIES_IN_GAS; i++) SCRATCH_AMOUNTS[i] = n[i] + fuelKg * change[i];
  if (SCRATCH_AMOUNTS[O2] < 0) SCRATCH_AMOUNTS[O2] = 0; // rounding can leave −1e-20 of O2 at stoichiometric burning
  const c = stream.coefficients;
  const d = fuel.changeCoefficients;
  for (let k = 0; k < LENGTH; k++) SCRATCH_COEFFICIENTS[k] = c[k] + fuelKg * d[k];
  const mass = stream.mass + fuelKg;
  mixture.setComposition(SCRATCH_AMOUNTS, SCRATCH_COEFFICIENTS, mass);
  return mass;
}
