// jstat ships no type declarations; only the parts Bellwether uses are declared here.
declare module 'jstat' {
  interface ContinuousDistribution {
    pdf(x: number, ...params: number[]): number;
    cdf(x: number, ...params: number[]): number;
    inv(p: number, ...params: number[]): number;
  }
  export const jStat: {
    normal: ContinuousDistribution;
    studentt: ContinuousDistribution;
    chisquare: ContinuousDistribution;
    centralF: ContinuousDistribution;
    gamma: ContinuousDistribution;
    beta: ContinuousDistribution;
    noncentralt: { pdf(x: number, dof: number, ncp: number): number; cdf(x: number, dof: number, ncp: number): number };
    gammaln(x: number): number;
    gammafn(x: number): number;
    betafn(x: number, y: number): number;
    ibeta(x: number, a: number, b: number): number;
    ibetainv(p: number, a: number, b: number): number;
    lowRegGamma(a: number, x: number): number;
    gammapinv(p: number, a: number): number;
    erf(x: number): number;
    erfc(x: number): number;
  };
  export default jStat;
}
declare module 'better-sqlite3-session-store' {
  import type session from 'express-session';
  type StoreFactory = (
    s: typeof session,
  ) => new (options: { client: import('better-sqlite3').Database; expired?: { clear?: boolean; intervalMs?: number } }) => session.Store;
  const factory: StoreFactory;
  export default factory;
}
declare module '@stdlib/random-base-mt19937' {
  interface Generator {
    (): number;
    normalized: () => number;
  }
  const mt19937: { factory(options: { seed: number }): Generator };
  export default mt19937;
}
