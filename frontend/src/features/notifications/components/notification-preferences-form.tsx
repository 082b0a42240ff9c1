import { useState } from 'react';
import { useForm } from 'react-hook-form';
import type { NotificationPreferencesView, NotificationType } from '@schema/notifications';
import { roleLabels, type Role } from '@schema/permissions';
import { Button } from '@frontend/components/button';
import { CheckboxField } from '@frontend/components/form-field';
import { Notice } from '@frontend/components/notice';
import { isApiError } from '@frontend/lib/api-client';
import { useUpdateNotificationPreferences } from '../api/notification-preferences';

/** Form values: organization id (as text, for field names) → type → on/off. */
type Values = { organizations: Record<string, Record<NotificationType, boolean>> };

function valuesOf(view: NotificationPreferencesView): Values {
  return { organizations: Object.fromEntries(view.organizations.map((entry) => [String(entry.organizationId), entry.preferences])) };
}

/** One fieldset per organization with a checkbox per notification type; saves all at once. */
export function NotificationPreferencesForm({ view }: { view: NotificationPreferencesView }) {
  const form = useForm<Values>({ defaultValues: valuesOf(view) });
  const update = useUpdateNotificationPreferences();
  const [saved, setSaved] = useState(false);

  const onSubmit = form.handleSubmit(async (values) => {
    setSaved(false);
    const answer = await update.mutateAsync({
      organizations: Object.entries(values.organizations).map(([organizationId, preferences]) => ({ organizationId: Number(organizationId), preferences })),
    });
    form.reset(valuesOf(answer));
    setSaved(true);
  });

  if (view.organizations.length === 0) return <Notice tone="info">You are not a member of any organization, so there is nothing to choose.</Notice>;

  return (
    <form noValidate onSubmit={(event) => void onSubmit(event).catch(() => undefined)} className="max-w-3xl space-y-5">
      {saved && <Notice tone="success">Saved. Your choices apply to the next e-mails.</Notice>}
      {update.error && <Notice tone="error">{isApiError(update.error) ? update.error.message : 'Your choices could not be saved.'}</Notice>}
      {view.organizations.map((organization) => (
        <fieldset key={organization.organizationId} className="card space-y-3 p-4">
          <legend className="px-1 text-base font-semibold text-slate-900">
            {organization.organizationName}{' '}
            <span className="text-sm font-normal text-slate-600">· {roleLabels[organization.role as Role] ?? organization.role}</span>
          </legend>
          {view.types.map((type) => (
            <CheckboxField
              key={type.type}
              label={type.label}
              hint={type.description}
              {...form.register(`organizations.${String(organization.organizationId)}.${type.type}`)}
            />
          ))}
        </fieldset>
      ))}
      <Button type="submit" variant="primary" pending={update.isPending}>
        Save choices
      </Button>
    </form>
  );
}
