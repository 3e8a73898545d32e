import { describe, expect, it } from 'vitest';

import { basisFormSchema, toBasisForm, weightShares } from '@/components/screens/design-basis/basis-model';
import type { DesignBasis } from '@/server/contracts/board';

/** The design basis form reads its texts into the body the server's designBasisInput parses. */

const basis: DesignBasis = {
  ambient: { temperatureK: 288.15, elevationM: 0, relativeHumidity: 0.6 },
  fuel: { hydrogenVolumeFraction: 0.1, temperatureK: 300 },
  fluid: 'combustion',
  netPowerKW: 50_000,
  generatorEfficiency: 0.985,
  limits: { maxTurbineInletTemperatureK: 1700 },
  criteria: [
    { id: 'a', name: 'Efficiency', weight: 3, measure: 'thermalEfficiency' },
    { id: 'b', name: 'Complexity', weight: 1, measure: null },
  ],
  revision: 1,
  updatedAt: new Date().toISOString(),
};

describe('design basis form', () => {
  it('round-trips the basis through the texts (MW, %, °F) to the PUT body', () => {
    const us = toBasisForm(basis, 'us');
    expect(us.netPowerKW).toBe('50');
    expect(us.ambient.relativeHumidity).toBe('60');
    const body = basisFormSchema('us').parse(us) as unknown as Record<string, Record<string, number>>;
    expect(body.ambient!.temperatureK).toBeCloseTo(288.15, 2);
    expect(body.ambient!.elevationM).toBe(0);
    expect(body.ambient!.pressureKPa).toBeUndefined();
    expect(body.netPowerKW).toBe(50_000);
    expect(body.fuel!.hydrogenVolumeFraction).toBeCloseTo(0.1, 12);
  });

  it('names the field with the server’s message, and duplicate criteria at their name', () => {
    const v = toBasisForm(basis, 'si');
    const bad = basisFormSchema('si').safeParse({ ...v, ambient: { ...v.ambient, relativeHumidity: '150' } });
    expect(bad.error!.issues[0]!.path).toEqual(['ambient', 'relativeHumidity']);
    expect(bad.error!.issues[0]!.message).toBe('Relative humidity must be at most 1.');
    const dup = basisFormSchema('si').safeParse({
      ...v,
      criteria: [v.criteria[0]!, { ...v.criteria[1]!, name: 'efficiency' }],
    });
    expect(dup.error!.issues[0]!.path).toEqual(['criteria', 1, 'name']);
  });

  it('shows each weight’s share of the total', () => {
    expect(weightShares(['3', '1'])).toEqual([75, 25]);
    expect(weightShares(['0', 'x'])).toEqual([0, 0]);
  });
});
