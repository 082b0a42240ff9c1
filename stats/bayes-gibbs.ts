import jStat from 'jstat';
import { createRandom, type RandomSource } from './random';
import type { ShiftValue } from './types';
import { inverseStandardNormal, TruncationPlan } from './bayes-truncated-normal';
import { resolveBayesPrior, type BayesPriorChoice, type ResolvedBayesPrior } from './bayes-priors';

/** Settings of the Markov chain Monte Carlo run. */
export interface McmcSettings {
  /** Number of chains, each from its own over-dispersed start and its own seeded stream. Default 4. */
  chains?: number;
  /** Iterations discarded at the start of each chain. Default 5,000. */
  burnIn?: number;
  /** Iterations kept per chain after burn-in. Default 25,000. */
  kept?: number;
  /** Seed of the first chain; chain c uses a seed derived from it. Default DEFAULT_BAYES_SEED. */
  seed?: number;
}

export const DEFAULT_BAYES_SEED = 20_240_601;
export const DEFAULT_MCMC_SETTINGS = Object.freeze({ chains: 4, burnIn: 5_000, kept: 25_000, seed: DEFAULT_BAYES_SEED });

/** Posterior draws of μ and σ (log scale), chain after chain: chain c occupies [c·kept, (c + 1)·kept). */
export interface PosteriorDraws {
  mu: Float64Array;
  sigma: Float64Array;
  chains: number;
  kept: number;
  burnIn: number;
  seed: number;
  prior: ResolvedBayesPrior;
  /** Share of accepted σ proposals in the Metropolis step (informative GSD prior); null when σ is drawn exactly. */
  sigmaAcceptanceRate: number | null;
  n: number;
  nDetected: number;
  nLeftCensored: number;
  nIntervalCensored: number;
}

/** Seed of chain `chain` derived from the run's seed (a golden-ratio step keeps the streams apart). */
export function chainSeed(seed: number, chain: number): number {
  return ((seed - 1 + chain * 2_654_435_761) % 4_294_967_295) + 1;
}

interface PreparedData {
  n: number;
  centre: number;
  detectedSum: number;
  detectedSumSquares: number;
  nDetected: number;
  nLeftCensored: number;
  nIntervalCensored: number;
  /** Distinct censoring intervals (centred logs) and how many results share each. */
  groupLower: Float64Array;
  groupUpper: Float64Array;
  groupCount: Int32Array;
  /** Starting estimate for the chains: mean and SD of logs with censored results set inside their intervals. */
  startMean: number;
  startSd: number;
}

function prepareData(values: readonly ShiftValue[]): PreparedData {
  const caller = 'sampleLognormalPosterior';
  if (!Array.isArray(values) || values.length < 2) {
    throw new RangeError(`${caller}: needs at least 2 results, got ${Array.isArray(values) ? values.length : 'no list'}`);
  }
  const detected: number[] = [];
  const censored: { lower: number; upper: number }[] = [];
  values.forEach((item, index) => {
    const where = `result ${index + 1}`;
    if (!item || typeof item.value !== 'number' || !Number.isFinite(item.value) || !(item.value > 0)) {
      throw new RangeError(`${caller}: ${where}: value must be a finite number > 0, got ${item?.value}`);
    }
    if (item.lower !== undefined && item.lower !== 0) {
      if (!Number.isFinite(item.lower) || !(item.lower > 0) || !(item.lower < item.value)) {
        throw new RangeError(`${caller}: ${where}: interval lower bound must be > 0 and below the value ${item.value}, got ${item.lower}`);
      }
      censored.push({ lower: Math.log(item.lower), upper: Math.log(item.value) });
    } else if (item.nonDetect) {
      censored.push({ lower: -Infinity, upper: Math.log(item.value) });
    } else {
      detected.push(Math.log(item.value));
    }
  });
  if (detected.length < 2 || detected.every((y) => y === detected[0])) {
    throw new RangeError(
      `${caller}: needs at least 2 detected results with different values (got ${detected.length} detected); with fewer the reference posterior piles up at the smallest SD`,
    );
  }
  const centre = detected.reduce((a, b) => a + b, 0) / detected.length;
  let detectedSum = 0;
  let detectedSumSquares = 0;
  for (const y of detected) {
    detectedSum += y - centre;
    detectedSumSquares += (y - centre) * (y - centre);
  }
  censored.sort((a, b) => a.lower - b.lower || a.upper - b.upper);
  const lowers: number[] = [];
  const uppers: number[] = [];
  const counts: number[] = [];
  for (const c of censored) {
    const last = lowers.length - 1;
    if (last >= 0 && lowers[last] === c.lower - centre && uppers[last] === c.upper - centre) counts[last] += 1;
    else {
      lowers.push(c.lower - centre);
      uppers.push(c.upper - centre);
      counts.push(1);
    }
  }
  // Start estimate: left-censored at limit/√2, interval-censored at the geometric midpoint (common practice).
  const filled = [...detected, ...censored.map((c) => (c.lower === -Infinity ? c.upper - 0.5 * Math.LN2 : (c.lower + c.upper) / 2))];
  const startMean = filled.reduce((a, b) => a + b, 0) / filled.length;
  const startSd = Math.sqrt(filled.reduce((a, y) => a + (y - startMean) ** 2, 0) / (filled.length - 1));
  return {
    n: values.length,
    centre,
    detectedSum,
    detectedSumSquares,
    nDetected: detected.length,
    nLeftCensored: censored.filter((c) => c.lower === -Infinity).length,
    nIntervalCensored: censored.filter((c) => c.lower !== -Infinity).length,
    groupLower: Float64Array.from(lowers),
    groupUpper: Float64Array.from(uppers),
    groupCount: Int32Array.from(counts),
    startMean,
    startSd: Math.max(startSd, 0.05),
  };
}

