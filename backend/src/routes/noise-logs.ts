import { z } from 'zod';
import { idParam } from '@schema/columns';
import {
  noiseChannelQuery,
  noiseColumnMapping,
  noiseLogListQuery,
  noiseLogMaximumBytes,
  noiseLogUploadFields,
  noiseMaskCreate,
  noiseMaskRemove,
  noiseMaskUpdate,
  noiseSettingsUpdate,
} from '@schema/noise-logs';
import { BadRequest } from '../errors';
import {
  acceptNoiseLog,
  changeNoiseMask,
  createMappingPreset,
  getNoiseLog,
  listMappingPresets,
  listNoiseLogs,
  noiseLogChannelData,
  noiseLogFile,
  organizationNoiseSettings,
  previewNoiseCsv,
  updateNoiseSettings,
  uploadNoiseLog,
} from '../services/noise-logs';
import { notifyStillStretch } from '../services/notifications';
import { parseBody, parseParams, parseQuery } from '../validation';
import { orgRoute } from './define-route';
import { fileReceiver } from './receive-file';

const logParams = z.object({ logId: idParam });
const maskParams = z.object({ logId: idParam, maskId: idParam });
const presetBody = z.object({ name: z.string({ message: 'Name the preset' }).trim().min(1, 'Name the preset').max(100), mapping: noiseColumnMapping });

/** One CSV in the field "file", at most 50 MB, read after the guards. */
const receiveFile = fileReceiver({
  maxBytes: noiseLogMaximumBytes,
  fields: 10,
  what: 'a noise log',
  check: (file) =>
    /\.(csv|txt|log)$/i.test(file.originalname)
      ? null
      : new BadRequest(`Upload the noise log as a .csv (or .txt) text file; "${file.originalname}" is not one`, { file: 'Use a .csv or .txt file' }),
});

function mappingOf(text: string | undefined) {
  if (!text) return null;
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch {
    throw new BadRequest('The field "mapping" must be JSON of a column mapping', { mapping: 'Not JSON' });
  }
  return parseBody(noiseColumnMapping, json);
}

