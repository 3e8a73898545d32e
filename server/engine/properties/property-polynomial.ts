/**
 * Property polynomials of one gas (of fixed composition) in the NASA 9-coefficient form of
 * nasa-species.ts, arranged so that every property is one Horner chain. A "polynomial" here
 * is an array of 2 × 23 numbers: the range below the 1000 K break, then the range
 * above it. With u = 1/T and the numbers p0…p22 of a range:
 *   cp = (p0 u + p1) u + p2 + T(p3 + T(p4 + T(p5 + T p6)))
 *   h  = p7 u + p8 ln T + T(p9 + T(p10 + T(p11 + T(p12 + T p13)))) + p14
 *   s° = (p15 u + p16) u + p17 ln T + T(p18 + T(p19 + T(p20 + T p21))) + p22
 * Units follow the coefficients: per kg (kJ/kg, kJ/(kg·K)) for a mixture's specific
 * properties, or per kg of compressor inlet air (kJ, kJ/K) for a stream. Valid 200–6000 K.
 *
 * Polynomials are plain arrays, all made by newPolynomial (one element kind, so every
 * property call stays monomorphic). Not Float64Arrays: V8 keeps a typed array of more than
 * 64 bytes outside its heap, and allocating one costs about a microsecond, ten times the
 * arithmetic of a burner. Mixtures made per evaluation are refilled in place anyway.
 *
 * Every number is linear in the species coefficients, so the polynomial of a gas whose
 * composition is a base plus w times a change (air plus the products of w kg of fuel) is
 * the base polynomial plus w times the change's: see blendPolynomials.
 */
import { COEFFICIENTS_PER_RANGE, POLYNOMIAL_BREAK_K } from './nasa-species';

const RANGE = 23;
/** Length of a property polynomial: two ranges of 23 numbers. */
export const POLYNOMIAL_LENGTH = 2 * RANGE;
// Local copies: an imported binding is a property getter once transpiled, read on every call.
const BREAK_K = POLYNOMIAL_BREAK_K;
const HIGH_COEFFICIENTS = COEFFICIENTS_PER_RANGE;

/** Bounds of the temperature inversions, K: wide enough to reach just past the data range,
 * so a state outside 200–6000 K is found and then reported by the cycle, not hidden. */
const INVERSION_MIN_K = 50;
const INVERSION_MAX_K = 20000;
const INVERSION_RELATIVE_TOLERANCE = 1e-12;
const ACCEPT_STEP_RELATIVE = 1e-5;

/** A property polynomial: 2 × 23 numbers (see above). */
export type Polynomial = number[];

/** A polynomial to be filled. */
export function newPolynomial(): Polynomial {
  // Filled with a double, so that every polynomial has one element kind (double) from the start.
  const out: Polynomial = new Array(POLYNOMIAL_LENGTH);
  for (let k = 0; k < POLYNOMIAL_LENGTH; k++) out[k] = 0.5;
  return out;
}

function fillRange(
  out: Polynomial,
  at: number,
  c: ArrayLike<number>,
  o: number,
  scale: number,
  entropyOffset: number,
): void {
  const a1 = c[o] * scale;
  const a2 = c[o + 1] * scale;
  const a3 = c[o + 2] * scale;
  const a4 = c[o + 3] * scale;
  const a5 = c[o + 4] * scale;
  const a6 = c[o + 5] * scale;
  const a7 = c[o + 6] * scale;
  out[at] = a1;
  out[at + 1] = a2;
  out[at + 2] = a3;
  out[at + 3] = a4;
  out[at + 4] = a5;
  out[at + 5] = a6;
  out[at + 6] = a7;
  out[at + 7] = -a1;
  out[at + 8] = a2;
  out[at + 9] = a3;
  out[at + 10] = a4 / 2;
  out[at + 11] = a5 / 3;
  out[at + 12] = a6 / 4;
  out[at + 13] = a7 / 5;
  out[at + 14] = c[o + 7] * scale;
  out[at + 15] = -a1 / 2;
  out[at + 16] = -a2;
  out[at + 17] = a3;
  out[at + 18] = a4;
  out[at + 19] = a5 / 2;
  out[at + 20] = a6 / 3;
  out[at + 21] = a7 / 4;
  out[at + 22] = c[o + 8] * scale + entropyOffset;
}

