import type { ReactNode } from 'react';

/** The page's title (the one h1), an optional line under it and actions on the right. */
export function PageHeader({ title, eyebrow, description, actions }: { title: string; eyebrow?: ReactNode; description?: ReactNode; actions?: ReactNode }) {
  return (
    <header className="mb-5 flex flex-wrap items-end justify-between gap-3 border-b border-slate-200 pb-3">
      <div className="min-w-0">
        {eyebrow && <p className="text-xs font-medium tracking-wide text-slate-500 uppercase">{eyebrow}</p>}
        <h1 className="text-xl">{title}</h1>
        {description && <p className="mt-0.5 max-w-prose text-sm text-slate-600">{description}</p>}
      </div>
      {actions && <div className="flex shrink-0 items-center gap-2">{actions}</div>}
    </header>
  );
}