export const noiseLogRoutes = [
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/noise-logs',
    permission: 'data:edit',
    summary: 'Upload a noise log (multipart "file" ≤ 50 MB with exposureGroupId, workerId, instrument, shiftDate; optional "mapping" JSON for any CSV)',
    handler: async ({ req, res, deps, organization, user }) => {
      const file = await receiveFile(req, res);
      const fields = parseBody(noiseLogUploadFields, req.body);
      const stored = uploadNoiseLog(deps.db, deps.clock, {
        organizationId: organization.id,
        actor: user,
        exposureGroupId: fields.exposureGroupId,
        workerId: fields.workerId,
        instrument: fields.instrument,
        shiftDate: fields.shiftDate,
        fileName: file.originalname,
        bytes: file.buffer,
        mapping: mappingOf(fields.mapping),
        presetName: fields.presetName || null,
      });
      const view = getNoiseLog(deps.db, organization.id, stored.id);
      if (stored.stillStretchOverLimit) {
        // The log is stored either way (the review page shows the same notice); a failed e-mail is logged and kept.
        await notifyStillStretch(deps, {
          organizationId: organization.id,
          organizationName: organization.name,
          uploaderUserId: user.id,
          noiseLogId: stored.id,
          fileName: file.originalname,
          workerCode: view.workerCode,
          shiftDate: view.shiftDate,
          stretches: view.stillStretches ?? [],
          stillMinutes: organizationNoiseSettings(deps.db, organization.id).stillMinutes,
        });
      }
      res.status(201).json(view);
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/noise-logs/preview',
    permission: 'data:edit',
    summary: 'Read a CSV for the column-mapping step: its headers and first rows (nothing is stored)',
    handler: async ({ req, res, deps, organization }) => {
      const file = await receiveFile(req, res);
      res.json({ ...previewNoiseCsv(file.buffer, file.originalname), presets: listMappingPresets(deps.db, organization.id) });
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/noise-logs',
    permission: 'org:read',
    summary: 'Noise logs, newest shift first (filter by groupId, workerId)',
    handler: ({ req, res, deps, organization }) => {
      res.json({ items: listNoiseLogs(deps.db, organization.id, parseQuery(noiseLogListQuery, req.query)) });
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/noise-mapping-presets',
    permission: 'org:read',
    summary: 'Saved column mappings for noise CSV files',
    handler: ({ res, deps, organization }) => {
      res.json({ items: listMappingPresets(deps.db, organization.id) });
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/noise-mapping-presets',
    permission: 'data:edit',
    summary: 'Save a named column mapping (replaces one of the same name)',
    handler: ({ req, res, deps, organization, user }) => {
      const body = parseBody(presetBody, req.body);
      res.status(201).json(createMappingPreset(deps.db, deps.clock, { organizationId: organization.id, actor: user, ...body }));
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/noise-settings',
    permission: 'org:read',
    summary: 'Noise wear-check, mask and calibration settings',
    handler: ({ res, deps, organization }) => {
      res.json(organizationNoiseSettings(deps.db, organization.id));
    },
  }),
  orgRoute({
    method: 'put',
    path: '/orgs/:orgId/noise-settings',
    permission: 'settings:manage',
    summary: 'Change the noise settings (used for logs uploaded afterwards)',
    handler: ({ req, res, deps, organization, user }) => {
      res.json(updateNoiseSettings(deps.db, deps.clock, { organizationId: organization.id, actor: user, values: parseBody(noiseSettingsUpdate, req.body) }));
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/noise-logs/:logId',
    permission: 'org:read',
    summary: 'One noise log: metadata, as-logged and reviewed figures, masks with dose change, still stretches, knocks, drift',
    handler: ({ req, res, deps, organization }) => {
      const { logId } = parseParams(logParams, req.params);
      res.json(getNoiseLog(deps.db, organization.id, logId));
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/noise-logs/:logId/channels',
    permission: 'org:read',
    summary: 'Level and peak for the chart (min/max per bucket for long windows; full resolution in a short window)',
    handler: ({ req, res, deps, organization }) => {
      const { logId } = parseParams(logParams, req.params);
      res.json(noiseLogChannelData(deps.db, organization.id, logId, parseQuery(noiseChannelQuery, req.query)));
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/noise-logs/:logId/file',
    permission: 'org:read',
    summary: 'The uploaded file, unchanged (SHA-256 in the X-Content-SHA256 header)',
    handler: ({ req, res, deps, organization }) => {
      const { logId } = parseParams(logParams, req.params);
      const file = noiseLogFile(deps.db, organization.id, logId);
      res.setHeader('Content-Type', 'text/csv; charset=utf-8');
      res.setHeader('Content-Disposition', `attachment; filename="${file.fileName.replace(/[^\w.-]/g, '_')}"`);
      res.setHeader('X-Content-SHA256', file.sha256);
      res.send(file.bytes);
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/noise-logs/:logId/masks',
    permission: 'data:edit',
    summary: 'Mask a span with a reason (audited); answers the log with the new reviewed figures',
    handler: ({ req, res, deps, organization, user }) => {
      const { logId } = parseParams(logParams, req.params);
      const body = parseBody(noiseMaskCreate, req.body);
      res.status(201).json(changeNoiseMask(deps.db, deps.clock, { organizationId: organization.id, logId, actor: user, change: { kind: 'add', ...body } }));
    },
  }),
  orgRoute({
    method: 'patch',
    path: '/orgs/:orgId/noise-logs/:logId/masks/:maskId',
    permission: 'data:edit',
    summary: 'Extend or shorten a mask with a reason (audited)',
    handler: ({ req, res, deps, organization, user }) => {
      const { logId, maskId } = parseParams(maskParams, req.params);
      const body = parseBody(noiseMaskUpdate, req.body);
      res.json(changeNoiseMask(deps.db, deps.clock, { organizationId: organization.id, logId, actor: user, change: { kind: 'change', maskId, ...body } }));
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/noise-logs/:logId/masks/:maskId/remove',
    permission: 'data:edit',
    summary: 'Remove a mask with a reason (kept as removed, audited)',
    handler: ({ req, res, deps, organization, user }) => {
      const { logId, maskId } = parseParams(maskParams, req.params);
      const body = parseBody(noiseMaskRemove, req.body);
      res.json(
        changeNoiseMask(deps.db, deps.clock, { organizationId: organization.id, logId, actor: user, change: { kind: 'remove', maskId, reason: body.reason } }),
      );
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/noise-logs/:logId/accept',
    permission: 'data:edit',
    summary: "Accept the reviewed log as the worker's shift result in its group (linked both ways)",
    handler: ({ req, res, deps, organization, user }) => {
      const { logId } = parseParams(logParams, req.params);
      res.status(201).json(acceptNoiseLog(deps.db, deps.clock, { organizationId: organization.id, logId, actor: user }));
    },
  }),
];
