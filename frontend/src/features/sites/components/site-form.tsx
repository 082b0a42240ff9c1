import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { siteCreate, type SiteCreate } from '@schema/sites';
import { FormActions } from '@frontend/components/form-actions';
import { TextAreaField, TextField } from '@frontend/components/form-field';
import { applyServerErrorsInline } from '@frontend/lib/form-errors';
import { useCreateSite } from '../api/create-site';
import type { SiteView } from '../api/get-sites';
import { useUpdateSite } from '../api/update-site';

/** Add a site, or edit one (`site` given). Checked with the server's schema; Enter in the name submits. */
export function SiteForm({
  organizationId,
  site,
  onSaved,
  onCancel,
}: {
  organizationId: string;
  site?: SiteView;
  onSaved: (site: SiteView) => void;
  onCancel: () => void;
}) {
  const create = useCreateSite(organizationId);
  const update = useUpdateSite(organizationId);
  const form = useForm({ resolver: zodResolver(siteCreate), defaultValues: { name: site?.name ?? '', description: site?.description ?? '' } });
  const [formError, setFormError] = useState<string | null>(null);
  const { errors, isSubmitting } = form.formState;

  const submit = form.handleSubmit(async (values: SiteCreate) => {
    setFormError(null);
    try {
      onSaved(site ? await update.mutateAsync({ siteId: site.id, changes: values }) : await create.mutateAsync(values));
    } catch (error) {
      setFormError(applyServerErrorsInline(error, form.setError, ['name', 'description']));
    }
  });

  return (
    <form noValidate onSubmit={submit} className="space-y-3">
      <TextField label="Name" autoComplete="off" error={errors.name?.message} {...form.register('name')} />
      <TextAreaField label="Description" hint="Areas, lines or buildings; optional." error={errors.description?.message} {...form.register('description')} />
      <FormActions error={formError} submitLabel={site ? 'Save site' : 'Add site'} pending={isSubmitting} onCancel={onCancel} />
    </form>
  );
}
