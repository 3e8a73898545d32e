/**
 * Solves x = F(x) by the secant method on g(x) = F(x) − x, starting from x0 and F(x0).
 * Used where a weak coupling closes a loop (the regenerator's cold outlet sets the fuel
 * burnt, which sets the exhaust composition, which sets the regenerator duty): g is then
 * nearly linear and the secant step converges in two or three evaluations.
 * Stops when |Δx| ≤ relativeTolerance·|x|; returns the last x after `maxIterations`.
 */
export function solveFixedPoint(
  F: (x: number) => number,
  x0: number,
  relativeTolerance = 1e-13,
  maxIterations = 50,
): number {
  let xPrevious = x0;
  let gPrevious = F(x0) - x0;
  let x = x0 + gPrevious;
  if (Math.abs(gPrevious) <= relativeTolerance * Math.abs(x0)) return x;
  for (let i = 0; i < maxIterations; i++) {
    const g = F(x) - x;
    if (Math.abs(g) <= relativeTolerance * Math.abs(x)) return x + g;
    const slope = (g - gPrevious) / (x - xPrevious);
    // A flat or wrong-signed secant means g is not behaving linearly: take a plain fixed-point step.
    const next = slope < 0 || slope > 0 ? x - g / slope : x + g;
    xPrevious = x;
    gPrevious = g;
    x = Number.isFinite(next) ? next : x + g;
  }
  return x;
}
