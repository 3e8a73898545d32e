import fc from 'fast-check';
import { describe, expect, it } from 'vitest';

import {
  convert,
  elevation,
  formatNumber,
  heatRate,
  massFlow,
  percent,
  power,
  pressure,
  specificWork,
  temperature,
  temperatureCelsius,
  type UnitSystem,
} from '@/components/ui/format';
import { expectClose } from '@/tests/helpers/expect-close';

/**
 * Display units against NIST SP 811 (2008), Appendix B ("B.8: factors for units listed
 * alphabetically", "B.9: factors for units listed by kind of quantity"). Each factor is the
 * value of one US customary unit in SI. The app holds the inverses to 7 significant figures,
 * so a conversion must agree to 1 part in 10⁶; a factor wrong in its fifth figure fails.
 *
 * Where a value is written "from memory" it was recalled, not read from the table.
 */
const nist = {
  /** 1 psi = 6.894 757 E+03 Pa (NIST SP 811, B.8, "pound-force per square inch"). */
  paPerPsi: 6.894757e3,
  /** 1 lb = 4.535 923 7 E−01 kg (exact; B.8 prints 4.535 924 E−01, "pound (avoirdupois)"). */
  kgPerLb: 4.5359237e-1,
  /** 1 Btu_IT = 1.055 056 E+03 J (NIST SP 811, B.8, "British thermal unit_IT"). */
  jPerBtu: 1.055056e3,
  /** 1 Btu_IT/lb = 2.326 E+03 J/kg (exact; NIST SP 811, B.8 and B.9 "energy divided by mass") — from memory. */
  jPerKgPerBtuPerLb: 2.326e3,
  /** 1 hp (550 ft·lbf/s) = 7.456 999 E+02 W (NIST SP 811, B.8, "horsepower (550 ft · lbf/s)"). */
  wPerHp: 7.456999e2,
  /** 1 ft = 3.048 E−01 m (exact; NIST SP 811, B.8, "foot") — from memory. */
  mPerFt: 3.048e-1,
  /** 1 short ton = 2000 lb = 9.071 847 E+02 kg (NIST SP 811, B.8, "ton, short (2000 lb)"). */
  kgPerShortTon: 9.071847e2,
} as const;

/** Temperature relations (NIST SP 811, B.9, "temperature") — from memory. */
const kelvinFrom = {
  fahrenheit: (tF: number) => (tF + 459.67) / 1.8,
  celsius: (tC: number) => tC + 273.15,
  rankine: (tR: number) => tR / 1.8,
};

const factorTolerance = { rel: 1e-6 } as const;
const us: UnitSystem = 'us';

