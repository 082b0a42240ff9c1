import { useState } from 'react';
import type { DecisionRecordView } from '@schema/decision-records';
import { Button } from '@frontend/components/button';
import { Notice } from '@frontend/components/notice';
import { formatDateTime } from '@frontend/lib/format';
import type { DecisionStep } from '../api/review-decision';

type Run = (step: DecisionStep) => Promise<unknown>;

function messageOf(error: unknown): string {
  return error instanceof Error ? error.message : 'Something went wrong. Try again.';
}

/**
 * The analyst's review of a draft: approve, or return with a comment (required). The drafter sees approve
 * disabled with the reason; the server refuses it anyway (403).
 */
export function ReviewPanel({ record, isDrafter, run }: { record: DecisionRecordView; isDrafter: boolean; run: Run }) {
  const [comment, setComment] = useState('');
  const [error, setError] = useState<string | null>(null);
  const [pending, setPending] = useState<'approve' | 'return' | null>(null);
  const act = async (step: DecisionStep) => {
    setError(null);
    setPending(step.step === 'approve' ? 'approve' : 'return');
    try {
      await run(step);
      setComment('');
    } catch (caught) {
      setError(messageOf(caught));
    } finally {
      setPending(null);
    }
  };
  return (
    <section aria-labelledby="review-title" className="space-y-3 rounded-md border border-slate-200 bg-white p-4">
      <h2 id="review-title" className="text-base">
        Review
      </h2>
      {record.dataChangedSinceDraft && (
        <Notice tone="warning">The group's results changed after this was drafted: approval freezes the data as it is now.</Notice>
      )}
      <div className="flex flex-wrap items-center gap-3">
        <Button
          variant="primary"
          disabled={isDrafter || pending !== null}
          pending={pending === 'approve'}
          aria-describedby={isDrafter ? 'approve-reason' : undefined}
          onClick={() => act({ step: 'approve' })}
        >
          Approve
        </Button>
        {isDrafter && (
          <p id="approve-reason" className="text-sm text-slate-700">
            You drafted this record: another analyst must approve it.
          </p>
        )}
      </div>
      {!isDrafter && (
        <form
          noValidate
          className="space-y-2"
          onSubmit={(event) => {
            event.preventDefault();
            if (comment.trim() === '') {
              setError('Say what must change before approval');
              return;
            }
            void act({ step: 'return', comment });
          }}
        >
          <label htmlFor="return-comment" className="block text-sm font-medium text-slate-800">
            Return to the drafter with a comment
          </label>
          <textarea id="return-comment" className="input" rows={3} value={comment} onChange={(event) => setComment(event.target.value)} />
          <Button type="submit" variant="danger" pending={pending === 'return'} disabled={pending !== null}>
            Return with comment
          </Button>
        </form>
      )}
      {error && (
        <p role="alert" className="text-sm font-medium text-red-800">
          {error}
        </p>
      )}
    </section>
  );
}

/** A manager's acknowledgement: a button until they have acknowledged, then the date. */
export function AcknowledgePanel({ record, userId, canAcknowledge, run }: { record: DecisionRecordView; userId: number; canAcknowledge: boolean; run: Run }) {
  const [error, setError] = useState<string | null>(null);
  const [pending, setPending] = useState(false);
  const mine = record.acknowledgedBy.find((entry) => entry.id === userId);
  return (
    <section aria-labelledby="acknowledge-title" className="space-y-2 rounded-md border border-slate-200 bg-white p-4">
      <h2 id="acknowledge-title" className="text-base">
        Acknowledgements
      </h2>
      {record.acknowledgedBy.length === 0 ? (
        <p className="text-sm text-slate-600">No manager has acknowledged this record yet.</p>
      ) : (
        <ul className="text-sm">
          {record.acknowledgedBy.map((entry) => (
            <li key={entry.id}>
              {entry.name} — {formatDateTime(entry.at)}
            </li>
          ))}
        </ul>
      )}
      {canAcknowledge && record.status === 'approved' && !mine && (
        <Button
          variant="primary"
          pending={pending}
          onClick={async () => {
            setError(null);
            setPending(true);
            try {
              await run({ step: 'acknowledge' });
            } catch (caught) {
              setError(messageOf(caught));
            } finally {
              setPending(false);
            }
          }}
        >
          Acknowledge this decision
        </Button>
      )}
      {mine && <p className="text-sm font-medium text-emerald-900">You acknowledged this record on {formatDateTime(mine.at)}.</p>}
      {error && (
        <p role="alert" className="text-sm font-medium text-red-800">
          {error}
        </p>
      )}
    </section>
  );
}

/** Comments on the record, and a box to add one. */
export function CommentsPanel({ record, canComment, run }: { record: DecisionRecordView; canComment: boolean; run: Run }) {
  const [body, setBody] = useState('');
  const [error, setError] = useState<string | null>(null);
  return (
    <section aria-labelledby="comments-title" className="space-y-2 rounded-md border border-slate-200 bg-white p-4">
      <h2 id="comments-title" className="text-base">
        Comments
      </h2>
      {record.comments.length === 0 ? (
        <p className="text-sm text-slate-600">No comments.</p>
      ) : (
        <ul className="space-y-2 text-sm">
          {record.comments.map((comment) => (
            <li key={comment.id}>
              <p className="text-xs text-slate-500">
                {comment.author.name} · {formatDateTime(comment.createdAt)}
              </p>
              <p className="whitespace-pre-wrap">{comment.body}</p>
            </li>
          ))}
        </ul>
      )}
      {canComment && (
        <form
          noValidate
          className="space-y-2"
          onSubmit={async (event) => {
            event.preventDefault();
            setError(null);
            try {
              await run({ step: 'comments', body });
              setBody('');
            } catch (caught) {
              setError(messageOf(caught));
            }
          }}
        >
          <label htmlFor="comment-body" className="block text-sm font-medium text-slate-800">
            Add a comment
          </label>
          <textarea id="comment-body" className="input" rows={2} value={body} onChange={(event) => setBody(event.target.value)} />
          <Button type="submit" size="sm">
            Post comment
          </Button>
          {error && (
            <p role="alert" className="text-sm font-medium text-red-800">
              {error}
            </p>
          )}
        </form>
      )}
    </section>
  );
}
