import { notificationPreferencesUpdate } from '@schema/notifications';
import { getNotificationPreferences, updateNotificationPreferences } from '../services/notifications';
import { parseBody } from '../validation';
import { userRoute } from './define-route';

/** Each person's choice of e-mails, per organization they belong to (services/notifications.ts). */
export const notificationPreferenceRoutes = [
  userRoute({
    method: 'get',
    path: '/me/notification-preferences',
    summary: 'Which notification e-mails the signed-in user receives, per organization (all on by default)',
    handler: ({ res, deps, user }) => {
      res.json(getNotificationPreferences(deps.db, user.id));
    },
  }),
  userRoute({
    method: 'put',
    path: '/me/notification-preferences',
    summary: 'Switch notification e-mails on or off, per organization and type',
    handler: ({ req, res, deps, user }) => {
      res.json(updateNotificationPreferences(deps.db, deps.clock, user.id, parseBody(notificationPreferencesUpdate, req.body)));
    },
  }),
];