function checkSettings(settings: McmcSettings): Required<McmcSettings> {
  const merged = { ...DEFAULT_MCMC_SETTINGS, ...settings };
  const { chains, burnIn, kept, seed } = merged;
  const caller = 'sampleLognormalPosterior';
  if (!Number.isInteger(chains) || chains < 1 || chains > 64) throw new RangeError(`${caller}: chains must be an integer from 1 to 64, got ${chains}`);
  if (!Number.isInteger(burnIn) || burnIn < 0) throw new RangeError(`${caller}: burnIn must be an integer ≥ 0, got ${burnIn}`);
  if (!Number.isInteger(kept) || kept < 4) throw new RangeError(`${caller}: kept must be an integer ≥ 4, got ${kept}`);
  if (!Number.isInteger(seed) || seed < 1 || seed > 4_294_967_295) throw new RangeError(`${caller}: seed must be an integer from 1 to 4294967295, got ${seed}`);
  return { chains, burnIn, kept, seed };
}

/**
 * Posterior draws of the log-scale mean μ and SD σ of a lognormal exposure group from detected,
 * left-censored (non-detect, 0 < x < limit) and interval-censored (lower ≤ x ≤ value) results.
 *
 * Method: Gibbs sampling with data augmentation (Tanner & Wong 1987, "The calculation of posterior
 * distributions by data augmentation", JASA 82:528–540): each iteration (1) imputes every censored log
 * from the normal N(μ, σ²) truncated to its censoring interval (see truncatedStandardNormal), then
 * (2) draws (μ, σ) in one block from the conjugate posterior of the completed data — σ² from a scaled
 * inverse-χ² and μ | σ² from a normal (Gelman et al. 2013, "Bayesian Data Analysis", 3rd ed., sections
 * 3.2–3.3) — truncated to the prior's bounds by exact inversion when a draw falls outside. With the
 * informative GSD prior, step (2) proposes σ from that block and accepts it by an independence
 * Metropolis–Hastings step (Tierney 1994, "Markov chains for exploring posterior distributions", Annals of
 * Statistics 22:1701–1762) with weight prior(σ)·σ. Several chains start from over-dispersed points
 * (Gelman & Rubin 1992) and run on seeded MT19937 streams, so the same seed gives the same draws.
 * The loop uses typed arrays and allocates nothing.
 */
