import { createBrowserRouter } from 'react-router';
import { meQuery } from '@frontend/features/auth/api/get-me';
import { AppLoading, RootLayout } from './layouts/root-layout';
import { sessionLoader, SessionLayout } from './layouts/session-layout';
import { queryClient } from './query-client';
import { RootErrorBoundary, RouteErrorBoundary } from './route-error';
import * as acceptInvitation from './routes/accept-invitation';
import * as forgotPassword from './routes/forgot-password';
import * as notFound from './routes/not-found';
import * as organization from './routes/organization';
import * as organizationHome from './routes/organization-home';
import * as resetPassword from './routes/reset-password';
import * as signIn from './routes/sign-in';
import * as start from './routes/start';
import * as usersShortcut from './routes/users-shortcut';

/**
 * Every address the app answers. Pages of an organization live under /orgs/:orgId so a
 * link names the organization it is about and can be shared; `/` and `/users` open the
 * organization remembered in this browser. Admin-only pages are loaded on demand (`lazy`),
 * so other roles never download their code.
 *
 * To add a page: write app/routes/<name>.tsx exporting `Component` (and `loader`,
 * `ErrorBoundary` if needed), add it below, and — if it lives in an organization — add it
 * to `organizationPages` in navigation.ts so the sidebar shows it to the roles that may open it.
 */
export const router = createBrowserRouter([
  {
    Component: RootLayout,
    ErrorBoundary: RootErrorBoundary,
    HydrateFallback: AppLoading,
    // Who is signed in (or nobody): every page below reads it from the cache.
    loader: () => queryClient.ensureQueryData(meQuery()),
    children: [
      { path: 'sign-in', ...signIn },
      { path: 'forgot-password', ...forgotPassword },
      { path: 'reset-password/:token', ...resetPassword },
      { path: 'accept-invitation/:token', ...acceptInvitation },
      {
        Component: SessionLayout,
        loader: sessionLoader,
        ErrorBoundary: RouteErrorBoundary,
        children: [
          {
            ErrorBoundary: RouteErrorBoundary,
            children: [
              { index: true, ...start },
              { path: 'users', ...usersShortcut },
              {
                path: 'orgs/:orgId',
                ...organization,
                children: [
                  { index: true, ...organizationHome },
                  { path: 'users', lazy: () => import('./routes/organization-users') },
                  { path: 'sites', lazy: () => import('./routes/sites') },
                  { path: 'agents', lazy: () => import('./routes/agents') },
                  { path: 'hearing-protectors', lazy: () => import('./routes/hearing-protectors') },
                  { path: 'exposure-groups', lazy: () => import('./routes/exposure-groups') },
                  { path: 'exposure-groups/new', lazy: () => import('./routes/exposure-group-new') },
                  { path: 'exposure-groups/:groupId', lazy: () => import('./routes/exposure-group') },
                  { path: 'exposure-groups/:groupId/edit', lazy: () => import('./routes/exposure-group-edit') },
                  { path: 'exposure-groups/:groupId/decisions', lazy: () => import('./routes/group-decisions') },
                  { path: 'exposure-groups/:groupId/decisions/new', lazy: () => import('./routes/decision-draft-new') },
                  { path: 'decision-records', lazy: () => import('./routes/decision-records') },
                  { path: 'decision-records/:recordId', lazy: () => import('./routes/decision-record') },
                  { path: 'exposure-groups/:groupId/assessment', lazy: () => import('./routes/group-assessment') },
                  { path: 'exposure-groups/:groupId/noise-estimates', lazy: () => import('./routes/group-noise-estimates') },
                  { path: 'exposure-groups/:groupId/worker-letters', lazy: () => import('./routes/group-worker-letters') },
                  { path: 'workers', lazy: () => import('./routes/workers') },
                  { path: 'workers/:workerId', lazy: () => import('./routes/worker') },
                  { path: 'sampling-plans/:planId/field-sheet', lazy: () => import('./routes/field-sheet') },
                  { path: 'lab-imports', lazy: () => import('./routes/lab-imports') },
                  { path: 'lab-imports/:batchId', lazy: () => import('./routes/lab-import') },
                  { path: 'noise-logs', lazy: () => import('./routes/noise-logs') },
                  { path: 'noise-logs/:logId', lazy: () => import('./routes/noise-log') },
                  { path: 'noise-settings', lazy: () => import('./routes/noise-settings') },
                  { path: 'audit', lazy: () => import('./routes/audit-trail') },
                ],
              },
              { path: 'account/notifications', lazy: () => import('./routes/account-notifications') },
              {
                path: 'outbox',
                lazy: () => import('./routes/outbox'),
                children: [{ path: ':messageId', lazy: () => import('./routes/outbox-message') }],
              },
            ],
          },
        ],
      },
      { path: '*', ...notFound },
    ],
  },
]);
