/**
 * The text files of an evidence pack (issue: "someone who has only the pack can recompute every figure
 * from its CSV"): data.csv (every frozen result, in the `assess` command's input form), groups.json (the
 * command's limits file), data-hash-input.json (the exact text whose SHA-256 is the record's data hash),
 * record.json (the full record) and README.txt (how to check the hash and recompute the figures).
 */
import Papa from 'papaparse';
import { exposureUnitLabels } from '@schema/agents';
import type { AssessmentResult } from '@schema/assessment';
import type { DecisionRecordView } from '@schema/decision-records';
import { canonicalJson } from './assessment';

/** An approved record with everything approval froze (the pack is only made from such a record). */
export type FrozenRecord = DecisionRecordView & {
  figures: NonNullable<DecisionRecordView['figures']>;
  frozenInputs: NonNullable<DecisionRecordView['frozenInputs']>;
  dataHash: string;
  approvedAt: string;
};

/** What the pack says about where it came from (record.json `pack`). */
export interface PackContext {
  organization: { id: number; name: string };
  /** When the pack was generated (it changes nothing in the record). */
  generatedAt: string;
  /** The group as described now (process area, job titles, tasks, profile): descriptive, not frozen. */
  groupDefinition: { processArea: string; jobTitles: string[]; tasks: string; exposureProfile: string; shiftHours: number };
}

export const packFileNames = {
  pdf: 'evidence-pack.pdf',
  csv: 'data.csv',
  json: 'record.json',
  groups: 'groups.json',
  hashInput: 'data-hash-input.json',
  readme: 'README.txt',
} as const;

/** The data.csv header. `group` and `value` make it the `assess` command's input as it stands. */
export const dataCsvColumns = [
  'result_id',
  'worker_code',
  'date',
  'group',
  'value',
  'unit',
  'non_detect',
  'detection_limit',
  'source',
  'status_at_approval',
] as const;

/**
 * The `assess` value cell: the number as JavaScript prints it (the shortest text that reads back to the
 * same double, so the command computes from exactly the stored value), `<` + detection limit for a non-detect.
 */
export function assessValueCell(result: Pick<AssessmentResult, 'value' | 'nonDetect'>): string {
  return result.nonDetect ? `<${String(result.value)}` : String(result.value);
}

/** data.csv: one row per result used, in the order the engine received them (date, worker code, id). */
export function dataCsv(record: FrozenRecord): string {
  const group = record.figures.group;
  const rows = record.figures.data.results.map((result) => [
    String(result.id),
    result.workerCode,
    result.date,
    group.name,
    assessValueCell(result),
    group.oelUnit,
    result.nonDetect ? 'true' : 'false',
    result.nonDetect ? String(result.value) : '',
    result.source,
    // Approval uses valid results only (services/assessment.ts validResultsOf).
    'valid',
  ]);
  return `${Papa.unparse({ fields: [...dataCsvColumns], data: rows }, { newline: '\n' })}\n`;
}

/** groups.json for `assess --groups`: the limit judged against (after any extended-shift adjustment) and the action level. */
export function groupsJson(record: FrozenRecord): string {
  const group = record.figures.group;
  const limits = { oel: group.oel, ...(group.actionLevel === null ? {} : { actionLevel: group.actionLevel }) };
  return `${JSON.stringify({ [group.name]: limits }, null, 2)}\n`;
}

/**
 * The exact text hashed into the record's data hash (services/assessment.ts assessmentDataHash): canonical
 * JSON (keys sorted at every level, no spaces) of the values used, the OEL, the action level and the settings.
 */
export function dataHashInput(record: FrozenRecord): string {
  const figures = record.figures;
  return canonicalJson({
    values: figures.data.results.map((result) => ({ workerCode: result.workerCode, date: result.date, value: result.value, nonDetect: result.nonDetect })),
    oel: figures.group.oel,
    actionLevel: figures.group.actionLevel,
    settings: figures.settings,
  });
}

