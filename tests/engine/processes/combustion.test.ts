import { describe, expect, it } from 'vitest';

import {
  burnFuelInto,
  burnToTemperature,
  fuelSensibleHeat,
  makeFuel,
  makeStream,
} from '@/server/engine/processes/combustion';
import { humidAir } from '@/server/engine/properties/humid-air';
import { IdealGasMixture } from '@/server/engine/properties/ideal-gas-mixture';
import { SPECIES, SPECIES_INDEX, speciesMolarEnthalpy } from '@/server/engine/properties/nasa-species';
import { expectClose } from '@/tests/helpers/expect-close';

const air = makeStream(humidAir(288.15, 101.325, 0).amountsPerKg);

describe('the fuel of a methane–hydrogen blend', () => {
  it.each([0, 0.3, 1])('consumes the oxygen of complete combustion at %s hydrogen', (x) => {
    // Stoichiometry: CH4 + 2 O2 → CO2 + 2 H2O, H2 + ½ O2 → H2O, per kmol of fuel.
    const fuel = makeFuel(x);
    const M = (1 - x) * SPECIES.CH4.molarMass + x * SPECIES.H2.molarMass;
    expectClose(fuel.molarMassKgPerKmol, M, { rel: 1e-12 }, 'molar mass');
    expectClose(-fuel.changePerKg[SPECIES_INDEX.O2] * M, 2 * (1 - x) + 0.5 * x, { rel: 1e-12 }, 'O2 per kmol');
    expectClose(fuel.changePerKg[SPECIES_INDEX.CO2] * M, 1 - x, { rel: 1e-12, abs: 1e-15 }, 'CO2 per kmol');
    expectClose(fuel.changePerKg[SPECIES_INDEX.H2O] * M, 2 * (1 - x) + x, { rel: 1e-12 }, 'H2O per kmol');
    expectClose(fuel.co2KgPerKgFuel, ((1 - x) * SPECIES.CO2.molarMass) / M, { rel: 1e-12, abs: 1e-15 }, 'CO2 kg/kg');
  });

  it('has no sensible heat at 298.15 K and that of its species above it', () => {
    const fuel = makeFuel(0);
    expectClose(fuelSensibleHeat(fuel, 298.15), 0, { abs: 1e-9 }, 'at 298.15 K');
    const perKmol = speciesMolarEnthalpy('CH4', 500) - speciesMolarEnthalpy('CH4', 298.15);
    expectClose(fuelSensibleHeat(fuel, 500), perKmol / SPECIES.CH4.molarMass, { rel: 1e-12 }, 'at 500 K');
    // cp of methane near 300–500 K is about 2.2–2.8 kJ/(kg·K) (NIST-JANAF, from memory): 450–560 kJ/kg over 200 K.
    expect(fuelSensibleHeat(fuel, 500)).toBeGreaterThan(450);
    expect(fuelSensibleHeat(fuel, 500)).toBeLessThan(560);
  });
});

describe('a burner', () => {
  it('closes the absolute-enthalpy balance H_air(T_in) + m_f h_f(T_f) = H_products(T_out)', () => {
    const fuel = makeFuel(0.3);
    const out = burnToTemperature(air, 700, 1500, fuel, 400);
    if (!out.ok) throw new Error(out.reason);
    const fuelPerKg =
      (0.7 * speciesMolarEnthalpy('CH4', 400) + 0.3 * speciesMolarEnthalpy('H2', 400)) / fuel.molarMassKgPerKmol;
    const before = air.gas.enthalpyKJPerKg(700) * air.mass + out.fuelKg * fuelPerKg;
    const after = out.products.gas.enthalpyKJPerKg(1500) * out.products.mass;
    expectClose(after, before, { rel: 1e-12 }, 'enthalpy balance');
    expectClose(out.products.mass, air.mass + out.fuelKg, { rel: 1e-12 }, 'mass balance');
  });

  it('refuses an outlet not above the inlet, and more fuel than the oxygen can burn', () => {
    const fuel = makeFuel(0);
    expect(burnToTemperature(air, 900, 900, fuel, 298.15)).toMatchObject({ ok: false, reason: 'not-above-inlet' });
    expect(burnToTemperature(air, 300, 5000, fuel, 298.15)).toMatchObject({ ok: false, reason: 'too-much-fuel' });
  });

  it('writes the same products into a reused mixture as the plain form', () => {
    const fuel = makeFuel(0.5);
    const out = burnToTemperature(air, 650, 1600, fuel, 298.15);
    if (!out.ok) throw new Error(out.reason);
    const reused = new IdealGasMixture([1, 0, 0, 0, 0, 0, 0]);
    const mass = burnFuelInto(reused, air, out.fuelKg, fuel);
    expectClose(mass, out.products.mass, { rel: 1e-12 }, 'mass');
    for (const t of [400, 1000, 1600]) {
      expectClose(reused.enthalpyKJPerKg(t), out.products.gas.enthalpyKJPerKg(t), { rel: 1e-12 }, `h at ${t} K`);
      expectClose(
        reused.entropyKJPerKgK(t, 1000),
        out.products.gas.entropyKJPerKgK(t, 1000),
        { rel: 1e-12 },
        `s at ${t} K`,
      );
    }
  });
});
