/**
 * Convergence diagnostics for the chains of the Bayesian view.
 *
 * Split R-hat: Gelman, Carlin, Stern, Dunson, Vehtari & Rubin (2013), "Bayesian Data Analysis", 3rd ed.,
 * section 11.4, eqs. 11.2–11.4: each chain is cut in half, W is the mean within-half variance, B/n the
 * variance of the half means, var⁺ = (n − 1)/n·W + B/n and R̂ = √(var⁺/W).
 * Effective sample size: the same book, section 11.5, eqs. 11.7–11.8, in the multi-chain form of
 * Vehtari, Gelman, Simpson, Carpenter & Bürkner (2021), "Rank-normalization, folding, and localization:
 * an improved R̂ for assessing convergence of MCMC", Bayesian Analysis 16(2):667–718, section 3.2
 * (ρ̂_t = 1 − (W − mean of chain autocovariances at lag t)/var⁺ over split chains, summed with Geyer's
 * (1992) initial monotone sequence). Deviation, for speed: the rank normalization and folding of Vehtari
 * et al. are not applied (they need a full sort of every parameter's draws); the classic split R-hat
 * is what is reported, with their thresholds.
 *
 * Thresholds: Vehtari et al. (2021, section 4) recommend R̂ < 1.01 and, as a minimum, an ESS above 400
 * (100 per chain); Bellwether warns below 1,000 because the 2.5 % and 97.5 % points it reports need
 * more draws to be stable than the posterior median does (common practice).
 */

export const RHAT_WARNING_THRESHOLD = 1.01;
export const ESS_WARNING_THRESHOLD = 1_000;

function checkLayout(caller: string, draws: Float64Array, chains: number): number {
  if (!Number.isInteger(chains) || chains < 1 || draws.length % chains !== 0) {
    throw new RangeError(`${caller}: ${draws.length} draws cannot be split into ${chains} equal chains`);
  }
  const perChain = draws.length / chains;
  if (perChain < 4) throw new RangeError(`${caller}: needs at least 4 draws per chain, got ${perChain}`);
  return perChain;
}

interface SplitMoments {
  halves: number;
  length: number;
  means: Float64Array;
  variances: Float64Array;
  within: number;
  varPlus: number;
}

/** Means and variances of the 2·chains half-chains (the first draw of an odd-length chain is dropped). */
function splitMoments(draws: Float64Array, chains: number, perChain: number): SplitMoments {
  const length = Math.floor(perChain / 2);
  const halves = 2 * chains;
  const means = new Float64Array(halves);
  const variances = new Float64Array(halves);
  for (let h = 0; h < halves; h++) {
    const start = Math.floor(h / 2) * perChain + (perChain - 2 * length) + (h % 2) * length;
    let sum = 0;
    for (let i = 0; i < length; i++) sum += draws[start + i];
    const mean = sum / length;
    let squares = 0;
    for (let i = 0; i < length; i++) {
      const d = draws[start + i] - mean;
      squares += d * d;
    }
    means[h] = mean;
    variances[h] = squares / (length - 1);
  }
  let within = 0;
  let grand = 0;
  for (let h = 0; h < halves; h++) {
    within += variances[h];
    grand += means[h];
  }
  within /= halves;
  grand /= halves;
  let between = 0;
  for (let h = 0; h < halves; h++) between += (means[h] - grand) ** 2;
  between = (length * between) / (halves - 1);
  const varPlus = ((length - 1) / length) * within + between / length;
  return { halves, length, means, variances, within, varPlus };
}

/** Split R̂ (Gelman et al. 2013, section 11.4). 1 for draws that are all equal. */
export function splitRHat(draws: Float64Array, chains: number): number {
  const perChain = checkLayout('splitRHat', draws, chains);
  const { within, varPlus } = splitMoments(draws, chains, perChain);
  if (within === 0) return varPlus === 0 ? 1 : Infinity;
  return Math.sqrt(varPlus / within);
}

/**
 * Effective sample size of the pooled draws (Gelman et al. 2013 section 11.5; Vehtari et al. 2021
 * section 3.2, Geyer's initial monotone sequence). Autocovariances are computed lag by lag and the sum
 * stops as soon as a pair sum turns negative, so well-mixing chains cost only a few passes.
 */
export function effectiveSampleSize(draws: Float64Array, chains: number): number {
  const perChain = checkLayout('effectiveSampleSize', draws, chains);
  const { halves, length, means, within, varPlus } = splitMoments(draws, chains, perChain);
  const total = halves * length;
  if (varPlus === 0 || within === 0) return total;
  const autocorrelation = (lag: number): number => {
    let meanAutocovariance = 0;
    for (let h = 0; h < halves; h++) {
      const start = Math.floor(h / 2) * perChain + (perChain - 2 * length) + (h % 2) * length;
      const mean = means[h];
      let sum = 0;
      for (let i = 0; i + lag < length; i++) sum += (draws[start + i] - mean) * (draws[start + i + lag] - mean);
      meanAutocovariance += sum / length;
    }
    meanAutocovariance /= halves;
    // Chain variances with divisor n − 1, as in W; the lag-0 term then gives ρ̂_0 ≈ 1.
    return 1 - (within - meanAutocovariance) / varPlus;
  };
  // Geyer (1992): P_k = ρ̂_{2k} + ρ̂_{2k+1}, summed while positive and made monotone non-increasing.
  let tau = 0;
  let previousPair = Infinity;
  const maxLag = length - 2;
  for (let k = 0; 2 * k + 1 <= maxLag; k++) {
    let pair = (k === 0 ? 1 : autocorrelation(2 * k)) + autocorrelation(2 * k + 1);
    if (!(pair > 0)) break;
    pair = Math.min(pair, previousPair);
    previousPair = pair;
    tau += pair;
  }
  tau = 2 * tau - 1;
  // A negative lag-1 correlation can make τ < 1; Stan caps the ESS at total·log10(total) (Vehtari et al. 2021, footnote).
  const ess = total / Math.max(tau, 1 / Math.log10(total));
  return ess;
}

/** The plain-language warnings the Bayesian view attaches when a diagnostic is poor. */
export function convergenceWarnings(rHat: Record<string, number>, ess: Record<string, number>): string[] {
  const warnings: string[] = [];
  for (const [name, value] of Object.entries(rHat)) {
    if (!(value <= RHAT_WARNING_THRESHOLD)) {
      warnings.push(`R-hat of ${name} is ${value.toFixed(3)} (above ${RHAT_WARNING_THRESHOLD}): the chains disagree; run longer or check the data`);
    }
  }
  for (const [name, value] of Object.entries(ess)) {
    if (!(value >= ESS_WARNING_THRESHOLD)) {
      warnings.push(`effective sample size of ${name} is ${Math.round(value)} (below ${ESS_WARNING_THRESHOLD}): credible limits are imprecise; run longer`);
    }
  }
  return warnings;
}
