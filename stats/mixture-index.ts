/*
 * The additive mixture index for agents with similar (additive) effects.
 *
 * Source: OSHA 29 CFR 1910.1000(d)(2)(i): Em = (C1/L1 + C2/L2 + … + Cn/Ln), where C is the measured
 * concentration and L the limit; Em must not exceed unity. The same additive formula is ACGIH's
 * (TLVs and BEIs booklet, appendix on mixtures) and EN 689:2018 treats additive effects the same
 * way (the annex on mixtures; cited from memory). The index is dimensionless and its limit is 1,
 * so a series of indices can be judged with the group statistics at OEL = 1.
 */

/** One component of a mixture on one shift: its shift result and its limit (same unit). */
export interface MixtureComponent {
  /** The shift result; for a non-detect, the detection limit. */
  value: number;
  nonDetect: boolean;
  /** The limit the component is judged against, in the unit of `value`. */
  oel: number;
}

export interface MixtureIndex {
  /** The index with non-detect components counted at their detection limit (the upper bound). */
  index: number;
  /** The index with non-detect components counted at 0 (the lower bound). */
  lowerBound: number;
  /** Each component's share Ci/Li (non-detects at LOD/Li). */
  ratios: number[];
  /** True when every component is a non-detect: the index is then "below" `index`. */
  allNonDetect: boolean;
  nonDetectComponents: number;
}

/**
 * Em = Σ Ci/Li (OSHA 29 CFR 1910.1000(d)(2)(i)). Non-detects enter at their detection limit (the
 * upper bound, conservative) and the lower bound with them at 0 is returned too; when every
 * component is a non-detect, the index is itself a non-detect at Σ LODi/Li.
 * mixtureIndex([{ value: 500, nonDetect: false, oel: 1000 }, { value: 45, nonDetect: false, oel: 200 },
 * { value: 40, nonDetect: false, oel: 200 }]).index → 0.925
 */
export function mixtureIndex(components: readonly MixtureComponent[]): MixtureIndex {
  if (components.length < 2) throw new RangeError('mixtureIndex: a mixture needs at least 2 components');
  components.forEach((component, position) => {
    if (!Number.isFinite(component.value) || component.value <= 0)
      throw new RangeError(`mixtureIndex: component ${position + 1} needs a value above 0, got ${component.value}`);
    if (!Number.isFinite(component.oel) || component.oel <= 0)
      throw new RangeError(`mixtureIndex: component ${position + 1} needs a limit above 0, got ${component.oel}`);
  });
  const ratios = components.map((component) => component.value / component.oel);
  const index = ratios.reduce((sum, ratio) => sum + ratio, 0);
  const lowerBound = components.reduce((sum, component, position) => sum + (component.nonDetect ? 0 : ratios[position]!), 0);
  const nonDetectComponents = components.filter((component) => component.nonDetect).length;
  return { index, lowerBound, ratios, allNonDetect: nonDetectComponents === components.length, nonDetectComponents };
}