describe('each US customary conversion against NIST SP 811 Appendix B', () => {
  // One US unit, written in the API's SI unit through the table's factor, must show as 1.
  const cases = [
    {
      quantity: 'pressure',
      si: nist.paPerPsi / 1e3,
      run: () => convert.pressure(nist.paPerPsi / 1e3, us),
      unit: 'psia',
    },
    { quantity: 'mass flow', si: nist.kgPerLb, run: () => convert.massFlow(nist.kgPerLb, us), unit: 'lb/s' },
    {
      quantity: 'specific work',
      si: nist.jPerKgPerBtuPerLb / 1e3,
      run: () => convert.specificWork(nist.jPerKgPerBtuPerLb / 1e3, us),
      unit: 'Btu/lb',
    },
    // Heat rate: kJ of fuel per kWh of output → Btu_IT per kWh.
    {
      quantity: 'heat rate',
      si: nist.jPerBtu / 1e3,
      run: () => convert.heatRate(nist.jPerBtu / 1e3, us),
      unit: 'Btu/kWh',
    },
    { quantity: 'drive power', si: nist.wPerHp / 1e3, run: () => convert.power(nist.wPerHp / 1e3, us), unit: 'hp' },
    { quantity: 'elevation', si: nist.mPerFt, run: () => convert.elevation(nist.mPerFt, us), unit: 'ft' },
    // Fuel and CO2 a year arrive in tonnes (1000 kg).
    {
      quantity: 'fuel a year',
      si: nist.kgPerShortTon / 1e3,
      run: () => convert.tonnes(nist.kgPerShortTon / 1e3, us),
      unit: 'short tons',
    },
  ];

  it.each(cases)('$quantity: 1 $unit', ({ quantity, run, unit }) => {
    const shown = run();
    expect(shown.unit).toBe(unit);
    expectClose(shown.amount, 1, factorTolerance, `${quantity} in ${unit}`);
  });

  it('Btu_IT per lb is the Btu_IT over the pound (the table is self-consistent)', () => {
    // 1.055 056 E+03 J / 4.535 923 7 E−01 kg = 2.326 000 E+03 J/kg to the table's 7 figures.
    expectClose(nist.jPerBtu / nist.kgPerLb, nist.jPerKgPerBtuPerLb, factorTolerance, 'Btu_IT/lb in J/kg');
  });

  it('stays linear over the range a plant reaches (no offset hidden in a factor)', () => {
    expectClose(convert.pressure(2500, us).amount, (2500 * 1e3) / nist.paPerPsi, factorTolerance, '2500 kPa in psia');
    expectClose(convert.massFlow(650, us).amount, 650 / nist.kgPerLb, factorTolerance, '650 kg/s in lb/s');
    expectClose(
      convert.heatRate(9500, us).amount,
      (9500 * 1e3) / nist.jPerBtu,
      factorTolerance,
      '9500 kJ/kWh in Btu/kWh',
    );
    expectClose(
      convert.specificWork(420, us).amount,
      (420 * 1e3) / nist.jPerKgPerBtuPerLb,
      factorTolerance,
      '420 kJ/kg',
    );
    expectClose(convert.power(750, us).amount, (750 * 1e3) / nist.wPerHp, factorTolerance, '750 kW in hp');
    expectClose(convert.elevation(2400, us).amount, 2400 / nist.mPerFt, factorTolerance, '2400 m in ft');
  });
});

describe('temperature', () => {
  // Fixed points in °F and the K each one is (B.9 relations): absolute zero, 0 °F, ice point,
  // steam point at 1 atm, a turbine inlet temperature.
  const points = [
    { fahrenheit: -459.67, label: 'absolute zero' },
    { fahrenheit: 0, label: '0 °F' },
    { fahrenheit: 32, label: 'ice point' },
    { fahrenheit: 212, label: 'steam point' },
    { fahrenheit: 2500, label: 'a turbine inlet' },
  ];

  it.each(points)('$label: $fahrenheit °F', ({ fahrenheit, label }) => {
    const shown = convert.temperature(kelvinFrom.fahrenheit(fahrenheit), us);
    expect(shown.unit).toBe('°F');
    expectClose(shown.amount, fahrenheit, { abs: 1e-9 }, label);
  });

  it('a site’s air reads in °C in SI and °F in US customary', () => {
    expect(convert.siteTemperature(273.15, 'si')).toEqual({ amount: 0, unit: '°C' });
    const hot = convert.siteTemperature(kelvinFrom.fahrenheit(95), us);
    expect(hot.unit).toBe('°F');
    expectClose(hot.amount, 95, { abs: 1e-9 }, '95 °F');
  });

  it('°F and °R differ by 459.67 and share the degree size 1/1.8 K', () => {
    // The app shows °F, not °R; the °F it shows must be the °R of the same state less 459.67.
    for (const rankine of [0, 491.67, 1000, 3000]) {
      expectClose(
        convert.temperature(kelvinFrom.rankine(rankine), us).amount,
        rankine - 459.67,
        { abs: 1e-9 },
        `${rankine} °R`,
      );
    }
    const step = convert.temperature(1001, us).amount - convert.temperature(1000, us).amount;
    expectClose(step, 1.8, { abs: 1e-9 }, '°F per K');
  });

  it('kelvin passes through in SI; °C is K less 273.15', () => {
    expect(convert.temperature(1573.15, 'si')).toEqual({ amount: 1573.15, unit: 'K' });
    for (const celsius of [-273.15, -20, 0, 15, 1300]) {
      const shown = convert.temperatureCelsius(kelvinFrom.celsius(celsius));
      expect(shown.unit).toBe('°C');
      expectClose(shown.amount, celsius, { abs: 1e-9 }, `${celsius} °C`);
    }
  });
});

