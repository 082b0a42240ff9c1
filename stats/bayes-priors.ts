/**
 * Priors of the Bayesian view for the log-scale mean μ and log-scale SD σ of a lognormal exposure group.
 *
 * Every prior is expressed in one conjugate normal–inverse-χ² family, optionally with an extra
 * lognormal factor on σ, and always truncated to the same wide box of μ and σ:
 *   μ | σ² ~ N(m0, σ²/κ0) (flat in μ when κ0 = 0),  σ² ~ scaled-inv-χ²(ν0, s0²) (∝ 1/σ² when ν0 = 0),
 * which is the family of Gelman, Carlin, Stern, Dunson, Vehtari & Rubin (2013), "Bayesian Data
 * Analysis", 3rd ed., section 3.3 (eqs. 3.6–3.8). Keeping one family lets the Gibbs sampler draw
 * (μ, σ) in one block given the completed data.
 */

/** The documented bounds of every prior (log scale of the measurement unit). */
export interface BayesBounds {
  /** Lower and upper bound of μ, the mean of ln(value). */
  muLower: number;
  muUpper: number;
  /** Lower and upper bound of σ, the SD of ln(value); GSD = exp(σ). */
  sigmaLower: number;
  sigmaUpper: number;
}

/**
 * Default bounds: μ in [−30, 30] (a GM from about 1e-13 to 1e13 in any unit) and σ in [0.001, 10]
 * (GSD from 1.001 to about 22,000). They are far outside any real exposure group, so the prior is
 * effectively improper on real data (common practice: "wide" bounds that only make the prior proper),
 * and they are the same in the JAGS fixtures.
 */
export const DEFAULT_BAYES_BOUNDS: Readonly<BayesBounds> = Object.freeze({
  muLower: -30,
  muUpper: 30,
  sigmaLower: 0.001,
  sigmaUpper: 10,
});

/** Moments of an earlier posterior (μ and ln σ), as every Bayesian view records them, for prior (c). */
export interface PosteriorMoments {
  muMean: number;
  muSd: number;
  logSigmaMean: number;
  logSigmaSd: number;
}

/** The prior a caller asks for. */
export type BayesPriorChoice =
  | { kind: 'reference'; bounds?: BayesBounds }
  | { kind: 'informative-gsd'; medianGsd?: number; logSigmaSd?: number; bounds?: BayesBounds }
  | { kind: 'past-data'; gm: number; gsd: number; equivalentSamples: number; bounds?: BayesBounds }
  | { kind: 'previous-posterior'; moments: PosteriorMoments; bounds?: BayesBounds };

/** What a result stores about the prior it used: name, parameters and source. */
export interface BayesPriorRecord {
  name: 'reference' | 'informative-gsd' | 'past-data' | 'previous-posterior';
  parameters: Record<string, number>;
  description: string;
}

/** The prior in the form the sampler uses. */
export interface ResolvedBayesPrior {
  record: BayesPriorRecord;
  bounds: BayesBounds;
  /** Conjugate part: κ0 = 0 means flat in μ; ν0 = 0 with s0² = 0 means p(σ²) ∝ 1/σ². */
  kappa0: number;
  mean0: number;
  nu0: number;
  nu0s0Squared: number;
  /** Extra lognormal factor on σ: ln σ ~ N(mean, sd²); null when absent. */
  logSigmaNormal: { mean: number; sd: number } | null;
}

/**
 * Default informative GSD prior: ln σ ~ N(ln(ln 2.5), 0.5²), i.e. a median GSD of 2.5 with 90 % of the
 * prior mass between GSD 1.6 and 7.8. It stands for the spread of GSDs of exposure groups reported by
 * Kromhout, Symanski & Rappaport (1993), "A comprehensive evaluation of within- and between-worker
 * components of occupational exposure to chemical agents", Annals of Occupational Hygiene 37(3):253–270
 * (165 groups; most total GSDs between about 1.5 and 8, a median near 2.5). These figures are *from
 * memory*: verify them against the paper before relying on the default, or pass your own.
 */
export const DEFAULT_GSD_PRIOR = Object.freeze({ medianGsd: 2.5, logSigmaSd: 0.5 });

