import { describe, expect, it } from 'vitest';
import { makeFuel } from '@/server/engine/processes/combustion';
import { dryAirAmounts } from '@/server/engine/properties/dry-air';
import { humidAir } from '@/server/engine/properties/humid-air';
import { IdealGasMixture } from '@/server/engine/properties/ideal-gas-mixture';
import { isaPressureKPa } from '@/server/engine/properties/isa-atmosphere';
import { enthalpyOfFormation, speciesMolarCp } from '@/server/engine/properties/nasa-species';
import { expectClose } from '@/tests/helpers/expect-close';

const dryAir = new IdealGasMixture(dryAirAmounts());

describe('dry air against the ideal-gas air table', () => {
  // Source: the standard ideal-gas properties of air table (Keenan & Kaye lineage, as
  // reprinted in thermodynamics handbooks and textbooks, e.g. Çengel & Boles, Table A-17),
  // per kg, values from memory. The table and our data use different reference states, so
  // ours are anchored to the table at 300 K: h_table(300) + [h(T) − h(300)], likewise s°,
  // and compared with the tabulated value at T within 0.1 %.
  // (Measured against the change from 300 K alone, the worst point is 500 K at 0.11 %: the
  // table's older cp data sit about 0.1 % below JANAF there.)
  const table = [
    { temperatureK: 250, h: 250.05, s: 1.51917 },
    { temperatureK: 500, h: 503.02, s: 2.21952 },
    { temperatureK: 1000, h: 1046.04, s: 2.9677 },
    { temperatureK: 1500, h: 1635.97, s: 3.44516 },
    { temperatureK: 2000, h: 2252.1, s: 3.7994 },
  ];
  const base = { temperatureK: 300, h: 300.19, s: 1.70203 };

  it.each(table)('h at $temperatureK K within 0.1 %', ({ temperatureK, h }) => {
    const ours = base.h + dryAir.enthalpyKJPerKg(temperatureK) - dryAir.enthalpyKJPerKg(300);
    expectClose(ours, h, { rel: 1e-3 }, `h at ${temperatureK} K`);
  });

  it.each(table)('s° at $temperatureK K within 0.1 %', ({ temperatureK, s }) => {
    const ours = base.s + dryAir.standardEntropyKJPerKgK(temperatureK) - dryAir.standardEntropyKJPerKgK(300);
    expectClose(ours, s, { rel: 1e-3 }, `s° at ${temperatureK} K`);
  });

  it('changes from 300 K agree within 0.15 % everywhere', () => {
    for (const { temperatureK, h, s } of table) {
      expectClose(dryAir.enthalpyKJPerKg(temperatureK) - dryAir.enthalpyKJPerKg(300), h - base.h, { rel: 1.5e-3 }, `Δh ${temperatureK}`);
      expectClose(
        dryAir.standardEntropyKJPerKgK(temperatureK) - dryAir.standardEntropyKJPerKgK(300),
        s - base.s,
        { rel: 1.5e-3 },
        `Δs° ${temperatureK}`,
      );
    }
  });

  it('has the molar mass of standard dry air', () => {
    // U.S. Standard Atmosphere 1976: sea-level mean molar mass 28.9644 kg/kmol (from memory).
    expectClose(dryAir.molarMassKgPerKmol, 28.9644, { rel: 1e-4 }, 'molar mass of dry air');
  });
});

describe('species cp against NIST-JANAF', () => {
  // NIST-JANAF Thermochemical Tables (Chase 1998), ideal-gas cp in J/(mol·K), from memory.
  const cases = [
    { species: 'N2' as const, temperatureK: 300, cp: 29.125, rel: 2e-3 },
    { species: 'N2' as const, temperatureK: 1000, cp: 32.697, rel: 2e-3 },
    { species: 'N2' as const, temperatureK: 2000, cp: 35.971, rel: 2e-3 },
    { species: 'O2' as const, temperatureK: 300, cp: 29.385, rel: 2e-3 },
    { species: 'O2' as const, temperatureK: 1000, cp: 34.87, rel: 2e-3 },
    // The 7-coefficient high-range set of O2 (TPIS 1989 data, as in TM-4513) gives 37.86 at
    // 2000 K: 0.3 % above JANAF. This is the deviation of that published fit, not of our
    // arithmetic; it is held to 0.35 % here and reported as the one check outside 0.2 %.
    { species: 'O2' as const, temperatureK: 2000, cp: 37.744, rel: 3.5e-3 },
  ];
  it.each(cases)('$species at $temperatureK K', ({ species, temperatureK, cp, rel }) => {
    expectClose(speciesMolarCp(species, temperatureK), cp, { rel }, `cp of ${species} at ${temperatureK} K`);
  });
});

