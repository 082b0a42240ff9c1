import type { Request, Response } from 'express';
import multer from 'multer';
import { z } from 'zod';
import { idParam } from '@schema/columns';
import { importBatchListQuery, labImportCommit, labImportMaximumBytes } from '@schema/lab-imports';
import { BadRequest, HttpError } from '../errors';
import { checkLabImport, commitLabImport, getLabImport, listLabImports, uploadLabFile } from '../services/lab-import';
import { parseBody, parseParams, parseQuery } from '../validation';
import { nameAccessOf } from './access';
import { orgRoute } from './define-route';

const batchParams = z.object({ batchId: idParam });

/** Types browsers and tools send for a CSV or text file (Windows sends Excel's for .csv). */
const textTypes = new Set(['text/csv', 'text/plain', 'application/csv', 'text/comma-separated-values', 'application/vnd.ms-excel', 'application/octet-stream']);

/**
 * Multer keeps the file in memory (at most 5 MB, one file in the field "file"). Run inside the
 * handler, after the membership and permission guards, so nobody without 'data:edit' can make the
 * server read an upload.
 */
const upload = multer({
  storage: multer.memoryStorage(),
  defParamCharset: 'utf8',
  limits: { fileSize: labImportMaximumBytes, files: 1, fields: 5, parts: 6 },
  fileFilter: (_req, file, accept) => {
    const named = /\.(csv|txt)$/i.test(file.originalname);
    if (!named || !textTypes.has(file.mimetype.toLowerCase())) {
      accept(
        new BadRequest(`Upload the lab results as a .csv (or .txt) text file; "${file.originalname}" (${file.mimetype}) is not one`, {
          file: 'Use a .csv or .txt file',
        }),
      );
      return;
    }
    accept(null, true);
  },
}).single('file');

function receiveFile(req: Request, res: Response): Promise<Express.Multer.File> {
  return new Promise((resolve, reject) => {
    upload(req, res, (error: unknown) => {
      if (error instanceof multer.MulterError) {
        if (error.code === 'LIMIT_FILE_SIZE')
          return reject(
            new HttpError(413, 'payload_too_large', `The file is larger than the limit of ${labImportMaximumBytes / 1024 / 1024} MB; nothing was stored`),
          );
        return reject(new BadRequest(`Send one file in the form field "file" (${error.message})`, { file: 'Send one CSV file in the field "file"' }));
      }
      if (error) return reject(error);
      if (!req.file) return reject(new BadRequest('Attach the lab results as a CSV file in the multipart form field "file"', { file: 'Attach a CSV file' }));
      resolve(req.file);
    });
  });
}

export const labImportRoutes = [
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/lab-imports',
    permission: 'data:edit',
    summary: 'Upload a lab results CSV (multipart field "file", ≤ 5 MB): stored with its SHA-256, answered with a preview',
    handler: async ({ req, res, deps, organization, user }) => {
      const file = await receiveFile(req, res);
      res
        .status(201)
        .json(uploadLabFile(deps.db, deps.clock, { organizationId: organization.id, actor: user, fileName: file.originalname, bytes: file.buffer }));
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/lab-imports',
    permission: 'org:read',
    summary: 'Lab imports, newest first',
    handler: ({ req, res, deps, organization }) => {
      res.json(listLabImports(deps.db, organization.id, parseQuery(importBatchListQuery, req.query)));
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/lab-imports/:batchId',
    permission: 'org:read',
    summary: 'One lab import with its preview (columns, suggested mapping, first rows; cells hidden without workerNames:read)',
    handler: ({ req, res, deps, organization, membership }) => {
      const { batchId } = parseParams(batchParams, req.params);
      res.json(getLabImport(deps.db, organization.id, batchId, nameAccessOf(membership)));
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/lab-imports/:batchId/check',
    permission: 'data:edit',
    summary: 'Dry run of a commit: the results it would store, or every problem by row and column',
    handler: ({ req, res, deps, organization }) => {
      const { batchId } = parseParams(batchParams, req.params);
      const commit = parseBody(labImportCommit, req.body);
      res.json(checkLabImport(deps.db, deps.clock, { organizationId: organization.id, batchId, commit }));
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/lab-imports/:batchId/commit',
    permission: 'data:edit',
    summary: 'Import the rows with the mapping: all or nothing, samples combined into shift TWAs',
    handler: ({ req, res, deps, organization, user, membership }) => {
      const { batchId } = parseParams(batchParams, req.params);
      const commit = parseBody(labImportCommit, req.body);
      res.status(201).json(commitLabImport(deps.db, deps.clock, { organizationId: organization.id, batchId, actor: user, commit }, nameAccessOf(membership)));
    },
  }),
];
