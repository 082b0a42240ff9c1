import { z } from 'zod';
import { idParam } from '@schema/columns';
import { exportEvidencePack, type EvidencePackFormat } from '../services/evidence-pack';
import { parseParams } from '../validation';
import { orgRoute, type OrganizationContext } from './define-route';

const recordParams = z.object({ recordId: idParam });
const recordPath = '/orgs/:orgId/decision-records/:recordId';

/** Send a pack as an attachment; the file name is ASCII-only (packFileName), so it needs no encoding. */
function downloadHandler(format: EvidencePackFormat) {
  return async ({ req, res, deps, organization, user }: OrganizationContext) => {
    const { recordId } = parseParams(recordParams, req.params);
    const download = await exportEvidencePack(deps.db, deps.clock, { organizationId: organization.id, recordId, actor: user, format });
    res.setHeader('Content-Type', download.contentType);
    res.setHeader('Content-Disposition', `attachment; filename="${download.fileName}"`);
    res.setHeader('Cache-Control', 'no-store');
    res.send(download.body);
  };
}

/** Evidence packs of approved decision records (zip bundle or the PDF alone); `evidence:export` (admin, consultant). */
export const evidencePackRoutes = [
  orgRoute({
    method: 'get',
    path: `${recordPath}/evidence-pack.zip`,
    permission: 'evidence:export',
    summary: 'Evidence pack of an approved decision record: PDF, data.csv, record.json and check files in one zip',
    handler: downloadHandler('zip'),
  }),
  orgRoute({
    method: 'get',
    path: `${recordPath}/evidence-pack.pdf`,
    permission: 'evidence:export',
    summary: 'The evidence pack PDF of an approved decision record alone',
    handler: downloadHandler('pdf'),
  }),
];
