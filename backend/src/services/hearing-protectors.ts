import { and, asc, count, eq } from 'drizzle-orm';
import {
  groupHearingProtectors,
  hearingProtectors,
  hearingProtectorTypeLabels,
  type HearingProtector,
  type HearingProtectorCreate,
  type HearingProtectorUpdate,
  type ProtectorAdequacyQuery,
  type ProtectorSettingsValues,
  type HearingProtectorView,
  type ProtectorAdequacy,
  type ProtectorEstimate,
} from '@schema/hearing-protectors';
import { shiftResults } from '@schema/shift-results';
import { assessGroup } from '@stats/assess-group';
import { en458HmlLevelAtEar, en458SnrLevelAtEar, protectionVerdict, type ProtectionBands } from '@stats/hearing-protector-en458';
import { nioshLevelAtEar } from '@stats/hearing-protector-niosh';
import { oshaAppendixBLevelAtEar, oshaDeratedLevelAtEar, oshaDualLevelAtEar } from '@stats/hearing-protector-osha';
import { ratingWarnings, type LevelAtEar, type NoiseAtWorkplace } from '@stats/hearing-protector-types';
import { nioshRel, oshaHc, oshaPel, twaFromDose } from '@stats/noise-criteria';
import type { Clock } from '../clock';
import type { Db } from '../db/client';
import { Conflict, NotFound, Unprocessable } from '../errors';
import { saveAuditedChange, audit, changedFields, fieldError, ownedOrFieldError, ownedOrNotFound, sameNameRow, type Actor, type Tx } from './changes';
import { getExposureGroup, type ExposureGroupView } from './exposure-groups';
import { organizationSettingsOf, saveOrganizationSettings } from './organization-settings';

/*
 * Hearing-protector adequacy (docs/decisions/023-hearing-protectors-and-mixtures.md): the
 * organization's protector list, which protectors a noise group uses, and for each the estimated
 * level at the ear by the published methods (stats/hearing-protector-*.ts), judged in the EN 458
 * bands around the organization's action level.
 */

/** A protector as lists show it: with rating warnings (H ≥ M ≥ L) and the number of groups using it. */

function toView(row: HearingProtector, groupCount: number): HearingProtectorView {
  const { organizationId: _organizationId, ...protector } = row;
  return { ...protector, warnings: ratingWarnings(row), groupCount };
}

function groupCountOf(db: Tx, protectorId: number): number {
  return db.select({ total: count() }).from(groupHearingProtectors).where(eq(groupHearingProtectors.protectorId, protectorId)).get()?.total ?? 0;
}

/** The organization's protectors (archived ones only when asked), by name. */
export function listHearingProtectors(db: Db, organizationId: number, archived: 'false' | 'true' | 'all'): HearingProtectorView[] {
  const rows = db
    .select()
    .from(hearingProtectors)
    .where(and(eq(hearingProtectors.organizationId, organizationId), archived === 'all' ? undefined : eq(hearingProtectors.archived, archived === 'true')))
    .orderBy(asc(hearingProtectors.name))
    .all();
  return rows.map((row) => toView(row, groupCountOf(db, row.id)));
}

export function getHearingProtector(db: Tx, organizationId: number, protectorId: number): HearingProtectorView {
  const row = ownedOrNotFound(db, hearingProtectors, organizationId, protectorId, 'hearing protector');
  return toView(row, groupCountOf(db, row.id));
}

function checkNameFree(db: Tx, organizationId: number, name: string, exceptId?: number): void {
  const clash = sameNameRow(db, hearingProtectors, organizationId, name, exceptId);
  if (clash !== undefined) throw new Conflict(`A hearing protector named "${name}" already exists in this organization (protector ${clash})`);
}

const ratingFields = ['type', 'nrr', 'snr', 'h', 'm', 'l'] as const;

