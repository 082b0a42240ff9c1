/** The Bellwether mark and name. */
export function Brand({ tone = 'dark' }: { tone?: 'dark' | 'light' }) {
  return (
    <span className={`inline-flex items-center gap-2 text-base font-semibold tracking-tight ${tone === 'light' ? 'text-white' : 'text-slate-900'}`}>
      <svg viewBox="0 0 32 32" className="size-6" aria-hidden="true">
        <rect width="32" height="32" rx="7" fill="var(--color-primary-700)" />
        <path d="M16 6c-4.4 0-7 3.4-7 8v5l-2.5 3.5h19L23 19v-5c0-4.6-2.6-8-7-8z" fill="#f8fafc" />
        <circle cx="16" cy="25.5" r="2.5" fill="#f8fafc" />
      </svg>
      Bellwether
    </span>
  );
}
