/**
 * Display formatting. The API speaks SI with units in field names (temperatureK,
 * pressureKPa…); conversion to the user's unit system happens here and only here.
 */

export type UnitSystem = 'si' | 'us';

export const unitSystemLabels: Record<UnitSystem, string> = {
  si: 'SI',
  us: 'US customary',
};

export type Formatted = { value: string; unit: string };

/** 3–4 significant figures: four below 10 000, otherwise whole units with grouping. */
export function formatNumber(value: number, significant = 4): string {
  if (!Number.isFinite(value)) return '—';
  if (value === 0) return '0';
  const abs = Math.abs(value);
  if (abs >= 10 ** significant) return Math.round(value).toLocaleString('en-US');
  const digits = Math.max(0, significant - 1 - Math.floor(Math.log10(abs)));
  return value.toLocaleString('en-US', { minimumFractionDigits: digits, maximumFractionDigits: digits });
}

/** A quantity in the unit it is shown in, before rounding for the screen. */
export type Converted = { amount: number; unit: string };

/**
 * SI (as the API sends it) → the unit shown. Each US customary factor is the inverse of the
 * NIST SP 811 (2008) Appendix B factor, to 7 significant figures; tests/app/format.test.ts
 * checks each one against the table.
 */
export const convert = {
  temperature: (kelvin: number, system: UnitSystem): Converted =>
    system === 'si' ? { amount: kelvin, unit: 'K' } : { amount: (kelvin * 9) / 5 - 459.67, unit: '°F' },
  temperatureCelsius: (kelvin: number): Converted => ({ amount: kelvin - 273.15, unit: '°C' }),
  pressure: (kPa: number, system: UnitSystem): Converted =>
    system === 'si' ? { amount: kPa, unit: 'kPa' } : { amount: kPa * 0.1450377, unit: 'psia' },
  // Plant power reads in MW in both systems; US customary adds horsepower for drives.
  power: (kW: number, system: UnitSystem): Converted =>
    system === 'si' || kW >= 1000 ? { amount: kW / 1000, unit: 'MW' } : { amount: kW * 1.341022, unit: 'hp' },
  massFlow: (kgPerS: number, system: UnitSystem): Converted =>
    system === 'si' ? { amount: kgPerS, unit: 'kg/s' } : { amount: kgPerS * 2.204623, unit: 'lb/s' },
  // Specific entropy and specific heat: Btu_IT/(lb·°R) has the size of Btu_IT/(lb·°F).
  entropy: (kJPerKgK: number, system: UnitSystem): Converted =>
    system === 'si' ? { amount: kJPerKgK, unit: 'kJ/(kg·K)' } : { amount: kJPerKgK * 0.2388459, unit: 'Btu/(lb·°R)' },
  specificWork: (kJPerKg: number, system: UnitSystem): Converted =>
    system === 'si' ? { amount: kJPerKg, unit: 'kJ/kg' } : { amount: kJPerKg * 0.4299226, unit: 'Btu/lb' },
  heatRate: (kJPerKWh: number, system: UnitSystem): Converted =>
    system === 'si' ? { amount: kJPerKWh, unit: 'kJ/kWh' } : { amount: kJPerKWh * 0.9478171, unit: 'Btu/kWh' },
  elevation: (m: number, system: UnitSystem): Converted =>
    system === 'si' ? { amount: m, unit: 'm' } : { amount: m * 3.28084, unit: 'ft' },
  // A site's air reads in °C in SI (°F in US customary), unlike the cycle's kelvin.
  siteTemperature: (kelvin: number, system: UnitSystem): Converted =>
    system === 'si' ? convert.temperatureCelsius(kelvin) : convert.temperature(kelvin, system),
  // Fuel and CO2 in a year: tonnes, or short tons (1 short ton = 907.1847 kg).
  tonnes: (t: number, system: UnitSystem): Converted =>
    system === 'si' ? { amount: t, unit: 't' } : { amount: t * 1.102311, unit: 'short tons' },
};

function shown({ amount, unit }: Converted, significant = 4): Formatted {
  return { value: formatNumber(amount, significant), unit };
}

export function temperature(kelvin: number, system: UnitSystem): Formatted {
  return shown(convert.temperature(kelvin, system));
}

export function temperatureCelsius(kelvin: number): Formatted {
  return shown(convert.temperatureCelsius(kelvin), 3);
}

export function pressure(kPa: number, system: UnitSystem): Formatted {
  return shown(convert.pressure(kPa, system));
}

export function power(kW: number, system: UnitSystem): Formatted {
  return shown(convert.power(kW, system));
}

export function massFlow(kgPerS: number, system: UnitSystem): Formatted {
  return shown(convert.massFlow(kgPerS, system));
}

export function specificWork(kJPerKg: number, system: UnitSystem): Formatted {
  return shown(convert.specificWork(kJPerKg, system));
}

export function entropy(kJPerKgK: number, system: UnitSystem): Formatted {
  return shown(convert.entropy(kJPerKgK, system));
}

export function heatRate(kJPerKWh: number, system: UnitSystem): Formatted {
  return shown(convert.heatRate(kJPerKWh, system));
}

export function elevation(m: number, system: UnitSystem): Formatted {
  return shown(convert.elevation(m, system));
}

export function siteTemperature(kelvin: number, system: UnitSystem): Formatted {
  return shown(convert.siteTemperature(kelvin, system), 3);
}

export function tonnes(t: number, system: UnitSystem): Formatted {
  return shown(convert.tonnes(t, system), 3);
}

export function percent(fraction: number): Formatted {
  return { value: formatNumber(fraction * 100, 3), unit: '%' };
}

export function count(n: number, one: string, many: string): string {
  return `${n} ${n === 1 ? one : many}`;
}

const dateFormat = new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'short', year: 'numeric' });
const dateTimeFormat = new Intl.DateTimeFormat('en-GB', {
  day: 'numeric',
  month: 'short',
  hour: '2-digit',
  minute: '2-digit',
});

export function formatDate(iso: string): string {
  const d = new Date(iso);
  return Number.isNaN(d.getTime()) ? '—' : dateFormat.format(d);
}

export function formatDateTime(iso: string): string {
  const d = new Date(iso);
  return Number.isNaN(d.getTime()) ? '—' : dateTimeFormat.format(d);
}

/** "just now", "5 min ago", "3 h ago", then the date. */
export function formatAgo(iso: string, now = Date.now()): string {
  const t = new Date(iso).getTime();
  if (Number.isNaN(t)) return '—';
  const s = Math.max(0, Math.round((now - t) / 1000));
  if (s < 60) return 'just now';
  if (s < 3600) return `${Math.floor(s / 60)} min ago`;
  if (s < 86400) return `${Math.floor(s / 3600)} h ago`;
  return formatDate(iso);
}
