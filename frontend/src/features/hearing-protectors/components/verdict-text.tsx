import type { ProtectionVerdict } from '@stats/hearing-protector-en458';

/** Our words for the EN 458 bands, always shown as text beside the colour (never colour alone). */
export const verdictLabels: Record<ProtectionVerdict, string> = {
  'not-enough': 'Not enough',
  acceptable: 'Acceptable',
  good: 'Good',
  'over-protection': 'Over-protection',
};

const verdictStyles: Record<ProtectionVerdict, string> = {
  'not-enough': 'border-red-300 bg-red-50 text-red-900',
  acceptable: 'border-slate-300 bg-slate-50 text-slate-800',
  good: 'border-emerald-300 bg-emerald-50 text-emerald-900',
  'over-protection': 'border-amber-300 bg-amber-50 text-amber-950',
};

/** A verdict as a small labelled badge. */
export function VerdictBadge({ verdict }: { verdict: ProtectionVerdict }) {
  return <span className={`inline-block rounded border px-1.5 py-0.5 text-xs font-medium ${verdictStyles[verdict]}`}>{verdictLabels[verdict]}</span>;
}

/** Short names of the methods for tables; the full source is shown beside each estimate. */
export const methodLabels: Record<string, string> = {
  'osha-derated': 'OSHA App. B, 50 % derated',
  'osha-appendix-b': 'OSHA App. B (NRR − 7)',
  'niosh-derated': 'NIOSH type derating',
  'en458-snr': 'EN 458 SNR',
  'en458-hml': 'EN 458 HML',
  'osha-dual-derated': 'OSHA dual, 50 % derated',
  'osha-dual-appendix-b': 'OSHA dual (NRR − 7)',
};
