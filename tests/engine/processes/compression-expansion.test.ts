import { describe, expect, it } from 'vitest';

import { compress, isentropicExitTemperature, newStageSeed } from '@/server/engine/processes/compression';
import { expand } from '@/server/engine/processes/expansion';
import { stateAt } from '@/server/engine/processes/flow-state';
import { ConstantCpAir } from '@/server/engine/properties/constant-cp-air';
import { dryAirAmounts } from '@/server/engine/properties/dry-air';
import { IdealGasMixture } from '@/server/engine/properties/ideal-gas-mixture';
import { expectClose } from '@/tests/helpers/expect-close';

const coldAir = new ConstantCpAir();
const dryAir = new IdealGasMixture(dryAirAmounts());

// Closed form of the cold-air standard (any thermodynamics text): an isentropic change of an
// ideal gas of constant cp and k = 1.4 gives T2s = T1 (p2/p1)^((k−1)/k), and the stage
// efficiencies then give the actual enthalpies, with h = cp (T − T_ref).
const exponent = (1.4 - 1) / 1.4;

describe('a compression stage', () => {
  it.each([
    { t1: 288.15, ratio: 4, eta: 0.85 },
    { t1: 300, ratio: 15, eta: 0.9 },
    { t1: 250, ratio: 1.2, eta: 1 },
  ])('matches the cold-air closed form at T1 $t1 K, r $ratio, η $eta', ({ t1, ratio, eta }) => {
    const inlet = stateAt(coldAir, t1, 100);
    const exit = compress(coldAir, inlet, ratio, eta);
    const t2s = t1 * Math.pow(ratio, exponent);
    expectClose(exit.temperatureK, t1 + (t2s - t1) / eta, { rel: 1e-12 }, 'exit temperature');
    expectClose(exit.pressureKPa, 100 * ratio, { rel: 1e-12 }, 'exit pressure');
    expectClose(exit.enthalpyKJPerKg - inlet.enthalpyKJPerKg, (1.005 * (t2s - t1)) / eta, { rel: 1e-12 }, 'work');
  });

  it('raises the entropy below η = 1 and keeps it at η = 1 (second law)', () => {
    for (const gas of [coldAir, dryAir]) {
      const inlet = stateAt(gas, 300, 101.325);
      expect(compress(gas, inlet, 8, 0.8).entropyKJPerKgK).toBeGreaterThan(inlet.entropyKJPerKgK);
      expectClose(compress(gas, inlet, 8, 1).entropyKJPerKgK, inlet.entropyKJPerKgK, { abs: 1e-10 }, 'isentropic s');
    }
  });

  it('gives the same stage with a seed from a like stage as without', () => {
    const seed = newStageSeed();
    const first = compress(dryAir, stateAt(dryAir, 300, 100), 3, 0.88, seed);
    const seeded = compress(dryAir, stateAt(dryAir, 310, 290), 3, 0.88, seed);
    const plain = compress(dryAir, stateAt(dryAir, 310, 290), 3, 0.88);
    expect(first.temperatureK).toBeGreaterThan(300);
    expectClose(seeded.temperatureK, plain.temperatureK, { rel: 1e-11 }, 'seeded exit temperature');
    expectClose(seed.isentropicK, isentropicExitTemperature(dryAir, 310, 3), { rel: 1e-11 }, 'isentropic exit kept');
  });
});

describe('an expansion stage', () => {
  it.each([
    { t1: 1400, ratio: 10, eta: 0.89 },
    { t1: 900, ratio: 2, eta: 0.8 },
  ])('matches the cold-air closed form at T1 $t1 K, e $ratio, η $eta', ({ t1, ratio, eta }) => {
    const inlet = stateAt(coldAir, t1, 1000);
    const exit = expand(coldAir, inlet, ratio, eta);
    const t2s = t1 / Math.pow(ratio, exponent);
    expectClose(exit.temperatureK, t1 - eta * (t1 - t2s), { rel: 1e-12 }, 'exit temperature');
    expectClose(exit.pressureKPa, 1000 / ratio, { rel: 1e-12 }, 'exit pressure');
  });

  it('raises the entropy below η = 1 (second law)', () => {
    const inlet = stateAt(dryAir, 1500, 1500);
    const exit = expand(dryAir, inlet, 12, 0.9);
    expect(exit.entropyKJPerKgK).toBeGreaterThan(inlet.entropyKJPerKgK);
    expect(exit.temperatureK).toBeLessThan(inlet.temperatureK);
  });

  it('is the reverse of an isentropic compression in variable-cp air (s° method)', () => {
    const inlet = stateAt(dryAir, 320, 100);
    const up = compress(dryAir, inlet, 20, 1);
    const down = expand(dryAir, up, 20, 1);
    expectClose(down.temperatureK, 320, { rel: 1e-10 }, 'back to the inlet temperature');
  });
});
