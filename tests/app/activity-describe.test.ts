import { describe, expect, it } from 'vitest';

import { describeActivity } from '@/components/screens/activity/describe';
import type { Activity } from '@/server/contracts/team';

/** One sentence per Activity kind, on the Team's timeline (naming the Review) and a Review's own. */

const entry = (kind: string, detail: Record<string, unknown>) => ({ kind, detail }) as unknown as Activity;

describe('describeActivity', () => {
  it('names the Review on the Team’s timeline only', () => {
    const signed = entry('decision:signed', { reviewName: 'Kestrel Fell', number: 2, chosenName: 'Simple, 19:1' });
    expect(describeActivity(signed, 'team')).toBe(
      'signed decision record revision 2, choosing “Simple, 19:1” in “Kestrel Fell”',
    );
    expect(describeActivity(signed, 'review')).toBe('signed decision record revision 2, choosing “Simple, 19:1”');
    expect(describeActivity(entry('candidate:added', { name: 'Reheat', reviewName: 'K' }), 'team')).toBe(
      'added the candidate “Reheat” to “K”',
    );
  });

  it('says what scores, files, the site year and the robustness check did', () => {
    expect(
      describeActivity(entry('score:changed', { scored: 2, withdrawn: 1, candidates: ['A', 'B'] }), 'review'),
    ).toBe('changed 3 scores of “A”, “B”');
    expect(describeActivity(entry('file:added', { name: 'sheet.pdf', candidateName: 'A' }), 'review')).toBe(
      'attached “sheet.pdf” to “A”',
    );
    expect(describeActivity(entry('site-year:updated', { name: 'year.csv', replaced: true }), 'review')).toBe(
      'replaced the site year “year.csv”',
    );
    expect(describeActivity(entry('robustness:finished', { samples: 2000, seed: 7 }), 'review')).toBe(
      'finished a robustness check of 2000 draws (seed 7)',
    );
  });

  it('reads an unknown kind as plain words', () => {
    expect(describeActivity(entry('gizmo:tuned', { name: 'X' }), 'review')).toBe('gizmo tuned “X”');
  });
});
