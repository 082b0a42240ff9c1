import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { decisionDraftCreate, type DecisionExclusion, type DecisionProposal, type DecisionRecordView } from '@schema/decision-records';
import { exposureCategories } from '@frontend/components/category-badge';
import { FormActions } from '@frontend/components/form-actions';
import { SelectField, TextAreaField, TextField } from '@frontend/components/form-field';
import { formatCalendarDate } from '@frontend/lib/format';
import { applyServerErrors } from '@frontend/lib/form-errors';
import { judgementWord } from './decision-badges';

type DraftInput = z.input<typeof decisionDraftCreate>;
type DraftOutput = z.output<typeof decisionDraftCreate>;

const categoryOptions = exposureCategories.map((entry) => ({ value: String(entry.category), label: `${entry.category} · ${entry.word} (${entry.band})` }));
const judgementOptions = (['acceptable', 'uncertain', 'unacceptable'] as const).map((judgement) => ({ value: judgement, label: judgementWord(judgement) }));

/**
 * The hygienist's draft: category and judgement (defaults from the assessment), rationale, actions, review
 * date (proposed from EN 689 or the organization's setting) and a reason for each result left out. The same
 * form edits a draft or a returned draft (`record` given). Checked with the server's schema.
 */
export function DraftForm({
  proposal,
  record,
  exclusions,
  onSubmit,
  onCancel,
  submitLabel,
}: {
  proposal: DecisionProposal | null;
  record?: DecisionRecordView;
  exclusions: DecisionExclusion[];
  onSubmit: (values: DraftOutput) => Promise<unknown>;
  onCancel?: () => void;
  submitLabel: string;
}) {
  const form = useForm<DraftInput, unknown, DraftOutput>({
    resolver: zodResolver(decisionDraftCreate),
    defaultValues: {
      category: record?.category ?? proposal?.category ?? 0,
      judgement: record?.judgement ?? proposal?.judgement ?? 'uncertain',
      rationale: record?.rationale ?? '',
      actions: record?.actions ?? '',
      reviewDate: record?.reviewDate ?? proposal?.reviewDate,
      exclusions,
      prior: record?.prior ?? 'reference',
    },
  });
  const [formError, setFormError] = useState<string | null>(null);
  const { errors, isSubmitting } = form.formState;

  const submit = form.handleSubmit(async (values) => {
    setFormError(null);
    try {
      await onSubmit(values);
    } catch (error) {
      setFormError(applyServerErrors(error, form.setError, ['category', 'judgement', 'rationale', 'actions', 'reviewDate', 'exclusions']));
    }
  });

  return (
    <form noValidate onSubmit={submit} className="space-y-4">
      <div className="grid gap-3 sm:grid-cols-2">
        <SelectField
          label="Exposure category"
          options={categoryOptions}
          hint={proposal ? `The assessment gives category ${proposal.category} (on the 95th percentile).` : undefined}
          error={errors.category?.message}
          {...form.register('category', { valueAsNumber: true })}
        />
        <SelectField
          label="Judgement"
          options={judgementOptions}
          hint={proposal ? `The assessment's judgement: ${judgementWord(proposal.judgement)}.` : undefined}
          error={errors.judgement?.message}
          {...form.register('judgement')}
        />
      </div>
      <TextAreaField
        label="Rationale"
        rows={5}
        hint="Why this category and judgement: the data, the grouping, the fit, anything left out."
        error={errors.rationale?.message}
        {...form.register('rationale')}
      />
      <TextAreaField
        label="Actions"
        rows={3}
        hint="Controls, protective equipment, more sampling; who and by when."
        error={errors.actions?.message}
        {...form.register('actions')}
      />
      <TextField
        label="Review date"
        type="date"
        hint={
          proposal
            ? `Proposed: ${formatCalendarDate(proposal.reviewDate)} — ${proposal.reviewDateSource}.`
            : record
              ? `Source: ${record.reviewDateSource}.`
              : undefined
        }
        error={errors.reviewDate?.message}
        {...form.register('reviewDate')}
      />
      {exclusions.length > 0 && (
        <fieldset className="space-y-2 rounded-md border border-slate-200 p-3">
          <legend className="px-1 text-sm font-medium text-slate-800">Results left out ({exclusions.length})</legend>
          {exclusions.map((exclusion, index) => (
            <TextField
              key={exclusion.resultId}
              label={`Why result ${exclusion.resultId} is left out`}
              error={errors.exclusions?.[index]?.reason?.message}
              {...form.register(`exclusions.${index}.reason`)}
            />
          ))}
        </fieldset>
      )}
      <FormActions error={formError} submitLabel={submitLabel} pending={isSubmitting} onCancel={onCancel} />
    </form>
  );
}