function checkBounds(caller: string, bounds: BayesBounds): BayesBounds {
  const { muLower, muUpper, sigmaLower, sigmaUpper } = bounds;
  if (![muLower, muUpper, sigmaLower, sigmaUpper].every(Number.isFinite) || !(muLower < muUpper) || !(sigmaLower > 0 && sigmaLower < sigmaUpper)) {
    throw new RangeError(`${caller}: bounds need finite muLower < muUpper and 0 < sigmaLower < sigmaUpper, got ${JSON.stringify(bounds)}`);
  }
  return { muLower, muUpper, sigmaLower, sigmaUpper };
}

/**
 * Turn a prior choice into the sampler's form, with the record the result stores.
 * (a) reference: p(μ, σ) ∝ 1/σ on the box, uniform in μ and in ln σ — the right-Haar prior of the
 *     location–scale family (Datta & Mukerjee 2004, "Probability Matching Priors", section 2.5), whose
 *     posterior quantiles of μ + zσ are exact frequentist tolerance limits.
 * (b) informative-gsd: uniform μ, ln σ ~ N(ln(ln medianGsd), logSigmaSd²) (see DEFAULT_GSD_PRIOR).
 * (c) past-data: a GM and GSD worth `equivalentSamples` results: exactly the reference posterior of
 *     that many uncensored results with that GM and GSD (κ0 = n0, ν0 = n0 − 1, m0 = ln GM, s0 = ln GSD;
 *     Gelman et al. 2013 section 3.3). previous-posterior: an earlier posterior's moments matched to
 *     the same family (ν0 from the variance of ln σ through the trigamma function, s0 from its mean
 *     through the digamma function, κ0 from the variance of μ).
 */
export function resolveBayesPrior(choice: BayesPriorChoice = { kind: 'reference' }): ResolvedBayesPrior {
  const caller = 'resolveBayesPrior';
  const bounds = checkBounds(caller, choice.bounds ?? DEFAULT_BAYES_BOUNDS);
  const boundParameters = { ...bounds };
  switch (choice.kind) {
    case 'reference':
      return {
        record: {
          name: 'reference',
          parameters: boundParameters,
          description: 'uniform on the log-scale mean and on the log of the log-scale SD within the bounds (right-Haar prior)',
        },
        bounds,
        kappa0: 0,
        mean0: 0,
        nu0: 0,
        nu0s0Squared: 0,
        logSigmaNormal: null,
      };
    case 'informative-gsd': {
      const medianGsd = choice.medianGsd ?? DEFAULT_GSD_PRIOR.medianGsd;
      const logSigmaSd = choice.logSigmaSd ?? DEFAULT_GSD_PRIOR.logSigmaSd;
      if (!(medianGsd > 1) || !Number.isFinite(medianGsd) || !(logSigmaSd > 0) || !Number.isFinite(logSigmaSd)) {
        throw new RangeError(`${caller}: informative-gsd needs medianGsd > 1 and logSigmaSd > 0, got ${medianGsd} and ${logSigmaSd}`);
      }
      return {
        record: {
          name: 'informative-gsd',
          parameters: { medianGsd, logSigmaSd, ...boundParameters },
          description:
            'uniform on the log-scale mean; ln σ normal around ln(ln medianGsd) (spread of group GSDs after Kromhout, Symanski & Rappaport 1993, figures from memory)',
        },
        bounds,
        kappa0: 0,
        mean0: 0,
        nu0: 0,
        nu0s0Squared: 0,
        logSigmaNormal: { mean: Math.log(Math.log(medianGsd)), sd: logSigmaSd },
      };
    }
    case 'past-data': {
      const { gm, gsd, equivalentSamples } = choice;
      if (!(gm > 0) || !Number.isFinite(gm) || !(gsd > 1) || !Number.isFinite(gsd) || !(equivalentSamples > 1) || !Number.isFinite(equivalentSamples)) {
        throw new RangeError(`${caller}: past-data needs gm > 0, gsd > 1 and equivalentSamples > 1, got ${gm}, ${gsd}, ${equivalentSamples}`);
      }
      const s0 = Math.log(gsd);
      return {
        record: {
          name: 'past-data',
          parameters: { gm, gsd, equivalentSamples, ...boundParameters },
          description: `past data: GM ${gm} and GSD ${gsd} weighted as ${equivalentSamples} uncensored results`,
        },
        bounds,
        kappa0: equivalentSamples,
        mean0: Math.log(gm),
        nu0: equivalentSamples - 1,
        nu0s0Squared: (equivalentSamples - 1) * s0 * s0,
        logSigmaNormal: null,
      };
    }
    case 'previous-posterior': {
      const { muMean, muSd, logSigmaMean, logSigmaSd } = choice.moments;
      if (![muMean, muSd, logSigmaMean, logSigmaSd].every(Number.isFinite) || !(muSd > 0) || !(logSigmaSd > 0)) {
        throw new RangeError(`${caller}: previous-posterior needs finite moments with muSd > 0 and logSigmaSd > 0, got ${JSON.stringify(choice.moments)}`);
      }
      // ln σ² = ln(ν s0²) − ln χ²_ν: Var(ln σ) = ψ1(ν/2)/4 and E(ln σ²) = ln(ν s0²) − ψ(ν/2) − ln 2.
      const nu0 = 2 * inverseTrigamma(4 * logSigmaSd * logSigmaSd);
      const s0Squared = Math.exp(2 * logSigmaMean - Math.log(nu0) + digamma(nu0 / 2) + Math.LN2);
      // Marginal μ is Student t with ν0 degrees of freedom and scale² s0²/κ0 (variance × ν0/(ν0 − 2)).
      const inflation = nu0 > 2 ? nu0 / (nu0 - 2) : 1;
      const kappa0 = (s0Squared * inflation) / (muSd * muSd);
      return {
        record: {
          name: 'previous-posterior',
          parameters: { muMean, muSd, logSigmaMean, logSigmaSd, kappa0, nu0, s0: Math.sqrt(s0Squared), ...boundParameters },
          description: 'an earlier posterior (moments of μ and ln σ) matched to a normal–inverse-χ² prior',
        },
        bounds,
        kappa0,
        mean0: muMean,
        nu0,
        nu0s0Squared: nu0 * s0Squared,
        logSigmaNormal: null,
      };
    }
    default: {
      const unknown: never = choice;
      throw new RangeError(`${caller}: unknown prior ${JSON.stringify(unknown)}`);
    }
  }
}

