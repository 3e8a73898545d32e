import { z } from 'zod';

import type { UnitSystem } from '@/components/ui/format';
import { candidateParametersSchema, type CandidateParameters } from '@/server/contracts/board';

import { inputText, rangeText, readInput, type QuantityKind } from './quantities';

/**
 * The candidate's parameter form: what each field is, how it is shown (units, common-practice
 * hint) and how the typed texts become the parameters the server's own schema checks.
 */

export type ParameterFormValues = {
  compressor: {
    stages: string;
    pressureRatio: string;
    isentropicEfficiency: string;
    intercoolTemperatureK: string;
    intercoolerPressureLoss: string;
  };
  regeneratorOn: boolean;
  regenerator: { effectiveness: string; airSidePressureLoss: string; gasSidePressureLoss: string };
  combustorPressureLoss: string;
  turbine: {
    stages: string;
    inletTemperatureK: string;
    isentropicEfficiency: string;
    reheatTemperatureK: string;
    reheaterPressureLoss: string;
  };
};

export type Group = 'compressor' | 'regenerator' | 'turbine' | null;

export type FieldSpec = {
  /** The dotted name in the form and in the parameters (engine contract names). */
  name:
    | `compressor.${keyof ParameterFormValues['compressor']}`
    | `regenerator.${keyof ParameterFormValues['regenerator']}`
    | 'combustorPressureLoss'
    | `turbine.${keyof ParameterFormValues['turbine']}`;
  group: Group;
  key: string;
  label: string;
  kind: QuantityKind;
  /** The hint under the field (common-practice ranges from the product brief). */
  hint: (system: UnitSystem) => string;
  /** Shown only when this holds (intercooling needs two compressor stages …). */
  when?: (v: ParameterFormValues) => boolean;
};

const cp = (range: string) => `Common practice: ${range}.`;

export const fieldSpecs: readonly FieldSpec[] = [
  {
    name: 'compressor.pressureRatio',
    group: 'compressor',
    key: 'pressureRatio',
    label: 'Overall pressure ratio',
    kind: 'ratio',
    hint: () => cp('15–24 for a simple heavy-duty machine; 4–10 with a regenerator (best efficiency at low ratios)'),
  },
  {
    name: 'compressor.isentropicEfficiency',
    group: 'compressor',
    key: 'isentropicEfficiency',
    label: 'Compressor isentropic efficiency (each stage)',
    kind: 'fraction',
    hint: () => cp('0.86–0.90; a warning outside 0.75–0.95'),
  },
  {
    name: 'compressor.intercoolTemperatureK',
    group: 'compressor',
    key: 'intercoolTemperatureK',
    label: 'Intercooling temperature',
    kind: 'temperature',
    hint: () => 'Gas temperature after each intercooler. Blank: the ambient temperature.',
    when: (v) => Number(v.compressor.stages) > 1,
  },
  {
    name: 'compressor.intercoolerPressureLoss',
    group: 'compressor',
    key: 'intercoolerPressureLoss',
    label: 'Intercooler pressure loss (each)',
    kind: 'percent',
    hint: () => cp('1–2 %; a warning outside 0–5 %'),
    when: (v) => Number(v.compressor.stages) > 1,
  },
  {
    name: 'regenerator.effectiveness',
    group: 'regenerator',
    key: 'effectiveness',
    label: 'Regenerator effectiveness',
    kind: 'fraction',
    hint: () => cp('0.80–0.90; a warning outside 0.5–0.95'),
    when: (v) => v.regeneratorOn,
  },
  {
    name: 'regenerator.airSidePressureLoss',
    group: 'regenerator',
    key: 'airSidePressureLoss',
    label: 'Regenerator air-side pressure loss',
    kind: 'percent',
    hint: () => cp('2–4 %; a warning outside 0–8 %'),
    when: (v) => v.regeneratorOn,
  },
  {
    name: 'regenerator.gasSidePressureLoss',
    group: 'regenerator',
    key: 'gasSidePressureLoss',
    label: 'Regenerator gas-side pressure loss',
    kind: 'percent',
    hint: () => cp('2–4 %; a warning outside 0–8 %'),
    when: (v) => v.regeneratorOn,
  },
  {
    name: 'combustorPressureLoss',
    group: null,
    key: 'combustorPressureLoss',
    label: 'Combustor pressure loss',
    kind: 'percent',
    hint: () => cp('3–5 %; a warning outside 1–8 %'),
  },
  {
    name: 'turbine.inletTemperatureK',
    group: 'turbine',
    key: 'inletTemperatureK',
    label: 'Turbine inlet temperature',
    kind: 'temperature',
    hint: (s) =>
      cp(
        `${rangeText('temperature', 1500, 1700, s)} heavy-duty and aeroderivative, ${rangeText('temperature', 1100, 1250, s)} small recuperated machines; a warning above the basis limit`,
      ),
  },
  {
    name: 'turbine.isentropicEfficiency',
    group: 'turbine',
    key: 'isentropicEfficiency',
    label: 'Turbine isentropic efficiency (each stage)',
    kind: 'fraction',
    hint: () => cp('0.88–0.92; a warning outside 0.75–0.95'),
  },
  {
    name: 'turbine.reheatTemperatureK',
    group: 'turbine',
    key: 'reheatTemperatureK',
    label: 'Reheat temperature',
    kind: 'temperature',
    hint: () => 'Gas temperature after each reheater. Blank: the turbine inlet temperature.',
    when: (v) => Number(v.turbine.stages) > 1,
  },
  {
    name: 'turbine.reheaterPressureLoss',
    group: 'turbine',
    key: 'reheaterPressureLoss',
    label: 'Reheater pressure loss (each)',
    kind: 'percent',
    hint: () => 'Pressure lost in each reheater, as a share of its inlet pressure.',
    when: (v) => Number(v.turbine.stages) > 1,
  },
];

