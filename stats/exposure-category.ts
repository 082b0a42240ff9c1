import type { ExposureCategory } from './types';

/**
 * Exposure categories 0–4 on a figure for the 95th percentile as a share of the OEL, with bands at
 * 1 %, 10 %, 50 % and 100 %: 0 ≤ 1 %, 1 ≤ 10 %, 2 ≤ 50 %, 3 ≤ 100 %, 4 > 100 % (the AIHA
 * exposure-assessment strategy, 3rd ed. 2006, as stated in Hewett, Logan, Mulhausen,
 * Ramachandran & Banerjee 2006, "Rating exposure control using Bayesian decision analysis",
 * J. Occup. Environ. Hyg. 3:568–581, Table I). A boundary value belongs to the lower category.
 */

/** Upper edges of categories 0, 1, 2 and 3 as fractions of the OEL. */
export const CATEGORY_UPPER_EDGES: readonly [number, number, number, number] = Object.freeze([0.01, 0.1, 0.5, 1]) as readonly [number, number, number, number];

/**
 * The category of a figure (e.g. the P95 estimate or the UTL) against the OEL.
 * exposureCategory(0.3, 1) → 2
 */
export function exposureCategory(value: number, oel: number): ExposureCategory {
  if (!(oel > 0) || !Number.isFinite(oel)) throw new RangeError(`exposureCategory: the OEL must be a finite number > 0, got ${oel}`);
  if (!(value >= 0) || Number.isNaN(value)) throw new RangeError(`exposureCategory: the value must be a number ≥ 0, got ${value}`);
  const ratio = value / oel;
  if (ratio <= CATEGORY_UPPER_EDGES[0]) return 0;
  if (ratio <= CATEGORY_UPPER_EDGES[1]) return 1;
  if (ratio <= CATEGORY_UPPER_EDGES[2]) return 2;
  if (ratio <= CATEGORY_UPPER_EDGES[3]) return 3;
  return 4;
}

/** Plain description of a category's band, for screens and evidence packs. */
export function exposureCategoryDescription(category: ExposureCategory): string {
  switch (category) {
    case 0:
      return 'Category 0: the 95th percentile is at most 1 % of the OEL.';
    case 1:
      return 'Category 1: the 95th percentile is above 1 % and at most 10 % of the OEL.';
    case 2:
      return 'Category 2: the 95th percentile is above 10 % and at most 50 % of the OEL.';
    case 3:
      return 'Category 3: the 95th percentile is above 50 % and at most 100 % of the OEL.';
    case 4:
      return 'Category 4: the 95th percentile is above the OEL.';
  }
}
