/**
 * Version of the statistics engine (this folder's methods and their defaults). Decision records and
 * evidence packs store it beside the application's version, so a figure can be traced to the code
 * that made it. Raise it whenever a change to stats/ can change a figure (a method, a default
 * setting, a rounding rule); a change that leaves every figure identical keeps it.
 *
 * 1.0.0: classical view, non-detects, EN 689, Bayesian view, between-worker analysis and sample
 * planner as described in docs/decisions/001–003.
 */
export const STATS_ENGINE_VERSION = '1.0.0';