/** record.json: the pack's context and the full record as the API gives it (frozen inputs, figures, approvals, cautions). */
export function recordJson(record: FrozenRecord, context: PackContext): string {
  const document = {
    pack: {
      format: 'bellwether-evidence-pack',
      formatVersion: 1,
      generatedAt: context.generatedAt,
      files: packFileNames,
      dataHashAlgorithm: 'SHA-256 of data-hash-input.json (UTF-8, no trailing newline)',
    },
    organization: context.organization,
    groupDefinition: { ...context.groupDefinition, frozen: record.figures.group },
    record,
  };
  return `${JSON.stringify(document, null, 2)}\n`;
}

/**
 * The command that recomputes the figures from the pack; PACK stands for the folder the pack was unzipped
 * into (npm runs scripts from the checkout's root, so the files are given by path). The seed is given only
 * when it differs from the command's default.
 */
export function assessCommand(record: FrozenRecord, defaultSeed: number): string {
  const seed = record.figures.settings.seed === defaultSeed ? '' : ` --seed ${record.figures.settings.seed}`;
  return `npm run -s assess -- --input PACK/${packFileNames.csv} --groups PACK/${packFileNames.groups} --bayes${seed}`;
}

/** README.txt: what each file is, how to check the data hash, and how to recompute every figure. */
export function readmeText(record: FrozenRecord, context: PackContext, defaultSeed: number): string {
  const figures = record.figures;
  const unit = exposureUnitLabels[figures.group.oelUnit];
  const lines = [
    `Bellwether evidence pack: decision record ${record.id}, ${figures.group.name} (${context.organization.name})`,
    `Approved by ${record.approver?.name ?? ''} on ${record.approvedAt.slice(0, 10)}. Generated ${context.generatedAt}.`,
    '',
    'Files',
    `  ${packFileNames.pdf}   the record as a document: group, data, methods, figures, charts, judgement, approvals, cautions`,
    `  ${packFileNames.csv}             every result used (${figures.data.results.length}), in the order the engine received them; values in ${unit}`,
    `  ${packFileNames.groups}          the limit judged against (OEL ${figures.group.oel} ${unit}${figures.group.actionLevel === null ? '' : `, action level ${figures.group.actionLevel}`}) for the assess command`,
    `  ${packFileNames.hashInput} the exact text whose SHA-256 is the data hash`,
    `  ${packFileNames.json}           the full record: frozen inputs, settings, prior, engine version, every figure, approvals`,
    '',
    'data.csv columns',
    '  value is the assess command input form: a number, or <LIMIT for a non-detect (LIMIT = its detection limit).',
    '  non_detect, detection_limit, source and status_at_approval repeat that in plain columns.',
    '',
    'Check the data hash',
    `  Data hash (SHA-256): ${record.dataHash}`,
    `  sha256sum ${packFileNames.hashInput}    must print the data hash.`,
    '  The hashed text is canonical JSON (keys sorted at every level, no spaces, no trailing newline) of',
    '  {"actionLevel", "oel", "settings", "values"}: values = one {"date","nonDetect","value","workerCode"} per data.csv row',
    '  in file order (value = the number in value without "<", nonDetect = non_detect), oel and actionLevel as in',
    `  ${packFileNames.groups} (null when there is none), settings = record.settings in ${packFileNames.json}.`,
    '  Result ids are not hashed: the same measurements entered again give the same hash.',
    '',
    'Recompute the figures',
    `  Engine version: Bellwether ${figures.engineVersion.application}, statistics engine ${figures.engineVersion.statistics}.`,
    '  In a checkout of that Bellwether version (npm install done), with PACK = the folder this pack was unzipped into:',
    `    ${assessCommand(record, defaultSeed)}`,
    '  The command prints the classical figures (n, GM, GSD, P95, UTL95,95, exceedance fraction, categories,',
    `  judgement, method) at full precision; compare them with record.figures.report in ${packFileNames.json}.`,
    figures.settings.prior === 'reference'
      ? '  --bayes adds the Bayesian figures with the reference prior and the same seed, as the record froze them.'
      : `  The record used the "${figures.settings.prior}" prior; the command has only the reference prior, so its Bayesian figures differ from record.figures.bayes.`,
    '',
    'Cautions',
    ...record.cautions.map((caution) => `  - ${caution}`),
    '',
  ];
  return lines.join('\n');
}
