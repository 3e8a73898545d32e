import { describe, expect, it } from 'vitest';

import { mentionQueryAt } from '@/components/screens/board/comment-text';
import { bestValues, isBest } from '@/components/screens/board/figures';
import type { CandidateWire } from '@/server/contracts/board';

/** Pure parts of the board: which figure is best across the cards, and the @ being typed. */

const card = (id: string, results: Record<string, unknown> | null) => ({ id, results }) as unknown as CandidateWire;

describe('bestValues', () => {
  const a = card('a', { thermalEfficiency: 0.38, netWorkKJPerKg: 390, heatRateKJPerKWh: 9470, co2KgPerMWh: 520 });
  const b = card('b', { thermalEfficiency: 0.44, netWorkKJPerKg: 310, heatRateKJPerKWh: 8180, co2KgPerMWh: 449 });

  it('marks the highest efficiency and work, the lowest heat rate and CO2', () => {
    const best = bestValues([a, b]);
    expect(best.thermalEfficiency).toBe(0.44);
    expect(best.netWorkKJPerKg).toBe(390);
    expect(best.heatRateKJPerKWh).toBe(8180);
    expect(best.co2KgPerMWh).toBe(449);
    // Exhaust temperature and air flow are not better at either end by themselves.
    expect(best.exhaustTemperatureK).toBeUndefined();
    expect(best.airMassFlowKgPerS).toBeUndefined();
  });

  it('marks nothing with one comparable candidate; skips candidates without results or with non-numbers', () => {
    expect(bestValues([a])).toEqual({});
    expect(bestValues([a, card('x', null), card('y', { thermalEfficiency: 'high' })])).toEqual({});
    expect(bestValues([a, card('z', { thermalEfficiency: Number.NaN }), b]).thermalEfficiency).toBe(0.44);
  });

  it('marks every tied candidate', () => {
    expect(isBest(0.44, 0.44)).toBe(true);
    expect(isBest(0.44 + 1e-14, 0.44)).toBe(true);
    expect(isBest(0.4399, 0.44)).toBe(false);
    expect(isBest(null, 0.44)).toBe(false);
    expect(isBest(0.44, undefined)).toBe(false);
  });
});

describe('mentionQueryAt', () => {
  it('finds the @ being typed at the start or after a space, with a full name so far', () => {
    expect(mentionQueryAt('@In', 3)).toEqual({ start: 0, text: 'In' });
    expect(mentionQueryAt('ask @Ines Mor', 13)).toEqual({ start: 4, text: 'Ines Mor' });
    expect(mentionQueryAt('ask @', 5)).toEqual({ start: 4, text: '' });
  });

  it('is not a mention inside a word, after two spaces, a new line or far behind the cursor', () => {
    expect(mentionQueryAt('mail@example', 12)).toBeNull();
    expect(mentionQueryAt('@Ines  later', 12)).toBeNull();
    expect(mentionQueryAt('@Ines\nnext', 10)).toBeNull();
    expect(mentionQueryAt('@ Ines', 6)).toBeNull();
    expect(mentionQueryAt(`@${'x'.repeat(61)}`, 62)).toBeNull();
    expect(mentionQueryAt('no at here', 10)).toBeNull();
  });

  it('reads only what is before the cursor', () => {
    expect(mentionQueryAt('@Ines Moreau, thanks', 3)).toEqual({ start: 0, text: 'In' });
  });
});
