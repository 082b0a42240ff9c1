import mt19937 from '@stdlib/random-base-mt19937';

/**
 * A seeded random source for every simulation in Bellwether (bootstrap, MCMC, planner, demo data).
 * Uniforms come from the Mersenne Twister MT19937 (Matsumoto & Nishimura 1998) of
 * @stdlib/random-base-mt19937, whose `normalized()` gives 53-bit uniforms on [0, 1) identical to
 * numpy's legacy `RandomState(seed).random_sample()` for the same seed (seed 42 → 0.3745401188473625).
 * Same seed, same stream: results are reproducible.
 */
export interface RandomSource {
  /** Uniform on the open interval (0, 1). */
  uniform(): number;
  /** Standard normal, by the Marsaglia–Bray polar method (Marsaglia & Bray 1964). */
  normal(): number;
  /** Gamma(shape, scale 1), Marsaglia & Tsang (2000), "A simple method for generating gamma variables". */
  gamma(shape: number): number;
  /** Chi-square with `degreesOfFreedom` degrees of freedom, as 2·Gamma(ν/2). */
  chiSquare(degreesOfFreedom: number): number;
  /** Integer uniform on 0 … n − 1. */
  integer(n: number): number;
  /**
   * Fill `target` with uniforms on (0, 1) of 32-bit resolution, (k + 0.5)/2^32 from one MT19937 output k
   * each: the resolution of R's Mersenne-Twister unif_rand and so of JAGS's base::Mersenne-Twister (from memory), for
   * simulation loops that need millions of uniforms (the Bayesian view's Gibbs sampler); about twice as
   * fast as uniform(), which spends two outputs on 53 bits. Draws from the same stream as the other methods.
   */
  fillUniform32(target: Float64Array): void;
  /** The seed this source started from. */
  readonly seed: number;
}

/** Create a seeded random source. `createRandom(42).uniform()` → 0.3745401188473625 */
export function createRandom(seed: number): RandomSource {
  if (!Number.isInteger(seed) || seed < 1 || seed > 4294967295) {
    throw new RangeError(`createRandom: seed must be an integer from 1 to 4294967295, got ${seed}`);
  }
  const generator = mt19937.factory({ seed });
  const next = generator.normalized;
  let spare: number | undefined;

  const uniform = (): number => {
    let u = next();
    while (u === 0) u = next();
    return u;
  };

  const normal = (): number => {
    if (spare !== undefined) {
      const value = spare;
      spare = undefined;
      return value;
    }
    let u: number;
    let v: number;
    let s: number;
    do {
      u = 2 * next() - 1;
      v = 2 * next() - 1;
      s = u * u + v * v;
    } while (s >= 1 || s === 0);
    const factor = Math.sqrt((-2 * Math.log(s)) / s);
    spare = v * factor;
    return u * factor;
  };

  const gamma = (shape: number): number => {
    if (!(shape > 0) || !Number.isFinite(shape)) {
      throw new RangeError(`gamma: shape must be a positive finite number, got ${shape}`);
    }
    if (shape < 1) {
      // Boost: Gamma(a) = Gamma(a + 1) · U^(1/a) (Marsaglia & Tsang 2000, section 6).
      return gamma(shape + 1) * Math.pow(uniform(), 1 / shape);
    }
    const d = shape - 1 / 3;
    const c = 1 / Math.sqrt(9 * d);
    for (;;) {
      let x: number;
      let v: number;
      do {
        x = normal();
        v = 1 + c * x;
      } while (v <= 0);
      v = v * v * v;
      const u = uniform();
      if (u < 1 - 0.0331 * x * x * x * x) return d * v;
      if (Math.log(u) < 0.5 * x * x + d * (1 - v + Math.log(v))) return d * v;
    }
  };

  return {
    seed,
    uniform,
    normal,
    gamma,
    chiSquare: (degreesOfFreedom: number) => 2 * gamma(degreesOfFreedom / 2),
    integer: (n: number) => Math.floor(next() * n),
    fillUniform32: (target: Float64Array) => {
      for (let i = 0; i < target.length; i++) target[i] = (generator() + 0.5) * 2.3283064365386963e-10;
    },
  };
}
