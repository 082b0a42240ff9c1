import type { ReactNode } from 'react';

type Tone = 'neutral' | 'positive' | 'muted' | 'warning' | 'void';

const tones: Record<Tone, { box: string; dot: string }> = {
  neutral: { box: 'border-slate-300 bg-white text-slate-700', dot: 'bg-slate-400' },
  positive: { box: 'border-emerald-300 bg-emerald-50 text-emerald-900', dot: 'bg-emerald-600' },
  muted: { box: 'border-slate-300 bg-slate-100 text-slate-600', dot: 'border border-slate-400 bg-transparent' },
  warning: { box: 'border-amber-300 bg-amber-50 text-amber-950', dot: 'bg-amber-500' },
  void: { box: 'border-red-300 bg-red-50 text-red-900', dot: 'bg-red-700' },
};

/** A small labelled state ("Archived", "Void", "Current"): the word always, the dot only adds. */
export function StatusBadge({ tone = 'neutral', children, title }: { tone?: Tone; children: ReactNode; title?: string }) {
  const style = tones[tone];
  return (
    <span title={title} className={`inline-flex items-center gap-1.5 rounded-full border px-2 py-0.5 text-xs font-medium whitespace-nowrap ${style.box}`}>
      <span aria-hidden="true" className={`inline-block size-1.5 rounded-full ${style.dot}`} />
      {children}
    </span>
  );
}

/** "In use" or "Archived" for a record's archived flag. */
export function ArchivedBadge({ archived }: { archived: boolean }) {
  return archived ? <StatusBadge tone="muted">Archived</StatusBadge> : <StatusBadge tone="positive">In use</StatusBadge>;
}
