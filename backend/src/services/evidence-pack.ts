/**
 * Evidence packs (issue: "evidence pack per approved decision record"): from an approved (or later
 * superseded) record only, the PDF, data.csv, record.json and the files that make them checkable
 * (groups.json, data-hash-input.json, README.txt), as one zip or the PDF alone. Every export is written
 * to the audit trail. Why pdfkit, vector charts and fixed dates: docs/decisions/020-evidence-pack.md.
 */
import { eq } from 'drizzle-orm';
import { ZipArchive } from 'archiver';
import { organizations } from '@schema/organizations';
import { DEFAULT_ASSESSMENT_SEED } from '@stats/assess-group';
import type { Clock } from '../clock';
import type { Db } from '../db/client';
import { Conflict } from '../errors';
import { evidencePackPdf } from '../pdf/evidence-pack-pdf';
import { audit } from './changes';
import { getDecisionRecord } from './decision-records';
import {
  assessCommand,
  dataCsv,
  dataHashInput,
  groupsJson,
  packFileNames,
  readmeText,
  recordJson,
  type FrozenRecord,
  type PackContext,
} from './evidence-pack-files';
import { getExposureGroup } from './exposure-groups';

export type EvidencePackFormat = 'zip' | 'pdf';

/** The record, if approval froze it; 404 for another organization's id, 409 naming the status otherwise. */
function frozenRecord(db: Db, clock: Clock, organizationId: number, recordId: number): FrozenRecord {
  const record = getDecisionRecord(db, clock, organizationId, recordId);
  if (record.status !== 'approved' && record.status !== 'superseded') {
    throw new Conflict(`Decision record ${record.id} is ${record.status}; an evidence pack is made only from an approved record`);
  }
  if (!record.figures || !record.frozenInputs || !record.dataHash || !record.approvedAt) {
    // The approval trigger and service always freeze these together; a row without them is damaged.
    throw new Conflict(`Decision record ${record.id} has no frozen figures; it cannot be exported`);
  }
  return record as FrozenRecord;
}

function contextOf(db: Db, clock: Clock, organizationId: number, record: FrozenRecord): PackContext {
  const organization = db.select({ id: organizations.id, name: organizations.name }).from(organizations).where(eq(organizations.id, organizationId)).get()!;
  const group = getExposureGroup(db, clock, organizationId, record.exposureGroupId);
  return {
    organization,
    generatedAt: clock.now().toISOString(),
    groupDefinition: {
      processArea: group.processArea,
      jobTitles: group.jobTitles,
      tasks: group.tasks,
      exposureProfile: group.exposureProfile,
      shiftHours: group.shiftHours,
    },
  };
}

/** A file name safe in a Content-Disposition header and on any file system: ASCII letters, digits and dashes. */
export function packFileName(record: { id: number; exposureGroupName: string }, extension: 'zip' | 'pdf'): string {
  const slug = record.exposureGroupName
    .normalize('NFKD')
    .replace(/[^A-Za-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .toLowerCase()
    .slice(0, 60);
  return `evidence-pack-record-${record.id}${slug ? `-${slug}` : ''}.${extension}`;
}

/** The zip of the pack's files; entries dated at approval so the bundle does not depend on the download time. */
async function zipOf(files: ReadonlyArray<{ name: string; content: Buffer | string }>, date: Date): Promise<Buffer> {
  const archive = new ZipArchive({ zlib: { level: 9 } });
  const chunks: Buffer[] = [];
  const done = new Promise<Buffer>((resolve, reject) => {
    archive.on('data', (chunk: Buffer) => chunks.push(chunk));
    archive.on('end', () => resolve(Buffer.concat(chunks)));
    archive.on('error', reject);
    archive.on('warning', reject);
  });
  for (const file of files) archive.append(file.content, { name: file.name, date });
  await archive.finalize();
  return done;
}

export interface EvidencePackDownload {
  fileName: string;
  contentType: string;
  body: Buffer;
}

/**
 * Build the pack of one record (`zip`: every file; `pdf`: the PDF alone) and record the export in the audit
 * trail. 404 for another organization's record; 409 for a draft or returned record.
 */
export async function exportEvidencePack(
  db: Db,
  clock: Clock,
  input: { organizationId: number; recordId: number; actor: { id: number }; format: EvidencePackFormat },
): Promise<EvidencePackDownload> {
  const record = frozenRecord(db, clock, input.organizationId, input.recordId);
  const context = contextOf(db, clock, input.organizationId, record);
  const command = assessCommand(record, DEFAULT_ASSESSMENT_SEED);
  const pdf = await evidencePackPdf(record, context, command);
  let download: EvidencePackDownload;
  if (input.format === 'pdf') {
    download = { fileName: packFileName(record, 'pdf'), contentType: 'application/pdf', body: pdf };
  } else {
    const files = [
      { name: packFileNames.pdf, content: pdf },
      { name: packFileNames.csv, content: dataCsv(record) },
      { name: packFileNames.json, content: recordJson(record, context) },
      { name: packFileNames.groups, content: groupsJson(record) },
      { name: packFileNames.hashInput, content: dataHashInput(record) },
      { name: packFileNames.readme, content: readmeText(record, context, DEFAULT_ASSESSMENT_SEED) },
    ];
    download = { fileName: packFileName(record, 'zip'), contentType: 'application/zip', body: await zipOf(files, new Date(record.approvedAt)) };
  }
  db.transaction((tx) => {
    audit(tx, {
      organizationId: input.organizationId,
      actor: input.actor,
      entityType: 'decision_record',
      entityId: record.id,
      action: 'evidence_exported',
      after: { format: input.format, fileName: download.fileName, dataHash: record.dataHash, bytes: download.body.length },
      at: clock.now(),
    });
  });
  return download;
}
