import { useCallback, useState } from 'react';
import type { AgentKind, ExposureUnit } from '@schema/agents';
import { shiftResultStatusChange } from '@schema/shift-results';
import { Button } from '@frontend/components/button';
import { Dialog } from '@frontend/components/dialog';
import { FilterSelect, ListToolbar } from '@frontend/components/list-filters';
import { Notice } from '@frontend/components/notice';
import { QueryState } from '@frontend/components/query-state';
import { ReasonDialog } from '@frontend/components/reason-dialog';
import type { ShiftResultView } from '@frontend/lib/api-types';
import { formatCalendarDate } from '@frontend/lib/format';
import { listQueryString, useListParams } from '@frontend/lib/list-params';
import { useChangeResultStatus } from '../api/change-result-status';
import { useShiftResults } from '../api/get-shift-results';
import { ResultDetails } from './result-details';
import { ResultForm } from './result-form';
import { resultValueText, sourceLabels } from './result-value';
import { ResultsTable } from './results-table';

const statusOptions = [
  { value: '', label: 'Valid and void' },
  { value: 'valid', label: 'Valid only' },
  { value: 'void', label: 'Void only' },
];
const sourceOptions = [{ value: '', label: 'Any source' }, ...Object.entries(sourceLabels).map(([value, label]) => ({ value, label }))];
const detectOptions = [
  { value: '', label: 'All values' },
  { value: 'true', label: 'Non-detects only' },
  { value: 'false', label: 'Detected only' },
];

/**
 * A group's shift results: search, filter, sort and page (on the server), details of each
 * result, manual entry, and void or restore with a reason. Nothing is ever deleted.
 */
export function GroupResults({
  organizationId,
  group,
  workers,
  canEdit,
  canSeeNames,
}: {
  organizationId: string;
  group: { id: number; name: string; unit: ExposureUnit; agentKind: AgentKind; archived: boolean };
  /** Who may get a result here: the group's members (the server checks the date). */
  workers: ReadonlyArray<{ id: number; label: string }>;
  canEdit: boolean;
  canSeeNames: boolean;
}) {
  const params = useListParams({ prefix: 'results.', defaultSort: '-date', sortFields: ['date', 'workerCode', 'value', 'createdAt', 'status', 'source'] });
  const results = useShiftResults(organizationId, listQueryString(params, ['status', 'source', 'nonDetect'], { groupId: group.id }));
  const changeStatus = useChangeResultStatus(organizationId);
  const [entering, setEntering] = useState(false);
  const [details, setDetails] = useState<ShiftResultView | null>(null);
  const [changing, setChanging] = useState<ShiftResultView | null>(null);
  const [outcome, setOutcome] = useState<string | null>(null);
  const filtered = Boolean(params.q || params.filter('status') || params.filter('source') || params.filter('nonDetect'));
  const onDetails = useCallback((result: ShiftResultView) => setDetails(result), []);
  const onChangeStatus = useCallback((result: ShiftResultView) => setChanging(result), []);
  const voiding = changing?.status === 'valid';

  return (
    <section aria-labelledby="results-title" className="space-y-3">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <h2 id="results-title" className="text-base">
            Shift results
          </h2>
          <p className="text-sm text-slate-600">
            Non-detects show as “&lt; limit of detection”. A void result stays listed with its reason and can be restored.
          </p>
        </div>
        {canEdit && !group.archived && (
          <Button
            variant="primary"
            onClick={() => setEntering(true)}
            disabled={workers.length === 0}
            title={workers.length === 0 ? 'Add members first' : undefined}
          >
            Enter a result
          </Button>
        )}
      </div>
      <ListToolbar params={params} label="Filter shift results" searchLabel="Search worker, sample id, lab, notes" archivable={false}>
        <FilterSelect params={params} name="status" label="Status" options={statusOptions} className="w-40" />
        <FilterSelect params={params} name="source" label="Source" options={sourceOptions} className="w-40" />
        <FilterSelect params={params} name="nonDetect" label="Values" options={detectOptions} className="w-44" />
      </ListToolbar>
      {outcome && <Notice tone="success">{outcome}</Notice>}
      <QueryState query={results} loading="Loading results…" errorTitle="Could not load the results">
        {(page) => (
          <ResultsTable
            page={page}
            params={params}
            busy={results.isPlaceholderData}
            canEdit={canEdit}
            canSeeNames={canSeeNames}
            filtered={filtered}
            onDetails={onDetails}
            onChangeStatus={onChangeStatus}
          />
        )}
      </QueryState>

      <Dialog open={entering} onClose={() => setEntering(false)} title="Enter a shift result" description={`${group.name}; stored in the group's unit.`} wide>
        <ResultForm
          organizationId={organizationId}
          group={group}
          workers={workers}
          onCancel={() => setEntering(false)}
          onSaved={(saved, another) => {
            setOutcome(`Result saved: ${saved.worker.code} on ${formatCalendarDate(saved.date)}, ${resultValueText(saved)}.`);
            if (!another) setEntering(false);
          }}
        />
      </Dialog>
      <Dialog open={details !== null} onClose={() => setDetails(null)} title="How this result was reached" wide>
        {details && <ResultDetails result={details} />}
      </Dialog>
      <ReasonDialog
        open={changing !== null}
        onClose={() => setChanging(null)}
        title={voiding ? 'Void this result?' : 'Restore this result?'}
        description={
          changing && (
            <>
              {changing.worker.code} on {formatCalendarDate(changing.date)}: {resultValueText(changing)}.{' '}
              {voiding ? 'It stays listed, marked void, and leaves the statistics.' : 'It counts in the statistics again.'}
            </>
          )
        }
        confirmLabel={voiding ? 'Void result' : 'Restore result'}
        tone={voiding ? 'danger' : 'primary'}
        schema={shiftResultStatusChange}
        reasonLabel={voiding ? 'Why is it void?' : 'Why restore it?'}
        reasonHint="Required; kept with the result and in the audit trail."
        onConfirm={async (reason) => {
          if (!changing) return;
          await changeStatus.mutateAsync({ resultId: changing.id, action: voiding ? 'void' : 'restore', reason: reason ?? '' });
          setOutcome(`${voiding ? 'Voided' : 'Restored'}: ${changing.worker.code} on ${formatCalendarDate(changing.date)}.`);
        }}
      />
    </section>
  );
}