export function createHearingProtector(
  db: Db,
  clock: Clock,
  input: { organizationId: number; actor: Actor; protector: HearingProtectorCreate },
): HearingProtectorView {
  const now = clock.now();
  const stamp = now.toISOString();
  return db.transaction((tx) => {
    checkNameFree(tx, input.organizationId, input.protector.name);
    const p = input.protector;
    const row = tx
      .insert(hearingProtectors)
      .values({
        organizationId: input.organizationId,
        name: p.name,
        type: p.type,
        nrr: p.nrr ?? null,
        snr: p.snr ?? null,
        h: p.h ?? null,
        m: p.m ?? null,
        l: p.l ?? null,
        notes: p.notes ?? '',
        createdAt: stamp,
        updatedAt: stamp,
      })
      .returning()
      .get();
    audit(tx, {
      organizationId: input.organizationId,
      actor: input.actor,
      entityType: 'hearing_protector',
      entityId: row.id,
      action: 'created',
      after: { name: row.name, ...Object.fromEntries(ratingFields.map((key) => [key, row[key]])) },
      at: now,
    });
    return toView(row, 0);
  });
}

/** Edits a protector (audited). The merged row must still carry a rating, and H, M, L stay together. */
export function updateHearingProtector(
  db: Db,
  clock: Clock,
  input: { organizationId: number; protectorId: number; actor: Actor; changes: HearingProtectorUpdate; reason?: string },
): HearingProtectorView {
  const now = clock.now();
  db.transaction((tx) => {
    const current = ownedOrNotFound(tx, hearingProtectors, input.organizationId, input.protectorId, 'hearing protector');
    const { before, after } = changedFields(current, input.changes);
    if (Object.keys(after).length === 0) return;
    const merged = { ...current, ...after } as HearingProtector;
    if (merged.nrr === null && merged.snr === null && merged.h === null) throw fieldError('nrr', 'Give at least one rating: the NRR, the SNR, or H, M and L');
    const hml = [merged.h, merged.m, merged.l].filter((value) => value !== null).length;
    if (hml > 0 && hml < 3)
      throw fieldError(merged.h === null ? 'h' : merged.m === null ? 'm' : 'l', 'Give H, M and L together (the HML method needs all three)');
    if (after.name !== undefined) checkNameFree(tx, input.organizationId, String(after.name), current.id);
    saveAuditedChange(tx, hearingProtectors, {
      organizationId: input.organizationId,
      actor: input.actor,
      entityType: 'hearing_protector',
      entityId: current.id,
      reason: input.reason,
      before,
      after,
      at: now,
    });
  });
  return getHearingProtector(db, input.organizationId, input.protectorId);
}

// ---------------------------------------------------------------- settings

/** The organization's verdict settings (defaults from schema/organizations.ts). */
export function organizationProtectorSettings(db: Tx, organizationId: number): ProtectorSettingsValues {
  const settings = organizationSettingsOf(db, organizationId);
  return {
    protectorActionLevelDb: settings.protectorActionLevelDb,
    protectorAcceptableMarginDb: settings.protectorAcceptableMarginDb,
    protectorGoodMarginDb: settings.protectorGoodMarginDb,
    protectorOverProtectionMarginDb: settings.protectorOverProtectionMarginDb,
  };
}

/** Saves the verdict settings (audited). Verdicts are worked out when asked, so they follow at once. */
export function updateProtectorSettings(
  db: Db,
  clock: Clock,
  input: { organizationId: number; actor: Actor; values: ProtectorSettingsValues },
): ProtectorSettingsValues {
  saveOrganizationSettings(db, clock, {
    ...input,
    action: 'protector_settings_changed',
    before: (tx) => organizationProtectorSettings(tx, input.organizationId),
  });
  return organizationProtectorSettings(db, input.organizationId);
}

// ---------------------------------------------------------------- protectors in use by a group

function noiseGroup(db: Tx, clock: Clock, organizationId: number, groupId: number): ExposureGroupView {
  const group = getExposureGroup(db, clock, organizationId, groupId);
  if (group.agentKind !== 'noise') throw new Unprocessable(`"${group.name}" is not a noise group: hearing protectors belong to groups exposed to noise`);
  return group;
}

/** The protectors a group uses, by name. */
export function protectorsOfGroup(db: Tx, clock: Clock, organizationId: number, groupId: number): HearingProtectorView[] {
  noiseGroup(db, clock, organizationId, groupId);
  return db
    .select({ protector: hearingProtectors })
    .from(groupHearingProtectors)
    .innerJoin(hearingProtectors, eq(hearingProtectors.id, groupHearingProtectors.protectorId))
    .where(eq(groupHearingProtectors.exposureGroupId, groupId))
    .orderBy(asc(hearingProtectors.name))
    .all()
    .map((row) => toView(row.protector, groupCountOf(db, row.protector.id)));
}

