import { describe, it } from 'vitest';

import { stateAt, stateFromEnthalpy } from '@/server/engine/processes/flow-state';
import { dryAirAmounts } from '@/server/engine/properties/dry-air';
import { IdealGasMixture } from '@/server/engine/properties/ideal-gas-mixture';
import { UNIVERSAL_GAS_CONSTANT } from '@/server/engine/properties/nasa-species';
import { expectClose } from '@/tests/helpers/expect-close';

const dryAir = new IdealGasMixture(dryAirAmounts());

describe('a flow state', () => {
  it('takes s(T, p) = s°(T) − R ln(p / 100 kPa) (ideal gas)', () => {
    const a = stateAt(dryAir, 800, 100);
    const b = stateAt(dryAir, 800, 1000);
    const r = UNIVERSAL_GAS_CONSTANT / dryAir.molarMassKgPerKmol;
    expectClose(a.entropyKJPerKgK - b.entropyKJPerKgK, r * Math.log(10), { rel: 1e-12 }, 's(100) − s(1000)');
    expectClose(a.enthalpyKJPerKg, b.enthalpyKJPerKg, { rel: 1e-15 }, 'h independent of p');
  });

  it.each([210, 300, 999.9, 1000, 1000.1, 2500, 5900])('round-trips T → h → T at %s K', (t) => {
    const a = stateAt(dryAir, t, 500);
    const b = stateFromEnthalpy(dryAir, a.enthalpyKJPerKg, 500, t * 1.1);
    expectClose(b.temperatureK, t, { rel: 1e-11 }, 'temperature');
    expectClose(b.entropyKJPerKgK, a.entropyKJPerKgK, { rel: 1e-11 }, 'entropy');
  });
});