/**
 * Digamma ψ(x), x > 0: recurrence ψ(x) = ψ(x + 1) − 1/x up to x ≥ 12, then the asymptotic series with
 * Bernoulli numbers (Abramowitz & Stegun 1964, eqs. 6.3.5 and 6.3.18); truncation error below 3e-15.
 */
export function digamma(x: number): number {
  if (!(x > 0) || !Number.isFinite(x)) throw new RangeError(`digamma: x must be a positive finite number, got ${x}`);
  let result = 0;
  let value = x;
  while (value < 12) {
    result -= 1 / value;
    value += 1;
  }
  const inverseSquare = 1 / (value * value);
  const series = inverseSquare * (1 / 12 - inverseSquare * (1 / 120 - inverseSquare * (1 / 252 - inverseSquare * (1 / 240 - inverseSquare / 132))));
  return result + Math.log(value) - 0.5 / value - series;
}

/**
 * Trigamma ψ1(x), x > 0: recurrence ψ1(x) = ψ1(x + 1) + 1/x² up to x ≥ 12, then the asymptotic series
 * (Abramowitz & Stegun 1964, eqs. 6.4.6 and 6.4.12) through the B10 term; truncation error below 3e-15.
 */
export function trigamma(x: number): number {
  if (!(x > 0) || !Number.isFinite(x)) throw new RangeError(`trigamma: x must be a positive finite number, got ${x}`);
  let result = 0;
  let value = x;
  while (value < 12) {
    result += 1 / (value * value);
    value += 1;
  }
  const inverse = 1 / value;
  const inverseSquare = inverse * inverse;
  const series =
    inverse +
    inverseSquare / 2 +
    inverse * inverseSquare * (1 / 6 - inverseSquare * (1 / 30 - inverseSquare * (1 / 42 - inverseSquare * (1 / 30 - (inverseSquare * 5) / 66))));
  return result + series;
}

/** Solve ψ1(x) = target for x > 0 by bisection on ln x (ψ1 is strictly decreasing). */
function inverseTrigamma(target: number): number {
  let low = Math.log(1e-6);
  let high = Math.log(1e9);
  if (trigamma(Math.exp(high)) > target) {
    throw new RangeError(`resolveBayesPrior: previous-posterior logSigmaSd is too small to match (trigamma target ${target})`);
  }
  for (let i = 0; i < 200 && high - low > 1e-13; i++) {
    const middle = (low + high) / 2;
    if (trigamma(Math.exp(middle)) > target) low = middle;
    else high = middle;
  }
  return Math.exp((low + high) / 2);
}
