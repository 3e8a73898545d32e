const GOLDEN = 0.3819660112501051; // (3 − √5) / 2

/**
 * Maximises f on [a, b] by Brent's method (golden-section steps with parabolic
 * interpolation; R. P. Brent, Algorithms for Minimization without Derivatives, 1973,
 * ch. 5). f should be unimodal on the interval, as it is once the interval is bracketed
 * by sampled neighbours of the best sample. A non-finite f counts as −∞.
 * Stops when the interval is within `relativeTolerance`·|x| + 1e-12·(b − a).
 * Returns the abscissa and the value there.
 */
export function maximizeBrent(
  f: (x: number) => number,
  a: number,
  b: number,
  relativeTolerance = 1e-9,
  maxIterations = 100,
): { x: number; value: number } {
  const g = (x: number) => {
    const value = f(x);
    return Number.isFinite(value) ? -value : Infinity;
  };
  let lo = Math.min(a, b);
  let hi = Math.max(a, b);
  const absoluteTolerance = 1e-12 * (hi - lo);
  let x = lo + GOLDEN * (hi - lo);
  let w = x;
  let v = x;
  let fx = g(x);
  let fw = fx;
  let fv = fx;
  let d = 0;
  let e = 0;
  for (let iteration = 0; iteration < maxIterations; iteration++) {
    const middle = 0.5 * (lo + hi);
    const tol1 = relativeTolerance * Math.abs(x) + absoluteTolerance;
    const tol2 = 2 * tol1;
    if (Math.abs(x - middle) <= tol2 - 0.5 * (hi - lo)) break;
    let useGolden = true;
    if (Math.abs(e) > tol1) {
      // Parabola through x, w, v.
      let r = (x - w) * (fx - fv);
      let q = (x - v) * (fx - fw);
      let p = (x - v) * q - (x - w) * r;
      q = 2 * (q - r);
      if (q > 0) p = -p;
      else q = -q;
      r = e;
      e = d;
      if (Math.abs(p) < Math.abs(0.5 * q * r) && p > q * (lo - x) && p < q * (hi - x)) {
        d = p / q;
        const u = x + d;
        if (u - lo < tol2 || hi - u < tol2) d = x < middle ? tol1 : -tol1;
        useGolden = false;
      }
    }
    if (useGolden) {
      e = (x < middle ? hi : lo) - x;
      d = GOLDEN * e;
    }
    const u = Math.abs(d) >= tol1 ? x + d : x + (d > 0 ? tol1 : -tol1);
    const fu = g(u);
    if (fu <= fx) {
      if (u < x) hi = x;
      else lo = x;
      v = w;
      fv = fw;
      w = x;
      fw = fx;
      x = u;
      fx = fu;
    } else {
      if (u < x) lo = u;
      else hi = u;
      if (fu <= fw || w === x) {
        v = w;
        fv = fw;
        w = u;
        fw = fu;
      } else if (fu <= fv || v === x || v === w) {
        v = u;
        fv = fu;
      }
    }
  }
  return { x, value: -fx };
}
