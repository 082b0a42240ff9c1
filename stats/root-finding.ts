/**
 * Brent's method for a root of a continuous function on a bracketing interval
 * (Brent 1973, "Algorithms for Minimization without Derivatives", chapter 4, procedure zero):
 * inverse quadratic interpolation and secant steps, falling back to bisection, so it converges at
 * least as surely as bisection and usually superlinearly.
 */

export interface RootOptions {
  /** Absolute tolerance on the root; default relativeTolerance × (1 + |root|). */
  tolerance?: number;
  /** Used when no absolute tolerance is given: tolerance = relativeTolerance × (1 + |root|); default 1e−12. */
  relativeTolerance?: number;
  maxIterations?: number;
  /** f(lower) and f(upper) when the caller already has them (saves two evaluations). */
  knownValues?: readonly [number, number];
}

/** Root of `f` in [lower, upper]; f(lower) and f(upper) must differ in sign (or one be zero). */
export function brentRoot(f: (x: number) => number, lower: number, upper: number, options: RootOptions = {}): number {
  const maxIterations = options.maxIterations ?? 200;
  let a = lower;
  let b = upper;
  let fa = options.knownValues ? options.knownValues[0] : f(a);
  let fb = options.knownValues ? options.knownValues[1] : f(b);
  if (fa === 0) return a;
  if (fb === 0) return b;
  if (!(fa * fb < 0)) {
    throw new RangeError(`brentRoot: f(${lower}) = ${fa} and f(${upper}) = ${fb} do not bracket a root`);
  }
  let c = a;
  let fc = fa;
  let d = b - a;
  let e = d;
  for (let iteration = 0; iteration < maxIterations; iteration++) {
    if ((fb > 0 && fc > 0) || (fb < 0 && fc < 0)) {
      c = a;
      fc = fa;
      d = b - a;
      e = d;
    }
    if (Math.abs(fc) < Math.abs(fb)) {
      a = b;
      b = c;
      c = a;
      fa = fb;
      fb = fc;
      fc = fa;
    }
    const tolerance = options.tolerance ?? (options.relativeTolerance ?? 1e-12) * (1 + Math.abs(b));
    const half = 0.5 * (c - b);
    if (Math.abs(half) <= tolerance || fb === 0) return b;
    if (Math.abs(e) >= tolerance && Math.abs(fa) > Math.abs(fb)) {
      let p: number;
      let q: number;
      const s = fb / fa;
      if (a === c) {
        p = 2 * half * s;
        q = 1 - s;
      } else {
        const qa = fa / fc;
        const r = fb / fc;
        p = s * (2 * half * qa * (qa - r) - (b - a) * (r - 1));
        q = (qa - 1) * (r - 1) * (s - 1);
      }
      if (p > 0) q = -q;
      else p = -p;
      if (2 * p < Math.min(3 * half * q - Math.abs(tolerance * q), Math.abs(e * q))) {
        e = d;
        d = p / q;
      } else {
        d = half;
        e = d;
      }
    } else {
      d = half;
      e = d;
    }
    a = b;
    fa = fb;
    b += Math.abs(d) > tolerance ? d : half > 0 ? tolerance : -tolerance;
    fb = f(b);
  }
  throw new RangeError(`brentRoot: no convergence in ${maxIterations} iterations between ${lower} and ${upper}`);
}

/**
 * Widen [start, start + step] geometrically towards larger x (or smaller, for a negative step)
 * until `f` changes sign, then return the root by Brent's method. Used where a good first guess
 * exists but no guaranteed bracket. With `lowest`/`highest`, the search stops at that bound and
 * returns −Infinity/+Infinity when the root lies beyond it; otherwise it gives up (RangeError)
 * more than `limit` from the start.
 */
export function rootFromGuess(
  f: (x: number) => number,
  start: number,
  step: number,
  options: Omit<RootOptions, 'knownValues'> & { limit?: number; valueAtStart?: number; lowest?: number; highest?: number } = {},
): number {
  const limit = options.limit ?? 1e6;
  const lowest = options.lowest ?? -Infinity;
  const highest = options.highest ?? Infinity;
  const fStart = options.valueAtStart ?? f(start);
  if (fStart === 0) return start;
  let previous = start;
  let fPrevious = fStart;
  let width = step;
  for (let expansion = 0; expansion < 200; expansion++) {
    const next = Math.min(highest, Math.max(lowest, previous + width));
    if (next === previous) return width > 0 ? Infinity : -Infinity;
    if (Math.abs(next - start) > limit) break;
    const fNext = f(next);
    if (fNext === 0) return next;
    if (fNext * fStart < 0) {
      const rootOptions = { tolerance: options.tolerance, relativeTolerance: options.relativeTolerance, maxIterations: options.maxIterations };
      return next > previous
        ? brentRoot(f, previous, next, { ...rootOptions, knownValues: [fPrevious, fNext] })
        : brentRoot(f, next, previous, { ...rootOptions, knownValues: [fNext, fPrevious] });
    }
    previous = next;
    fPrevious = fNext;
    width *= 2;
  }
  throw new RangeError(`rootFromGuess: no sign change found from ${start} in steps of ${step}`);
}
