import { describe, expect, it } from 'vitest';

import {
  changedNames,
  changedPart,
  parameterFormSchema,
  toFormValues,
} from '@/components/screens/candidate/parameter-model';
import { fromShown, inputText, readInput, toShown } from '@/components/screens/candidate/quantities';

/** The candidate form's model: texts in the user's units ↔ the parameters the server's schema checks. */

const stored = {
  compressor: { stages: 2, pressureRatio: 12, isentropicEfficiency: 0.88, intercoolerPressureLoss: 0.015 },
  regenerator: null,
  combustorPressureLoss: 0.04,
  turbine: { stages: 1, inletTemperatureK: 1500, isentropicEfficiency: 0.9, reheaterPressureLoss: 0 },
};

describe('candidate parameter form', () => {
  it('shows losses in % and temperatures in the unit system, and reads them back in SI', () => {
    const si = toFormValues(stored, 'si');
    expect(si.combustorPressureLoss).toBe('4');
    expect(si.turbine.inletTemperatureK).toBe('1500');
    const us = toFormValues(stored, 'us');
    expect(us.turbine.inletTemperatureK).toBe('2240.33');
    const parsed = parameterFormSchema('us').parse(us);
    expect(parsed.turbine.inletTemperatureK).toBeCloseTo(1500, 2);
    expect(parsed.combustorPressureLoss).toBeCloseTo(0.04, 12);
    expect(parsed.regenerator).toBeNull();
  });

  it('round-trips temperatures through the linear conversions of format.ts', () => {
    for (const k of [200, 288.15, 1500, 2000])
      expect(fromShown('temperature', toShown('temperature', k, 'us'), 'us')).toBeCloseTo(k, 9);
    expect(readInput('percent', '3,5', 'si')).toBeCloseTo(0.035, 12);
    expect(readInput('ratio', 'twelve', 'si')).toBe('twelve');
    expect(readInput('ratio', '  ', 'si')).toBeUndefined();
    expect(inputText('fraction', 0.87654321, 'si')).toBe('0.8765');
  });

  it('says the server schema’s message at the field', () => {
    const v = toFormValues(stored, 'si');
    const bad = parameterFormSchema('si').safeParse({ ...v, compressor: { ...v.compressor, pressureRatio: '0.5' } });
    expect(bad.success).toBe(false);
    const issue = bad.error!.issues[0]!;
    expect(issue.path).toEqual(['compressor', 'pressureRatio']);
    expect(issue.message).toBe('Pressure ratio must be above 1.');
    const text = parameterFormSchema('si').safeParse({ ...v, combustorPressureLoss: 'abc' });
    expect(text.error!.issues[0]!.message).toBe('Combustor pressure loss must be a number.');
  });

  it('sends only the changed part; a regenerator switched on goes whole', () => {
    const saved = toFormValues(stored, 'si');
    const current = { ...saved, compressor: { ...saved.compressor, pressureRatio: '14' }, regeneratorOn: true };
    const next = parameterFormSchema('si').parse(current);
    expect(changedNames(saved, current)).toEqual(['compressor.pressureRatio', 'regeneratorOn']);
    expect(changedPart(saved, current, next)).toEqual({
      compressor: { pressureRatio: 14 },
      regenerator: { effectiveness: 0.85, airSidePressureLoss: 0.03, gasSidePressureLoss: 0.03 },
    });
    expect(changedPart(saved, saved, parameterFormSchema('si').parse(saved))).toEqual({});
  });
});
