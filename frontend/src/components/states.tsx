import type { ReactNode } from 'react';
import { Button } from './button';
import { Spinner } from './spinner';

/** "Loading members…", announced politely. */
export function LoadingState({ label, className = '' }: { label: string; className?: string }) {
  return (
    <div role="status" className={`flex items-center gap-2 px-3 py-6 text-sm text-slate-600 ${className}`}>
      <Spinner />
      <span>{label}</span>
    </div>
  );
}

/** A failed request, in the server's words, with a way to try again. */
export function ErrorState({ title, error, onRetry, className = '' }: { title: string; error: unknown; onRetry?: () => void; className?: string }) {
  const message = error instanceof Error ? error.message : 'Something went wrong.';
  return (
    <div role="alert" className={`rounded border border-red-300 bg-red-50 px-3 py-3 text-sm text-red-900 ${className}`}>
      <p className="font-semibold">{title}</p>
      <p className="mt-0.5">{message}</p>
      {onRetry && (
        <Button size="sm" className="mt-2" onClick={onRetry}>
          Try again
        </Button>
      )}
    </div>
  );
}

/** Nothing to show yet, and what to do about it. */
export function EmptyState({ title, children, className = '' }: { title: string; children?: ReactNode; className?: string }) {
  return (
    <div className={`rounded border border-dashed border-slate-300 px-4 py-6 text-center text-sm text-slate-600 ${className}`}>
      <p className="font-medium text-slate-800">{title}</p>
      {children && <div className="mt-1">{children}</div>}
    </div>
  );
}
