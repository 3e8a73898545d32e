import { makeFuel, makeStream, type Fuel, type GasStream } from '../processes/combustion';
import { ConstantCpAir } from '../properties/constant-cp-air';
import { humidAir } from '../properties/humid-air';
import { IdealGasMixture } from '../properties/ideal-gas-mixture';

// The inlet air and the fuel model depend only on the ambient and the fuel blend. Sweeps
// and the board re-evaluate many cycles at one site, so the last of each is kept (they
// are immutable, so sharing them is safe and keeps evaluation free of hidden state).

/** The compressor inlet air of one ambient. */
export interface InletAir {
  /** The ambient it was made for. */
  readonly temperatureK: number;
  readonly pressureKPa: number;
  readonly relativeHumidity: number;
  /** The air as a stream (1 kg per kg of inlet air), for burning fuel in; its gas is the inlet air's. */
  readonly stream: GasStream;
}
let cachedAir: InletAir | null = null;
let cachedFuel: Fuel | null = null;

/** The cold-air-standard gas of the constant-cp mode (one instance; it holds no state). */
export const CONSTANT_CP_AIR = new ConstantCpAir();

/** Humid inlet air at an ambient temperature (K), pressure (kPa) and relative humidity (0–1). */
export function inletAir(temperatureK: number, pressureKPa: number, relativeHumidity: number): InletAir {
  const c = cachedAir;
  // Compared as numbers: a string key would cost three number-to-text conversions per evaluation.
  if (c && c.temperatureK === temperatureK && c.pressureKPa === pressureKPa && c.relativeHumidity === relativeHumidity)
    return c;
  cachedAir = {
    temperatureK,
    pressureKPa,
    relativeHumidity,
    stream: makeStream(humidAir(temperatureK, pressureKPa, relativeHumidity).amountsPerKg),
  };
  return cachedAir;
}

/** The fuel model of a methane–hydrogen blend (hydrogen volume fraction 0–1). */
export function fuelFor(hydrogenVolumeFraction: number): Fuel {
  if (cachedFuel && cachedFuel.hydrogenVolumeFraction === hydrogenVolumeFraction) return cachedFuel;
  cachedFuel = makeFuel(hydrogenVolumeFraction);
  return cachedFuel;
}

// Mixtures of the products after each burner, reused from one evaluation to the next (a
// new mixture allocates its polynomial, which costs more than filling it). Safe because the
// engine is synchronous and the gases never leave an evaluation: states and paths are built
// from them before it returns, and the result carries numbers only.
const PRODUCT_GASES: IdealGasMixture[] = [];

/** The scratch mixture of the products after burner `burner` (0: combustor, 1…: reheaters). */
export function productGas(burner: number): IdealGasMixture {
  let gas = PRODUCT_GASES[burner];
  if (!gas) gas = PRODUCT_GASES[burner] = new IdealGasMixture([1, 0, 0, 0, 0, 0, 0]);
  return gas;
}
