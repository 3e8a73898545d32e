import fc from 'fast-check';
import { describe, expect, it } from 'vitest';

import { convert, entropy } from '@/components/ui/format';
import { expectClose } from '@/tests/helpers/expect-close';

/**
 * Specific entropy in US customary, against NIST SP 811 (2008), Appendix B. The app holds the
 * inverse of the table's factor to 7 significant figures, so it must agree to 1 part in 10⁶.
 */
const nist = {
  /**
   * 1 Btu_IT/(lb·°F) = 4.1868 E+03 J/(kg·K), exact (NIST SP 811, B.8, "British thermal
   * unit_IT per pound degree Fahrenheit"; B.9 under "specific heat capacity and specific
   * entropy") — from memory. A degree Rankine has the size of a degree Fahrenheit.
   */
  jPerKgKPerBtuPerLbR: 4.1868e3,
  /** 1 Btu_IT = 1.055 056 E+03 J (NIST SP 811, B.8, "British thermal unit_IT"). */
  jPerBtu: 1.055056e3,
  /** 1 lb = 4.535 923 7 E−01 kg (exact; NIST SP 811, B.8, "pound (avoirdupois)"). */
  kgPerLb: 4.5359237e-1,
  /** 1 °R = 1/1.8 K (NIST SP 811, B.9, "temperature interval") — from memory. */
  kelvinPerRankine: 1 / 1.8,
} as const;

const factorTolerance = { rel: 1e-6 } as const;

describe('specific entropy against NIST SP 811 Appendix B', () => {
  it('1 Btu/(lb·°R) written in kJ/(kg·K) shows as 1 Btu/(lb·°R)', () => {
    const shown = convert.entropy(nist.jPerKgKPerBtuPerLbR / 1e3, 'us');
    expect(shown.unit).toBe('Btu/(lb·°R)');
    expectClose(shown.amount, 1, factorTolerance, 'specific entropy in Btu/(lb·°R)');
  });

  it('1 kJ/(kg·K) is 0.238 845 9 Btu/(lb·°R)', () => {
    expectClose(convert.entropy(1, 'us').amount, 0.2388459, factorTolerance, '1 kJ/(kg·K)');
  });

  it('the factor is the Btu_IT over the pound and the degree (the table is self-consistent)', () => {
    const fromParts = nist.jPerBtu / (nist.kgPerLb * nist.kelvinPerRankine);
    expectClose(fromParts, nist.jPerKgKPerBtuPerLbR, factorTolerance, 'Btu_IT/(lb·°R) in J/(kg·K)');
  });

  it('passes through in SI and stays linear (no offset) over the range of a T-s diagram', () => {
    expect(convert.entropy(7.891, 'si')).toEqual({ amount: 7.891, unit: 'kJ/(kg·K)' });
    fc.assert(
      fc.property(fc.double({ min: -20, max: 20, noNaN: true }), (s) => {
        expectClose(
          convert.entropy(s, 'us').amount,
          (s * 1e3) / nist.jPerKgKPerBtuPerLbR,
          { rel: 1e-6, abs: 1e-12 },
          `${s} kJ/(kg·K)`,
        );
      }),
    );
  });

  it('shows four significant figures with the unit', () => {
    expect(entropy(6.865, 'si')).toEqual({ value: '6.865', unit: 'kJ/(kg·K)' });
    expect(entropy(6.865, 'us')).toEqual({ value: '1.640', unit: 'Btu/(lb·°R)' });
  });
});
