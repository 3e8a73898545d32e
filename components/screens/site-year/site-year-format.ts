import { formatNumber, heatRate, power, tonnes, type Formatted, type UnitSystem } from '@/components/ui/format';
import type { Annual } from '@/server/contracts/site-year';

/** The line every site-year figure carries (the issue's words are ours: a first-order estimate). */
export const firstOrderLine =
  'A first-order estimate without component maps, for comparing candidates: each machine is sized at the design basis ambient for the required power and keeps its inlet volume flow, pressure ratio, turbine inlet temperature, efficiencies and losses at every other ambient.';

/** What the year assumes where the machine could give more than asked. */
export const powerCapLine =
  'In the year, output is capped at the required power where the machine could give more (part load at that ambient’s full-load heat rate); an hour below the required power counts as short. Fired hours are spread over the profile’s hours in proportion.';

/** Energy: MWh below 10 GWh, GWh from there. */
export function energy(mwh: number): Formatted {
  return mwh >= 10_000
    ? { value: formatNumber(mwh / 1000, 3), unit: 'GWh' }
    : { value: formatNumber(mwh, 3), unit: 'MWh' };
}

export function hours(h: number): Formatted {
  return { value: h === 0 ? '0' : h < 10 ? formatNumber(h, 2) : Math.round(h).toLocaleString('en-US'), unit: 'h' };
}

export function capacity(kw: number | null, requiredKW: number, system: UnitSystem) {
  const share = kw === null ? 0 : kw / requiredKW;
  return {
    power: kw === null ? { value: '—', unit: '' } : power(kw, system),
    required: power(requiredKW, system),
    short: kw === null || kw < requiredKW * (1 - 1e-9),
    shareText: `${formatNumber(share * 100, 3)} %`,
  };
}

export function annualRows(a: Annual, system: UnitSystem) {
  return [
    { label: 'Energy in the year', ...energy(a.energyMWh), testID: 'site-year-energy' },
    { label: 'Fuel', ...tonnes(a.fuelTonnes, system), testID: 'site-year-fuel' },
    { label: 'CO2', ...tonnes(a.co2Tonnes, system), testID: 'site-year-co2' },
    { label: 'Mean heat rate', ...heatRate(a.meanHeatRateKJPerKWh, system), testID: 'site-year-heat-rate' },
    {
      label: `Short of the required power (of ${a.firedHours} fired h)`,
      ...hours(a.shortfallHours),
      testID: 'site-year-shortfall',
    },
  ];
}

/** One line for a board card: "Year: 41.2 GWh · 3 h short", or the hot day without a profile. */
export function siteYearLineText(
  c: { annual: Annual | null; hotDayKW: number | null; requiredKW: number; error: string | null },
  system: UnitSystem,
): string {
  if (c.error) return 'Year: no figures (the engine refused this candidate)';
  if (c.annual) {
    const e = energy(c.annual.energyMWh);
    const h = hours(c.annual.shortfallHours);
    return `Year: ${e.value} ${e.unit} · ${c.annual.shortfallHours > 0 ? `${h.value} h short` : 'never short'}`;
  }
  if (c.hotDayKW === null) return 'Year: no site profile';
  const p = power(c.hotDayKW, system);
  return `Year: no site profile · +45 °C day ${p.value} ${p.unit}`;
}