export const stageNames = ['compressor.stages', 'turbine.stages'] as const;

/** Common-practice regenerator values, offered when a candidate without one gets one. */
export const regeneratorDefaults = { effectiveness: 0.85, airSidePressureLoss: 0.03, gasSidePressureLoss: 0.03 };

type Loose = Record<string, unknown>;
const num = (v: unknown) => (typeof v === 'number' ? v : undefined);

/** The stored parameters as the form's texts in the user's units. */
export function toFormValues(parameters: Loose, system: UnitSystem): ParameterFormValues {
  const c = (parameters.compressor ?? {}) as Loose;
  const g = (parameters.regenerator ?? null) as Loose | null;
  const t = (parameters.turbine ?? {}) as Loose;
  const r = g ?? regeneratorDefaults;
  return {
    compressor: {
      stages: String(num(c.stages) ?? 1),
      pressureRatio: inputText('ratio', num(c.pressureRatio), system),
      isentropicEfficiency: inputText('fraction', num(c.isentropicEfficiency), system),
      intercoolTemperatureK: inputText('temperature', num(c.intercoolTemperatureK), system),
      intercoolerPressureLoss: inputText('percent', num(c.intercoolerPressureLoss) ?? 0, system),
    },
    regeneratorOn: g !== null,
    regenerator: {
      effectiveness: inputText('fraction', num(r.effectiveness), system),
      airSidePressureLoss: inputText('percent', num(r.airSidePressureLoss), system),
      gasSidePressureLoss: inputText('percent', num(r.gasSidePressureLoss), system),
    },
    combustorPressureLoss: inputText('percent', num(parameters.combustorPressureLoss), system),
    turbine: {
      stages: String(num(t.stages) ?? 1),
      inletTemperatureK: inputText('temperature', num(t.inletTemperatureK), system),
      isentropicEfficiency: inputText('fraction', num(t.isentropicEfficiency), system),
      reheatTemperatureK: inputText('temperature', num(t.reheatTemperatureK), system),
      reheaterPressureLoss: inputText('percent', num(t.reheaterPressureLoss) ?? 0, system),
    },
  };
}

function valueAt(values: ParameterFormValues, spec: Pick<FieldSpec, 'group' | 'key'>): string {
  if (spec.group === null) return values.combustorPressureLoss;
  return (values[spec.group] as Record<string, string>)[spec.key] ?? '';
}

/** The form's texts → parameters in SI (not yet checked). */
export function toParameters(values: ParameterFormValues, system: UnitSystem): Loose {
  const read = (spec: FieldSpec) => readInput(spec.kind, valueAt(values, spec), system);
  const groups: Record<'compressor' | 'regenerator' | 'turbine', Loose> = {
    compressor: { stages: readInput('count', values.compressor.stages, system) },
    regenerator: {},
    turbine: { stages: readInput('count', values.turbine.stages, system) },
  };
  let combustorPressureLoss: unknown;
  for (const spec of fieldSpecs) {
    const v = read(spec);
    if (spec.group === null) combustorPressureLoss = v;
    else if (v !== undefined) groups[spec.group][spec.key] = v;
  }
  return {
    compressor: groups.compressor,
    regenerator: values.regeneratorOn ? groups.regenerator : null,
    combustorPressureLoss,
    turbine: groups.turbine,
  };
}

