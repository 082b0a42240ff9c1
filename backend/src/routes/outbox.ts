import { z } from 'zod';
import { idParam } from '@schema/columns';
import { NotFound } from '../errors';
import { parseParams } from '../validation';
import { userRoute } from './define-route';

const messageParams = z.object({ id: idParam });
const outboxRunning = (deps: { outbox?: unknown }) => deps.outbox !== undefined;

/** The local e-mail capture's mailbox; these routes exist only while the capture runs. */
export const outboxRoutes = [
  userRoute({
    method: 'get',
    path: '/outbox',
    summary: 'E-mails caught by the local capture, newest first',
    permissionInAnyOrganization: 'outbox:read',
    enabledWhen: outboxRunning,
    handler: ({ res, deps }) => {
      res.json(deps.outbox!.list().map(({ id, to, from, subject, receivedAt }) => ({ id, to, from, subject, receivedAt })));
    },
  }),

  userRoute({
    method: 'get',
    path: '/outbox/:id',
    summary: 'One captured e-mail with its text and HTML',
    permissionInAnyOrganization: 'outbox:read',
    enabledWhen: outboxRunning,
    handler: ({ req, res, deps }) => {
      const { id } = parseParams(messageParams, req.params);
      const message = deps.outbox!.get(id);
      if (!message) throw new NotFound(`No e-mail ${id} in the outbox`);
      // Attachments by name, type and size; their bytes stay in the capture.
      res.json({ ...message, attachments: message.attachments.map(({ filename, contentType, size }) => ({ filename, contentType, size })) });
    },
  }),
];