/**
 * The property polynomial of 18 extensive coefficients Σ nᵢ Ru [a1…a7 b1 b2 (low), … (high)]
 * (see extensiveCoefficients), multiplied by `scale` (1 / mass for specific properties), with
 * `entropyOffset` added to s° (the entropy of mixing, in the same units).
 */
export function polynomialFromCoefficients(
  coefficients: ArrayLike<number>,
  scale: number,
  entropyOffset: number,
): Polynomial {
  const out = newPolynomial();
  fillPolynomial(out, coefficients, scale, entropyOffset);
  return out;
}

/** polynomialFromCoefficients into an existing polynomial, in place. */
export function fillPolynomial(
  out: Polynomial,
  coefficients: ArrayLike<number>,
  scale: number,
  entropyOffset: number,
): void {
  fillRange(out, 0, coefficients, 0, scale, entropyOffset);
  fillRange(out, RANGE, coefficients, HIGH_COEFFICIENTS, scale, entropyOffset);
}

/**
 * The polynomial of a constant cp (kJ/(kg·K)) with h = 0 and s° = 0 at `referenceK`:
 * a3 = cp, b1 = −cp T_ref, b2 = −cp ln T_ref, every other coefficient zero, both ranges alike.
 */
export function constantCpPolynomial(cp: number, referenceK: number): Polynomial {
  const c: number[] = new Array(2 * COEFFICIENTS_PER_RANGE).fill(0);
  for (const o of [0, COEFFICIENTS_PER_RANGE]) {
    c[o + 2] = cp;
    c[o + 7] = -cp * referenceK;
    c[o + 8] = -cp * Math.log(referenceK);
  }
  return polynomialFromCoefficients(c, 1, 0);
}

/** out = base + amount × change, number by number (the gas of base plus `amount` of change). */
export function blendPolynomials(out: Polynomial, base: Polynomial, change: Polynomial, amount: number): void {
  // Two numbers a turn: the loop's own checks cost as much as the arithmetic (a third less time).
  for (let k = 0; k < POLYNOMIAL_LENGTH; k += 2) {
    out[k] = base[k] + amount * change[k];
    out[k + 1] = base[k + 1] + amount * change[k + 1];
  }
}

/** cp(T) from a property polynomial. 200–6000 K. */
export function cpOf(p: Polynomial, temperatureK: number): number {
  const o = temperatureK < BREAK_K ? 0 : RANGE;
  const t = temperatureK;
  const u = 1 / t;
  return (p[o] * u + p[o + 1]) * u + p[o + 2] + t * (p[o + 3] + t * (p[o + 4] + t * (p[o + 5] + t * p[o + 6])));
}

/** h(T) from a property polynomial. 200–6000 K. */
export function enthalpyOf(p: Polynomial, temperatureK: number): number {
  const o = temperatureK < BREAK_K ? 0 : RANGE;
  // a2 is zero for the whole range of some gases (constant-cp air, argon below 1000 K):
  // skipping the logarithm there saves its cost, the dearest part of the evaluation.
  const a2 = p[o + 8];
  return enthalpyWithLog(p, temperatureK, a2 === 0 ? 0 : Math.log(temperatureK));
}

/** h(T) given ln T as well, for callers that need h and s° at one temperature (one logarithm for both). */
export function enthalpyWithLog(p: Polynomial, temperatureK: number, lnT: number): number {
  const o = temperatureK < BREAK_K ? 0 : RANGE;
  const t = temperatureK;
  return (
    p[o + 7] / t +
    p[o + 8] * lnT +
    t * (p[o + 9] + t * (p[o + 10] + t * (p[o + 11] + t * (p[o + 12] + t * p[o + 13])))) +
    p[o + 14]
  );
}

/** s°(T) from a property polynomial (at 100 kPa). 200–6000 K. */
export function standardEntropyOf(p: Polynomial, temperatureK: number): number {
  return standardEntropyWithLog(p, temperatureK, Math.log(temperatureK));
}

/** s°(T) given ln T as well (see enthalpyWithLog). */
export function standardEntropyWithLog(p: Polynomial, temperatureK: number, lnT: number): number {
  const o = temperatureK < BREAK_K ? 0 : RANGE;
  const t = temperatureK;
  const u = 1 / t;
  return (
    (p[o + 15] * u + p[o + 16]) * u +
    p[o + 17] * lnT +
    t * (p[o + 18] + t * (p[o + 19] + t * (p[o + 20] + t * p[o + 21]))) +
    p[o + 22]
  );
}

