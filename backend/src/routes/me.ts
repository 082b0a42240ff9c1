import { sessionView } from '../services/users';
import { userRoute } from './define-route';

export const meRoutes = [
  userRoute({
    method: 'get',
    path: '/me',
    summary: 'The signed-in user and their active memberships with permissions',
    handler: ({ res, deps, user }) => {
      res.json(sessionView(deps.db, user));
    },
  }),
];
