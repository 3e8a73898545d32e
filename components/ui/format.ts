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

export function temperature(kelvin: number, system: UnitSystem): Formatted {
  return system === 'si'
    ? { value: formatNumber(kelvin), unit: 'K' }
    : { value: formatNumber((kelvin * 9) / 5 - 459.67), unit: '°F' };
}

export function temperatureCelsius(kelvin: number): Formatted {
  return { value: formatNumber(kelvin - 273.15, 3), unit: '°C' };
}

export function pressure(kPa: number, system: UnitSystem): Formatted {
  return system === 'si'
    ? { value: formatNumber(kPa), unit: 'kPa' }
    : { value: formatNumber(kPa * 0.1450377), unit: 'psia' };
}

export function power(kW: number, system: UnitSystem): Formatted {
  // Plant power reads in MW in both systems; US customary adds horsepower for drives.
  return system === 'si' || kW >= 1000
    ? { value: formatNumber(kW / 1000), unit: 'MW' }
    : { value: formatNumber(kW * 1.341022), unit: 'hp' };
}

export function massFlow(kgPerS: number, system: UnitSystem): Formatted {
  return system === 'si'
    ? { value: formatNumber(kgPerS), unit: 'kg/s' }
    : { value: formatNumber(kgPerS * 2.204623), unit: 'lb/s' };
}

export function specificWork(kJPerKg: number, system: UnitSystem): Formatted {
  return system === 'si'
    ? { value: formatNumber(kJPerKg), unit: 'kJ/kg' }
    : { value: formatNumber(kJPerKg * 0.4299226), unit: 'Btu/lb' };
}

export function heatRate(kJPerKWh: number, system: UnitSystem): Formatted {
  return system === 'si'
    ? { value: formatNumber(kJPerKWh), unit: 'kJ/kWh' }
    : { value: formatNumber(kJPerKWh * 0.9478171), unit: 'Btu/kWh' };
}

export function elevation(m: number, system: UnitSystem): Formatted {
  return system === 'si' ? { value: formatNumber(m), unit: 'm' } : { value: formatNumber(m * 3.28084), unit: 'ft' };
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