/** Puts a protector on a noise group's list (audited). 409 when it is already there; 400 naming `protectorId` for an unknown or archived one. */
export function addGroupProtector(
  db: Db,
  clock: Clock,
  input: { organizationId: number; groupId: number; protectorId: number; actor: Actor },
): HearingProtectorView[] {
  const now = clock.now();
  db.transaction((tx) => {
    const group = noiseGroup(tx, clock, input.organizationId, input.groupId);
    const protector = ownedOrFieldError(tx, hearingProtectors, input.organizationId, input.protectorId, 'hearing protector', 'protectorId');
    if (protector.archived) throw fieldError('protectorId', `"${protector.name}" is archived: bring it back before assigning it`);
    const existing = tx
      .select({ id: groupHearingProtectors.id })
      .from(groupHearingProtectors)
      .where(and(eq(groupHearingProtectors.exposureGroupId, group.id), eq(groupHearingProtectors.protectorId, protector.id)))
      .get();
    if (existing) throw new Conflict(`"${protector.name}" is already in use in "${group.name}"`);
    tx.insert(groupHearingProtectors)
      .values({
        organizationId: input.organizationId,
        exposureGroupId: group.id,
        protectorId: protector.id,
        addedByUserId: input.actor?.id ?? null,
        createdAt: now.toISOString(),
      })
      .run();
    audit(tx, {
      organizationId: input.organizationId,
      actor: input.actor,
      entityType: 'exposure_group',
      entityId: group.id,
      action: 'protector_added',
      after: { protectorId: protector.id, protectorName: protector.name },
      at: now,
    });
  });
  return protectorsOfGroup(db, clock, input.organizationId, input.groupId);
}

/** Takes a protector off a group's list; the removal is audited (the link row goes, the audit event stays). */
export function removeGroupProtector(
  db: Db,
  clock: Clock,
  input: { organizationId: number; groupId: number; protectorId: number; actor: Actor },
): HearingProtectorView[] {
  const now = clock.now();
  db.transaction((tx) => {
    const group = noiseGroup(tx, clock, input.organizationId, input.groupId);
    const link = tx
      .select({ id: groupHearingProtectors.id, name: hearingProtectors.name })
      .from(groupHearingProtectors)
      .innerJoin(hearingProtectors, eq(hearingProtectors.id, groupHearingProtectors.protectorId))
      .where(and(eq(groupHearingProtectors.exposureGroupId, group.id), eq(groupHearingProtectors.protectorId, input.protectorId)))
      .get();
    if (!link) throw new NotFound(`Hearing protector ${input.protectorId} is not in use in "${group.name}"`);
    tx.delete(groupHearingProtectors).where(eq(groupHearingProtectors.id, link.id)).run();
    audit(tx, {
      organizationId: input.organizationId,
      actor: input.actor,
      entityType: 'exposure_group',
      entityId: group.id,
      action: 'protector_removed',
      before: { protectorId: input.protectorId, protectorName: link.name },
      at: now,
    });
  });
  return protectorsOfGroup(db, clock, input.organizationId, input.groupId);
}

// ---------------------------------------------------------------- adequacy

export const PROTECTOR_CAUTIONS = Object.freeze([
  'These are estimates from laboratory ratings: real-world protection is often much lower, depends on fit, training and wearing time, and is best checked by individual fit testing.',
  'OSHA gives no credit for hearing protectors when deciding whether the hearing conservation action level (85 dB(A) TWA, 50 % dose) is reached: the program is triggered by the unprotected exposure.',
  'Statistics support and never replace the judgement of a qualified hygienist. Limits and hearing conservation requirements come from the local regulations that apply; follow them and licensed or certified professional practice.',
]);

const criteriaByName = { oshaPel, oshaHc, nioshRel } as const;

/**
 * The level the adequacy starts from. `typed`: as entered. `p95`: the 95th percentile point estimate
 * of the group's valid shift results (the classical lognormal fit, stats/assess-group.ts); a dose is
 * turned into an 8-hour TWA with the group's criteria set (OSHA 1910.95 App. A; NIOSH 98-126).
 */
