import { expect } from 'vitest';

/**
 * Asserts |actual − expected| ≤ max(abs, rel·|expected|), with a message naming the quantity.
 * A non-finite actual value always fails.
 */
export function expectClose(
  actual: number,
  expected: number,
  tolerance: { rel?: number; abs?: number },
  label: string,
): void {
  const allowed = Math.max(tolerance.abs ?? 0, (tolerance.rel ?? 0) * Math.abs(expected));
  const difference = Math.abs(actual - expected);
  expect(Number.isFinite(actual), `${label}: got ${actual}`).toBe(true);
  expect(
    difference <= allowed,
    `${label}: got ${actual}, expected ${expected} (difference ${difference.toPrecision(3)}, allowed ${allowed.toPrecision(3)})`,
  ).toBe(true);
}