describe('round trips through the table', () => {
  // SI → shown unit → SI through the NIST factor gives back what the API sent.
  const back: Array<{ quantity: string; toUs: (v: number) => number; toSi: (v: number) => number }> = [
    { quantity: 'pressure kPa', toUs: (v) => convert.pressure(v, us).amount, toSi: (v) => (v * nist.paPerPsi) / 1e3 },
    { quantity: 'mass flow kg/s', toUs: (v) => convert.massFlow(v, us).amount, toSi: (v) => v * nist.kgPerLb },
    {
      quantity: 'specific work kJ/kg',
      toUs: (v) => convert.specificWork(v, us).amount,
      toSi: (v) => (v * nist.jPerKgPerBtuPerLb) / 1e3,
    },
    {
      quantity: 'heat rate kJ/kWh',
      toUs: (v) => convert.heatRate(v, us).amount,
      toSi: (v) => (v * nist.jPerBtu) / 1e3,
    },
    {
      quantity: 'power kW (below 1 MW)',
      toUs: (v) => convert.power(v, us).amount,
      toSi: (v) => (v * nist.wPerHp) / 1e3,
    },
    { quantity: 'elevation m', toUs: (v) => convert.elevation(v, us).amount, toSi: (v) => v * nist.mPerFt },
    { quantity: 'temperature K', toUs: (v) => convert.temperature(v, us).amount, toSi: kelvinFrom.fahrenheit },
  ];

  it.each(back)('$quantity', ({ quantity, toUs, toSi }) => {
    fc.assert(
      fc.property(fc.double({ min: 0.01, max: 999, noNaN: true }), (si) => {
        expectClose(toSi(toUs(si)), si, factorTolerance, quantity);
      }),
    );
  });
});

describe('shown text', () => {
  it('has four significant figures below 10 000 and whole grouped units above', () => {
    expect(formatNumber(1.234567)).toBe('1.235');
    expect(formatNumber(0.0123456)).toBe('0.01235');
    expect(formatNumber(12.34567)).toBe('12.35');
    expect(formatNumber(9999.4)).toBe('9,999');
    expect(formatNumber(12345.6)).toBe('12,346');
    expect(formatNumber(-40)).toBe('-40.00');
    expect(formatNumber(0)).toBe('0');
    expect(formatNumber(Number.NaN)).toBe('—');
    expect(formatNumber(Number.POSITIVE_INFINITY)).toBe('—');
    expect(formatNumber(0.123456, 3)).toBe('0.123');
  });

  it('carries the unit with every number, in both systems', () => {
    expect(temperature(288.15, 'si')).toEqual({ value: '288.2', unit: 'K' });
    expect(temperature(288.15, 'us')).toEqual({ value: '59.00', unit: '°F' });
    expect(temperatureCelsius(288.15)).toEqual({ value: '15.0', unit: '°C' });
    expect(pressure(101.325, 'si')).toEqual({ value: '101.3', unit: 'kPa' });
    expect(pressure(101.325, 'us')).toEqual({ value: '14.70', unit: 'psia' });
    expect(massFlow(100, 'us')).toEqual({ value: '220.5', unit: 'lb/s' });
    expect(specificWork(400, 'us')).toEqual({ value: '172.0', unit: 'Btu/lb' });
    expect(heatRate(10_000, 'si')).toEqual({ value: '10,000', unit: 'kJ/kWh' });
    expect(heatRate(10_000, 'us')).toEqual({ value: '9,478', unit: 'Btu/kWh' });
    expect(elevation(1000, 'us')).toEqual({ value: '3,281', unit: 'ft' });
    expect(percent(0.3852)).toEqual({ value: '38.5', unit: '%' });
  });

  it('reads plant power in MW in both systems and drives below 1 MW in hp', () => {
    expect(power(40_000, 'si')).toEqual({ value: '40.00', unit: 'MW' });
    expect(power(40_000, 'us')).toEqual({ value: '40.00', unit: 'MW' });
    expect(power(1000, 'us')).toEqual({ value: '1.000', unit: 'MW' });
    expect(power(999, 'us')).toEqual({ value: '1,340', unit: 'hp' });
    expect(power(500, 'si')).toEqual({ value: '0.5000', unit: 'MW' });
  });
});