function workplaceLevel(db: Tx, group: ExposureGroupView, query: ProtectorAdequacyQuery): ProtectorAdequacy['level'] {
  if (query.level === 'typed') {
    const laDb = query.la!;
    return {
      source: 'typed',
      laDb,
      lcDb: query.lc ?? null,
      assumedCMinusADb: query.assumedCMinusA,
      statement: `Level typed in: LA ${laDb} dB(A)${query.lc === undefined ? '' : `, LC ${query.lc} dB(C)`}.`,
    };
  }
  const results = validResultsOf(db, group.id);
  if (results.length < 3) {
    throw new Unprocessable(
      `"${group.name}" has ${results.length} valid shift result${results.length === 1 ? '' : 's'}: the 95th percentile needs at least 3 — type a level instead`,
    );
  }
  let p95: number;
  try {
    p95 = assessGroup({ values: results, oel: group.oelValue }).p95;
  } catch (error) {
    if (error instanceof RangeError)
      throw new Unprocessable(`The 95th percentile of "${group.name}" cannot be estimated (${error.message}): type a level instead`);
    throw error;
  }
  let laDb: number;
  let how: string;
  if (group.oelUnit === 'dBA') {
    laDb = p95;
    how = `95th percentile of ${results.length} valid shift results in dB(A) (lognormal fit)`;
  } else {
    const criteria = group.noiseCriteriaSet && group.noiseCriteriaSet !== 'iso' ? criteriaByName[group.noiseCriteriaSet] : null;
    if (criteria === null)
      throw new Unprocessable(
        `"${group.name}" is judged on dose without an OSHA or NIOSH criteria set, so its dose cannot be turned into a TWA: type a level instead`,
      );
    laDb = twaFromDose(p95, criteria)!;
    how = `95th percentile of ${results.length} valid shift results, ${round(p95)} % dose, as an 8-hour TWA by the ${criteria.label} set (${criteria.source})`;
  }
  return {
    source: 'p95',
    laDb,
    lcDb: query.lc ?? null,
    assumedCMinusADb: query.assumedCMinusA,
    statement: `Level used: ${round(laDb)} dB(A), the ${how}.`,
  };
}

/** The group's valid shift results (value and non-detect flag), what the 95th percentile is fitted to. */
function validResultsOf(db: Tx, groupId: number): Array<{ value: number; nonDetect: boolean }> {
  return db
    .select({ value: shiftResults.value, nonDetect: shiftResults.nonDetect })
    .from(shiftResults)
    .where(and(eq(shiftResults.exposureGroupId, groupId), eq(shiftResults.status, 'valid')))
    .all();
}

function round(value: number): number {
  return Math.round(value * 10) / 10;
}

function bandsOf(settings: ProtectorSettingsValues): ProtectorAdequacy['bands'] {
  const actionLevelDb = settings.protectorActionLevelDb;
  const bands = {
    actionLevelDb,
    acceptableMarginDb: settings.protectorAcceptableMarginDb,
    goodMarginDb: settings.protectorGoodMarginDb,
    overProtectionMarginDb: settings.protectorOverProtectionMarginDb,
  };
  return {
    ...bands,
    statement:
      `Level at the ear above ${actionLevelDb} dB(A): not enough; ${actionLevelDb - bands.acceptableMarginDb}–${actionLevelDb}: acceptable; ` +
      `${actionLevelDb - bands.goodMarginDb}–${actionLevelDb - bands.acceptableMarginDb}: good; ${actionLevelDb - bands.overProtectionMarginDb}–${actionLevelDb - bands.goodMarginDb}: acceptable; ` +
      `below ${actionLevelDb - bands.overProtectionMarginDb}: over-protection (warnings and speech may go unheard).`,
    source:
      'Bands of EN 458:2016 around the action level (from memory); action level default 85 dB(A), the upper exposure action value of Directive 2003/10/EC Art. 3 — an organization setting. The same bands judge every method’s estimate.',
  };
}