/**
 * T(h) by safeguarded Halley steps (Newton's method corrected for the curvature; dh/dT =
 * cp > 0), kept inside a bracket that shrinks with every step, falling back to bisection if a
 * step leaves it; to 1e-12 relative. `guessK` seeds it: from a guess within a few kelvin two
 * evaluations are enough, from within 1e-5 T (about a hundredth of a kelvin) one (see invert).
 */
export function temperatureFromEnthalpyOf(p: Polynomial, enthalpy: number, guessK: number): number {
  return invert(p, enthalpy, guessK, false);
}

/** T(s°) by the same safeguarded iteration (ds°/dT = cp / T > 0); to 1e-12 relative. */
export function temperatureFromStandardEntropyOf(p: Polynomial, standardEntropy: number, guessK: number): number {
  return invert(p, standardEntropy, guessK, true);
}

// One loop for both inversions; written out rather than through a generic solver with
// closures because it runs a dozen times per cycle evaluation. Value, slope and curvature
// come from one pass over the coefficients, sharing 1/T and ln T (the logarithm is the
// dearest part; the curvature costs a few multiplications and saves whole steps).
function invert(p: Polynomial, target: number, guessK: number, entropy: boolean): number {
  let lo = INVERSION_MIN_K;
  let hi = INVERSION_MAX_K;
  let t = guessK > lo && guessK < hi ? guessK : 800;
  for (let iteration = 0; iteration < 200; iteration++) {
    const o = t < BREAK_K ? 0 : RANGE;
    const u = 1 / t;
    const lnT = Math.log(t);
    const cp = (p[o] * u + p[o + 1]) * u + p[o + 2] + t * (p[o + 3] + t * (p[o + 4] + t * (p[o + 5] + t * p[o + 6])));
    const cpSlope =
      -(2 * p[o] * u + p[o + 1]) * u * u + p[o + 3] + t * (2 * p[o + 4] + t * (3 * p[o + 5] + t * 4 * p[o + 6]));
    let value: number;
    let slope: number;
    let curvature: number;
    if (entropy) {
      value =
        (p[o + 15] * u + p[o + 16]) * u +
        p[o + 17] * lnT +
        t * (p[o + 18] + t * (p[o + 19] + t * (p[o + 20] + t * p[o + 21]))) +
        p[o + 22];
      slope = cp * u;
      curvature = (cpSlope - cp * u) * u;
    } else {
      value =
        p[o + 7] * u +
        p[o + 8] * lnT +
        t * (p[o + 9] + t * (p[o + 10] + t * (p[o + 11] + t * (p[o + 12] + t * p[o + 13])))) +
        p[o + 14];
      slope = cp;
      curvature = cpSlope;
    }
    const residual = value - target;
    if (residual > 0) hi = t;
    else lo = t;
    if (residual === 0) return t;
    // Halley's step (Newton's, corrected for the curvature) converges cubically: after a
    // step δ the error is about C δ³, with C below 5e-6 /K² for h and s° of these gases over
    // 200–6000 K (measured over the species and typical mixtures). A step under 1e-5 T thus
    // leaves an error below 5e-21 T³ ≤ 2e-13 T (T ≤ 6000 K), so it is accepted without one
    // more evaluation to confirm it (unless it crosses the 1000 K break, where the other
    // range's polynomial takes over).
    // Far from the root, where the correction would be large, it takes a plain Newton step.
    // (Halley's step −f f′ / (f′² − f f″ / 2), written with one division.)
    const squared = slope * slope;
    const denominator = squared - 0.5 * residual * curvature;
    const halley = denominator > 0.5 * squared && denominator < 2 * squared;
    let next = halley ? t - (residual * slope) / denominator : t - residual / slope;
    if (
      halley &&
      Math.abs(next - t) <= ACCEPT_STEP_RELATIVE * t &&
      next > lo &&
      next < hi &&
      next < BREAK_K === t < BREAK_K
    )
      return next;
    if (Math.abs(next - t) <= INVERSION_RELATIVE_TOLERANCE * t) return next;
    if (!(next > lo && next < hi) || !(slope > 0)) next = 0.5 * (lo + hi);
    if (hi - lo <= INVERSION_RELATIVE_TOLERANCE * t) return 0.5 * (lo + hi);
    t = next;
  }
  return t;
}
