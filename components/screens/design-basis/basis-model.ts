import { z } from 'zod';

import { inputText, readInput, type QuantityKind } from '@/components/screens/candidate/quantities';
import type { UnitSystem } from '@/components/ui/format';
import { designBasisInput, type DesignBasis } from '@/server/contracts/board';

/** The design basis form: texts in the user's units, read into the PUT body the server parses. */
export type BasisFormValues = {
  siteBy: 'elevation' | 'pressure';
  ambient: { temperatureK: string; pressureKPa: string; elevationM: string; relativeHumidity: string };
  fuel: { hydrogenVolumeFraction: string; temperatureK: string };
  fluid: 'combustion' | 'variable-cp-air' | 'constant-cp-air';
  /** Typed in MW. */
  netPowerKW: string;
  generatorEfficiency: string;
  limits: { maxTurbineInletTemperatureK: string; exhaustTemperatureMinK: string; exhaustTemperatureMaxK: string };
  criteria: Array<{ id?: string; name: string; weight: string; measure: string | null }>;
  /** Not on this form (the Site year screen sets it); carried so a save keeps it. */
  firedHoursPerYear?: number;
};

export const fluidExplained: Record<BasisFormValues['fluid'], { label: string; line: string }> = {
  combustion: {
    label: 'Combustion products',
    line: 'Air, then the products of burning the fuel after the combustor: the closest of the three.',
  },
  'variable-cp-air': {
    label: 'Variable-cp air',
    line: 'Humid air throughout with temperature-dependent specific heats; fuel only sets the fuel flow.',
  },
  'constant-cp-air': {
    label: 'Constant-cp air',
    line: 'Air with fixed specific heats, for quick textbook-style comparisons; humidity ignored.',
  },
};

export function toBasisForm(b: DesignBasis, system: UnitSystem): BasisFormValues {
  const t = (k: number | undefined) => inputText('temperature', k, system);
  return {
    siteBy: b.ambient.pressureKPa !== undefined ? 'pressure' : 'elevation',
    ambient: {
      temperatureK: t(b.ambient.temperatureK),
      pressureKPa: inputText('pressure', b.ambient.pressureKPa, system),
      elevationM: inputText('elevation', b.ambient.elevationM ?? 0, system),
      relativeHumidity: inputText('percent', b.ambient.relativeHumidity, system),
    },
    fuel: {
      hydrogenVolumeFraction: inputText('percent', b.fuel.hydrogenVolumeFraction, system),
      temperatureK: t(b.fuel.temperatureK),
    },
    fluid: b.fluid,
    netPowerKW: String(Number((b.netPowerKW / 1000).toFixed(4))),
    generatorEfficiency: inputText('fraction', b.generatorEfficiency, system),
    limits: {
      maxTurbineInletTemperatureK: t(b.limits.maxTurbineInletTemperatureK),
      exhaustTemperatureMinK: t(b.limits.exhaustTemperatureMinK),
      exhaustTemperatureMaxK: t(b.limits.exhaustTemperatureMaxK),
    },
    criteria: b.criteria.map((c) => ({ id: c.id, name: c.name, weight: String(c.weight), measure: c.measure })),
    firedHoursPerYear: b.firedHoursPerYear,
  };
}

export function toBasisInput(v: BasisFormValues, system: UnitSystem) {
  const r = (kind: QuantityKind, text: string) => readInput(kind, text, system);
  const mw = readInput('ratio', v.netPowerKW, system);
  const weight = (text: string) => readInput('ratio', text, system);
  return {
    ambient: {
      temperatureK: r('temperature', v.ambient.temperatureK),
      ...(v.siteBy === 'pressure'
        ? { pressureKPa: r('pressure', v.ambient.pressureKPa) ?? '' }
        : { elevationM: r('elevation', v.ambient.elevationM) ?? '' }),
      relativeHumidity: r('percent', v.ambient.relativeHumidity),
    },
    fuel: {
      hydrogenVolumeFraction: r('percent', v.fuel.hydrogenVolumeFraction),
      temperatureK: r('temperature', v.fuel.temperatureK),
    },
    fluid: v.fluid,
    netPowerKW: typeof mw === 'number' ? mw * 1000 : mw,
    generatorEfficiency: r('fraction', v.generatorEfficiency),
    limits: Object.fromEntries(
      Object.entries(v.limits).flatMap(([k, text]) => {
        const x = r('temperature', text);
        return x === undefined ? [] : [[k, x]];
      }),
    ),
    criteria: v.criteria.map((c) => ({
      ...(c.id ? { id: c.id } : {}),
      name: c.name,
      weight: weight(c.weight),
      measure: c.measure,
    })),
    ...(v.firedHoursPerYear !== undefined ? { firedHoursPerYear: v.firedHoursPerYear } : {}),
  };
}

export function basisFormSchema(system: UnitSystem) {
  const s = z.string();
  return z
    .object({
      siteBy: z.enum(['elevation', 'pressure']),
      ambient: z.object({ temperatureK: s, pressureKPa: s, elevationM: s, relativeHumidity: s }),
      fuel: z.object({ hydrogenVolumeFraction: s, temperatureK: s }),
      fluid: z.enum(['combustion', 'variable-cp-air', 'constant-cp-air']),
      netPowerKW: s,
      generatorEfficiency: s,
      limits: z.object({ maxTurbineInletTemperatureK: s, exhaustTemperatureMinK: s, exhaustTemperatureMaxK: s }),
      criteria: z.array(z.object({ id: z.string().optional(), name: s, weight: s, measure: s.nullable() })),
      firedHoursPerYear: z.number().optional(),
    })
    .transform((v): unknown => toBasisInput(v as BasisFormValues, system))
    .pipe(designBasisInput);
}

/** Each weight's share of the total, in % (0 when the total is 0 or a weight is not a number). */
export function weightShares(weights: string[]): number[] {
  const n = weights.map((w) => {
    const x = Number(w);
    return Number.isFinite(x) && x > 0 ? x : 0;
  });
  const total = n.reduce((a, b) => a + b, 0);
  return n.map((x) => (total > 0 ? (x / total) * 100 : 0));
}
