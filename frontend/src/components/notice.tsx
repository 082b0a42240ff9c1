import type { ReactNode } from 'react';

type Tone = 'info' | 'success' | 'error' | 'warning';

const tones: Record<Tone, string> = {
  info: 'border-primary-200 bg-primary-50 text-primary-900',
  success: 'border-emerald-300 bg-emerald-50 text-emerald-900',
  warning: 'border-amber-300 bg-amber-50 text-amber-950',
  error: 'border-red-300 bg-red-50 text-red-900',
};

/**
 * A boxed message. Errors use role="alert" so they are announced when they appear; the rest
 * use role="status" (polite).
 */
export function Notice({ tone = 'info', title, children, className = '' }: { tone?: Tone; title?: string; children?: ReactNode; className?: string }) {
  return (
    <div role={tone === 'error' ? 'alert' : 'status'} className={`rounded border px-3 py-2 text-sm ${tones[tone]} ${className}`}>
      {title && <p className="font-semibold">{title}</p>}
      {children && <div className={title ? 'mt-0.5' : undefined}>{children}</div>}
    </div>
  );
}
