import { DocumentTitle } from '@frontend/components/document-title';
import { PageHeader } from '@frontend/components/page-header';
import { QueryState } from '@frontend/components/query-state';
import { useNotificationPreferences } from '@frontend/features/notifications/api/notification-preferences';
import { NotificationPreferencesForm } from '@frontend/features/notifications/components/notification-preferences-form';

/** /account/notifications — every signed-in person chooses which e-mails they get, per organization. */
export function Component() {
  const preferences = useNotificationPreferences();
  return (
    <>
      <DocumentTitle title="Notification settings" />
      <PageHeader
        title="Notification settings"
        description="Choose which e-mails Bellwether sends you in each organization. Everything is on until you switch it off; invitations and password resets are always sent."
      />
      <QueryState query={preferences} loading="Loading your choices…" errorTitle="Your notification settings could not be loaded">
        {(view) => <NotificationPreferencesForm view={view} />}
      </QueryState>
    </>
  );
}

export { RouteErrorBoundary as ErrorBoundary } from '../route-error';