function estimatesFor(protector: HearingProtector, noise: NoiseAtWorkplace, assumedCMinusADb: number, bands: ProtectionBands): ProtectorEstimate[] {
  const judged = (estimate: LevelAtEar): ProtectorEstimate => ({ ...estimate, verdict: protectionVerdict(estimate.levelAtEarDb, bands), unavailable: null });
  const list: ProtectorEstimate[] = [];
  if (protector.nrr !== null) {
    list.push(judged(oshaDeratedLevelAtEar(noise, protector.nrr)));
    list.push(judged(oshaAppendixBLevelAtEar(noise, protector.nrr)));
    list.push(judged(nioshLevelAtEar(noise, protector.nrr, protector.type)));
  } else {
    const reason = 'No NRR on this protector';
    list.push({ method: 'osha-derated', source: 'OSHA 29 CFR 1910.95 Appendix B with 50 % derating', unavailable: reason });
    list.push({ method: 'niosh-derated', source: 'NIOSH 1998 (Publ. 98-126) type-based derating', unavailable: reason });
  }
  const options = { assumedCMinusADb };
  if (protector.snr !== null) list.push(judged(en458SnrLevelAtEar(noise, protector.snr, options)));
  else list.push({ method: 'en458-snr', source: 'EN 458:2016 SNR method', unavailable: 'No SNR on this protector' });
  if (protector.h !== null && protector.m !== null && protector.l !== null)
    list.push(judged(en458HmlLevelAtEar(noise, { h: protector.h, m: protector.m, l: protector.l }, options)));
  else list.push({ method: 'en458-hml', source: 'EN 458:2016 HML method', unavailable: 'No H, M, L values on this protector' });
  return list;
}

/**
 * Earplug and earmuff worn together: the OSHA Technical Manual's rule (higher-rated protector's
 * estimate less 5 dB) with and without the 50 % derating. NIOSH 98-126 and EN 458 give no rule for
 * combining two ratings here, so they say so instead of guessing (a rating measured on the combination
 * is the way).
 */
function dualEstimatesFor(plug: HearingProtector, muff: HearingProtector, noise: NoiseAtWorkplace, bands: ProtectionBands): ProtectorEstimate[] {
  const judged = (estimate: LevelAtEar): ProtectorEstimate => ({ ...estimate, verdict: protectionVerdict(estimate.levelAtEarDb, bands), unavailable: null });
  const noRule = 'No rule for combining two protectors’ ratings in this method: use a rating measured on the combination';
  const osha =
    plug.nrr !== null && muff.nrr !== null
      ? [judged(oshaDualLevelAtEar(noise, plug.nrr, muff.nrr, { derated: true })), judged(oshaDualLevelAtEar(noise, plug.nrr, muff.nrr, { derated: false }))]
      : [{ method: 'osha-dual-derated', source: 'OSHA Technical Manual, Section III Chapter 5 (dual protection)', unavailable: 'Both protectors need an NRR' }];
  return [
    ...osha,
    { method: 'niosh-derated', source: 'NIOSH 1998 (Publ. 98-126) type-based derating', unavailable: noRule },
    { method: 'en458-snr', source: 'EN 458:2016', unavailable: noRule },
  ];
}

/**
 * For each protector a noise group uses, the level at the ear by each method that its ratings allow,
 * each with its source, formula and verdict. 422 when the group is not a noise group or its
 * 95th percentile cannot be estimated (then a typed level is the way).
 */
export function groupProtectorAdequacy(db: Db, clock: Clock, organizationId: number, groupId: number, query: ProtectorAdequacyQuery): ProtectorAdequacy {
  const group = noiseGroup(db, clock, organizationId, groupId);
  const protectors = protectorsOfGroup(db, clock, organizationId, groupId);
  const level = workplaceLevel(db, group, query);
  if (level.lcDb !== null && level.lcDb < level.laDb - 5)
    throw fieldError('lc', `LC (${level.lcDb} dB) is more than 5 dB below LA (${round(level.laDb)} dB): check the levels`, 'query');
  const bands = bandsOf(organizationProtectorSettings(db, organizationId));
  const noise: NoiseAtWorkplace = { laDb: level.laDb, lcDb: level.lcDb };
  return {
    group: { id: group.id, name: group.name, oelUnit: group.oelUnit, noiseCriteriaSet: group.noiseCriteriaSet, actionLevel: group.actionLevel },
    level,
    bands,
    protectors: protectors.map((protector) => ({ protector, estimates: estimatesFor({ ...protector, organizationId }, noise, level.assumedCMinusADb, bands) })),
    combinations: protectors
      .filter((plug) => plug.type !== 'earmuff')
      .flatMap((plug) =>
        protectors
          .filter((muff) => muff.type === 'earmuff')
          .map((muff) => ({ plug, muff, estimates: dualEstimatesFor({ ...plug, organizationId }, { ...muff, organizationId }, noise, bands) })),
      ),
    cautions: [...PROTECTOR_CAUTIONS],
  };
}

/** Labels of protector types, re-exported for the routes' summaries. */
export const protectorTypeLabels = hearingProtectorTypeLabels;