/**
 * The form's schema: the texts are read in the user's units, then checked with the server's
 * candidateParametersSchema, so each field shows the message the server would give.
 */
export function parameterFormSchema(system: UnitSystem) {
  const text = z.string();
  return z
    .object({
      compressor: z.object({
        stages: text,
        pressureRatio: text,
        isentropicEfficiency: text,
        intercoolTemperatureK: text,
        intercoolerPressureLoss: text,
      }),
      regeneratorOn: z.boolean(),
      regenerator: z.object({ effectiveness: text, airSidePressureLoss: text, gasSidePressureLoss: text }),
      combustorPressureLoss: text,
      turbine: z.object({
        stages: text,
        inletTemperatureK: text,
        isentropicEfficiency: text,
        reheatTemperatureK: text,
        reheaterPressureLoss: text,
      }),
    })
    .transform((v) => toParameters(v, system))
    .pipe(candidateParametersSchema);
}

const allNames: ReadonlyArray<{ group: Group; key: string }> = [
  { group: 'compressor', key: 'stages' },
  { group: 'turbine', key: 'stages' },
  ...fieldSpecs,
];

/**
 * The part of `next` (checked parameters) that differs from the saved form texts: only the
 * fields whose text changed, in their groups, as PATCH `parameters` takes them. A regenerator
 * switched on is sent whole; switched off, null.
 */
/** PATCH `parameters`: changed fields in their groups; the regenerator whole, partial or null. */
export type ParametersPatch = {
  compressor?: Record<string, unknown>;
  regenerator?: Record<string, unknown> | null;
  combustorPressureLoss?: unknown;
  turbine?: Record<string, unknown>;
};

export function changedPart(
  saved: ParameterFormValues,
  current: ParameterFormValues,
  next: CandidateParameters,
): ParametersPatch {
  const patch: ParametersPatch = {};
  for (const { group, key } of allNames) {
    if (group === 'regenerator') continue;
    if (valueAt(saved, { group, key }) === valueAt(current, { group, key })) continue;
    if (group === null) {
      patch.combustorPressureLoss = next.combustorPressureLoss;
      continue;
    }
    const value = (next[group] as Record<string, unknown>)[key];
    // A cleared optional temperature is sent as the value it now follows (the turbine inlet
    // for reheat); a cleared intercooling temperature keeps the stored one.
    const shown = value ?? (key === 'reheatTemperatureK' ? next.turbine.inletTemperatureK : undefined);
    if (shown === undefined) continue;
    patch[group] = { ...(patch[group] ?? {}), [key]: shown };
  }
  if (saved.regeneratorOn !== current.regeneratorOn) {
    patch.regenerator = next.regenerator;
  } else if (current.regeneratorOn && next.regenerator) {
    const part: Record<string, unknown> = {};
    for (const key of ['effectiveness', 'airSidePressureLoss', 'gasSidePressureLoss'] as const) {
      if (saved.regenerator[key] !== current.regenerator[key]) part[key] = next.regenerator[key];
    }
    if (Object.keys(part).length > 0) patch.regenerator = part;
  }
  return patch;
}

/** The names of the fields whose text differs from the saved one (for the conflict view). */
export function changedNames(saved: ParameterFormValues, current: ParameterFormValues): string[] {
  const names: string[] = [];
  for (const { group, key } of allNames) {
    if (valueAt(saved, { group, key }) !== valueAt(current, { group, key }))
      names.push(group === null ? key : `${group}.${key}`);
  }
  if (saved.regeneratorOn !== current.regeneratorOn) names.push('regeneratorOn');
  return names;
}

/** The text of one field by its dotted name. */
export function textAt(values: ParameterFormValues, name: string): string {
  if (name === 'regeneratorOn') return values.regeneratorOn ? 'on' : 'off';
  const dot = name.indexOf('.');
  if (dot < 0) return valueAt(values, { group: null, key: name });
  return valueAt(values, { group: name.slice(0, dot) as Group, key: name.slice(dot + 1) });
}

/** A field name from the server (`parameters.turbine.inletTemperatureK` or `turbine.…`) in the form's terms. */
export function formFieldName(field: string | undefined | null): string | null {
  if (!field) return null;
  return field.replace(/^parameters\./, '');
}

export function labelOf(name: string): string {
  if (name === 'compressor.stages') return 'Compressor stages';
  if (name === 'turbine.stages') return 'Turbine stages';
  if (name === 'regeneratorOn') return 'Regenerator';
  return fieldSpecs.find((s) => s.name === name)?.label ?? name;
}
