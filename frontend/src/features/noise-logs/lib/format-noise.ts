/** Display rounding for noise figures (the API keeps full precision; PRODUCT.md: the interface rounds). */

/** Seconds from the log start as h:mm:ss. */
export function clockTime(seconds: number): string {
  const whole = Math.round(seconds);
  const hours = Math.floor(whole / 3600);
  const minutes = Math.floor((whole % 3600) / 60);
  const rest = whole % 60;
  return `${hours}:${String(minutes).padStart(2, '0')}:${String(rest).padStart(2, '0')}`;
}

/** A duration in words: "4 h 05 min", "12 min", "40 s". */
export function duration(seconds: number): string {
  if (seconds < 60) return `${Math.round(seconds)} s`;
  const minutes = Math.round(seconds / 60);
  if (minutes < 60) return `${minutes} min`;
  return `${Math.floor(minutes / 60)} h ${String(minutes % 60).padStart(2, '0')} min`;
}

/** Dose %: one decimal below 1000 %. */
export function dose(value: number | null): string {
  if (value === null) return '—';
  return `${value >= 1000 ? Math.round(value).toLocaleString('en') : value.toFixed(1)} %`;
}

/** A level in dB with one decimal. */
export function decibels(value: number | null, unit = 'dB'): string {
  return value === null ? '—' : `${value.toFixed(1)} ${unit}`;
}

/** A signed change: "+3.2 pp", "−0.4 pp". */
export function signed(value: number | null, unit: string, digits = 1): string {
  if (value === null) return '—';
  const text = Math.abs(value).toFixed(digits);
  if (Number(text) === 0) return `0 ${unit}`;
  return `${value < 0 ? '−' : '+'}${text} ${unit}`;
}

export const criteriaLabels = {
  oshaPel: 'OSHA PEL (90 dBA, 5 dB, threshold 90)',
  oshaHc: 'OSHA hearing conservation (90 dBA, 5 dB, threshold 80)',
  nioshRel: 'NIOSH REL (85 dBA, 3 dB, threshold 80)',
} as const;