describe('formation enthalpies and heating values', () => {
  // CODATA key values / NIST-JANAF, kJ/mol, from memory.
  it.each([
    { species: 'CO2' as const, value: -393.51 },
    { species: 'H2O' as const, value: -241.826 },
    { species: 'CH4' as const, value: -74.6 },
    { species: 'N2' as const, value: 0 },
    { species: 'O2' as const, value: 0 },
    { species: 'H2' as const, value: 0 },
  ])('ΔHf of $species', ({ species, value }) => {
    expectClose(enthalpyOfFormation(species) / 1000, value, { abs: 0.1 }, `ΔHf of ${species}`);
  });

  it('methane LHV within 0.3 % of the published 50.0 MJ/kg', () => {
    // Published lower heating value of methane, 50.0 MJ/kg (handbook value, from memory).
    expectClose(makeFuel(0).lowerHeatingValueKJPerKg, 50_000, { rel: 3e-3 }, 'LHV of methane');
  });

  it('hydrogen LHV within 0.3 % of the published 120.0 MJ/kg', () => {
    // Published lower heating value of hydrogen, about 120 MJ/kg (handbook value, from memory).
    expectClose(makeFuel(1).lowerHeatingValueKJPerKg, 120_000, { rel: 3e-3 }, 'LHV of hydrogen');
  });

  it('a blend by volume lies between its parts on a per-mole basis', () => {
    const ch4 = makeFuel(0);
    const h2 = makeFuel(1);
    const blend = makeFuel(0.5);
    const perMole = (f: typeof ch4) => f.lowerHeatingValueKJPerKg * f.molarMassKgPerKmol;
    expectClose(perMole(blend), 0.5 * perMole(ch4) + 0.5 * perMole(h2), { rel: 1e-12 }, 'molar LHV of a 50/50 blend');
  });
});

describe('inversions', () => {
  const products = new IdealGasMixture([0.7, 0.1, 0.009, 0.05, 0.12, 0, 0]);
  const temperatures = [200, 260, 450, 999.999, 1000, 1000.001, 1700, 2600, 4000, 6000];
  it.each(temperatures)('T(h) and T(s°) return %s K to 1e-9 relative', (temperatureK) => {
    for (const gas of [dryAir, products]) {
      expectClose(gas.temperatureFromEnthalpy(gas.enthalpyKJPerKg(temperatureK)), temperatureK, { rel: 1e-9 }, 'T(h)');
      expectClose(
        gas.temperatureFromStandardEntropy(gas.standardEntropyKJPerKgK(temperatureK), 300),
        temperatureK,
        { rel: 1e-9 },
        'T(s°)',
      );
    }
  });

  it('cp is the slope of h, and cp/T the slope of s°', () => {
    for (const t of [300, 800, 1500, 2500]) {
      const dh = (dryAir.enthalpyKJPerKg(t + 1e-3) - dryAir.enthalpyKJPerKg(t - 1e-3)) / 2e-3;
      const ds = (dryAir.standardEntropyKJPerKgK(t + 1e-3) - dryAir.standardEntropyKJPerKgK(t - 1e-3)) / 2e-3;
      expectClose(dh, dryAir.cpKJPerKgK(t), { rel: 1e-6 }, `dh/dT at ${t} K`);
      expectClose(ds, dryAir.cpKJPerKgK(t) / t, { rel: 1e-6 }, `ds°/dT at ${t} K`);
    }
  });

  it('the two polynomial ranges meet at 1000 K', () => {
    expectClose(dryAir.cpKJPerKgK(999.9999999), dryAir.cpKJPerKgK(1000), { rel: 1e-4 }, 'cp across the break');
    expectClose(dryAir.enthalpyKJPerKg(999.9999999), dryAir.enthalpyKJPerKg(1000), { abs: 0.05 }, 'h across the break');
  });
});

describe('humid air and the standard atmosphere', () => {
  it('humidity ratio at ISO conditions', () => {
    // psychrolib (ASHRAE) at 15 °C, 60 % RH, 101.325 kPa: 0.00635 kg/kg (package notes; common psychrometric chart value).
    expectClose(humidAir(288.15, 101.325, 0.6).humidityRatio, 0.00635, { rel: 5e-3 }, 'humidity ratio');
  });

  it('humid air is lighter than dry air', () => {
    expect(humidAir(303.15, 101.325, 1).gas.molarMassKgPerKmol).toBeLessThan(dryAir.molarMassKgPerKmol);
  });

  it.each([
    // ISA table (ICAO Doc 7488 / ISO 2533), kPa, from memory.
    { elevationM: 0, pressureKPa: 101.325 },
    { elevationM: 1000, pressureKPa: 89.876 },
    { elevationM: 3000, pressureKPa: 70.121 },
    { elevationM: 11000, pressureKPa: 22.632 },
    { elevationM: 15000, pressureKPa: 12.045 },
  ])('ISA pressure at $elevationM m', ({ elevationM, pressureKPa }) => {
    expectClose(isaPressureKPa(elevationM), pressureKPa, { rel: 1e-3 }, `p at ${elevationM} m`);
  });
});