export function sampleLognormalPosterior(values: readonly ShiftValue[], options: { prior?: BayesPriorChoice; settings?: McmcSettings } = {}): PosteriorDraws {
  const data = prepareData(values);
  const settings = checkSettings(options.settings ?? {});
  const prior = resolveBayesPrior(options.prior);
  const { chains, burnIn, kept, seed } = settings;
  const mu = new Float64Array(chains * kept);
  const sigma = new Float64Array(chains * kept);
  let accepted = 0;
  let proposals = 0;
  for (let chain = 0; chain < chains; chain++) {
    const random = createRandom(chainSeed(seed, chain));
    const result = runChain(data, prior, random, burnIn, kept, mu, sigma, chain * kept);
    accepted += result.accepted;
    proposals += result.proposals;
  }
  return {
    mu,
    sigma,
    chains,
    kept,
    burnIn,
    seed,
    prior,
    sigmaAcceptanceRate: prior.logSigmaNormal ? accepted / proposals : null,
    n: data.n,
    nDetected: data.nDetected,
    nLeftCensored: data.nLeftCensored,
    nIntervalCensored: data.nIntervalCensored,
  };
}

/**
 * Uniforms of a RandomSource taken in blocks of 4,096 (RandomSource.fillUniform32: 32-bit resolution, as (from memory)
 * R's and JAGS's Mersenne-Twister uniforms), so the sampling loop reads a typed array instead of calling
 * through the source's closures for each of its roughly 1.5 million uniforms per group. Speed only: the
 * values are the source's own seeded stream, so runs stay reproducible.
 */
class UniformBlock {
  private readonly values = new Float64Array(4096);
  private index = 4096;
  constructor(private readonly random: RandomSource) {}

  next(): number {
    if (this.index === 4096) this.refill();
    return this.values[this.index++];
  }

  /**
   * χ² with `degrees` ≥ 2 degrees of freedom as 2·Gamma(degrees/2) by Marsaglia & Tsang (2000), "A simple
   * method for generating gamma variables", ACM TOMS 26:363–372 — the method of RandomSource.gamma — fed
   * with block uniforms and normals by inversion (AS 241).
   */
  chiSquare(degrees: number): number {
    const d = degrees / 2 - 1 / 3;
    const c = 1 / Math.sqrt(9 * d);
    for (;;) {
      const x = inverseStandardNormal(this.next());
      let v = 1 + c * x;
      if (v <= 0) continue;
      v = v * v * v;
      const u = this.next();
      if (u < 1 - 0.0331 * x * x * x * x || Math.log(u) < 0.5 * x * x + d * (1 - v + Math.log(v))) return 2 * d * v;
    }
  }

  private refill(): void {
    this.random.fillUniform32(this.values);
    this.index = 0;
  }
}

function clamp(value: number, lower: number, upper: number): number {
  return Math.min(upper, Math.max(lower, value));
}

/** One chain; writes `kept` draws at `offset`. Returns the Metropolis counts. */
function runChain(
  data: PreparedData,
  prior: ResolvedBayesPrior,
  random: RandomSource,
  burnIn: number,
  kept: number,
  muOut: Float64Array,
  sigmaOut: Float64Array,
  offset: number,
): { accepted: number; proposals: number } {
  const { n, centre, groupLower, groupUpper, groupCount } = data;
  const { bounds, kappa0, nu0, nu0s0Squared, logSigmaNormal } = prior;
  const groups = groupCount.length;
  const plan = new TruncationPlan();
  const uniforms = new UniformBlock(random);
  const muLower = bounds.muLower - centre;
  const muUpper = bounds.muUpper - centre;
  const { sigmaLower, sigmaUpper } = bounds;
  const mean0 = prior.mean0 - centre;
  // Shape of the σ² draw in χ² degrees of freedom: ν0 + n, less one when μ is flat (Gelman et al. 2013, eq. 3.6).
  const chiDegrees = nu0 + n - (kappa0 === 0 ? 1 : 0);
  const posteriorKappa = kappa0 + n;
  const muScale = 1 / Math.sqrt(posteriorKappa);

  // Over-dispersed start: μ spread by about √n posterior SDs, σ by a factor e^(±0.7).
  let muCentred = clamp(data.startMean - centre + data.startSd * random.normal(), muLower, muUpper);
  let sd = clamp(data.startSd * Math.exp(0.7 * random.normal()), sigmaLower, sigmaUpper);
  let accepted = 0;
  let proposals = 0;
  const total = burnIn + kept;
  for (let iteration = 0; iteration < total; iteration++) {
    // (1) Data augmentation: impute censored logs from N(μ, σ²) truncated to their intervals.
    let sum = data.detectedSum;
    let sumSquares = data.detectedSumSquares;
    for (let g = 0; g < groups; g++) {
      plan.prepare((groupLower[g] - muCentred) / sd, (groupUpper[g] - muCentred) / sd);
      if (plan.inverts) {
        // The common case, inlined: z = sign·Φ⁻¹(base + U·width).
        const { base, width } = plan;
        const scale = sd * plan.sign;
        for (let j = groupCount[g]; j > 0; j--) {
          const y = muCentred + scale * inverseStandardNormal(base + uniforms.next() * width);
          sum += y;
          sumSquares += y * y;
        }
      } else {
        for (let j = groupCount[g]; j > 0; j--) {
          const y = muCentred + sd * plan.draw(random);
          sum += y;
          sumSquares += y * y;
        }
      }
    }
    // (2) Block draw of (σ, μ) from the conjugate posterior of the completed data.
    const mean = sum / n;
    const withinSquares = Math.max(sumSquares - sum * mean, 0);
    const priorDistance = kappa0 === 0 ? 0 : ((kappa0 * n) / posteriorKappa) * (mean - mean0) * (mean - mean0);
    const scaleSum = nu0s0Squared + withinSquares + priorDistance;
    // σ² = scaleSum/χ²: almost always inside the bounds at once; drawSigmaTruncated handles the rest exactly.
    let proposal = Math.sqrt(scaleSum / (chiDegrees >= 2 ? uniforms.chiSquare(chiDegrees) : random.chiSquare(chiDegrees)));
    if (!(proposal >= sigmaLower && proposal <= sigmaUpper)) proposal = drawSigmaTruncated(random, scaleSum, chiDegrees, sigmaLower, sigmaUpper);
    if (logSigmaNormal) {
      // Independence Metropolis–Hastings: weight w(σ) = prior(σ)·σ ∝ exp(−(ln σ − m)²/(2 s²)).
      proposals++;
      const zNew = (Math.log(proposal) - logSigmaNormal.mean) / logSigmaNormal.sd;
      const zOld = (Math.log(sd) - logSigmaNormal.mean) / logSigmaNormal.sd;
      if (Math.log(random.uniform()) <= 0.5 * (zOld * zOld - zNew * zNew)) {
        sd = proposal;
        accepted++;
      }
    } else {
      sd = proposal;
    }
    const muMean = kappa0 === 0 ? mean : (kappa0 * mean0 + n * mean) / posteriorKappa;
    const muSd = sd * muScale;
    // A standard normal by inversion (AS 241) of a block uniform: exact, and one uniform per draw.
    muCentred = muMean + muSd * inverseStandardNormal(uniforms.next());
    if (muCentred < muLower || muCentred > muUpper) {
      plan.prepare((muLower - muMean) / muSd, (muUpper - muMean) / muSd);
      muCentred = muMean + muSd * plan.draw(random);
    }
    if (iteration >= burnIn) {
      const k = offset + iteration - burnIn;
      muOut[k] = muCentred + centre;
      sigmaOut[k] = sd;
    }
  }
  return { accepted, proposals };
}

/**
 * σ with σ² = scaleSum / χ²(degrees), truncated to [sigmaLower, sigmaUpper], after a first draw fell outside:
 * a few more plain draws, then exact inversion of the truncated gamma distribution (rejection and
 * inversion both give the truncated law exactly).
 */
function drawSigmaTruncated(random: RandomSource, scaleSum: number, degrees: number, sigmaLower: number, sigmaUpper: number): number {
  if (!(scaleSum > 0)) return sigmaLower;
  for (let attempt = 0; attempt < 3; attempt++) {
    const sd = Math.sqrt(scaleSum / random.chiSquare(degrees));
    if (sd >= sigmaLower && sd <= sigmaUpper) return sd;
  }
  // σ ≤ upper ⇔ G ≥ scaleSum/(2 upper²) with G = χ²/2 ~ Gamma(degrees/2).
  const shape = degrees / 2;
  const gLow = scaleSum / (2 * sigmaUpper * sigmaUpper);
  const gHigh = scaleSum / (2 * sigmaLower * sigmaLower);
  const pLow = jStat.lowRegGamma(shape, gLow);
  const pHigh = jStat.lowRegGamma(shape, gHigh);
  const g = jStat.gammapinv(pLow + (pHigh - pLow) * random.uniform(), shape);
  return clamp(Math.sqrt(scaleSum / (2 * g)), sigmaLower, sigmaUpper);
}
