/** Display formats shared by every page; the interface rounds, the API keeps full values. */

const dateFormat = new Intl.DateTimeFormat(undefined, { year: 'numeric', month: 'short', day: 'numeric' });
const dateTimeFormat = new Intl.DateTimeFormat(undefined, {
  year: 'numeric',
  month: 'short',
  day: 'numeric',
  hour: '2-digit',
  minute: '2-digit',
});

function toDate(value: string | number | Date): Date | null {
  const date = value instanceof Date ? value : new Date(value);
  return Number.isNaN(date.getTime()) ? null : date;
}

/** "3 Dec 2025" in the reader's locale; an unreadable date prints as "—". */
export function formatDate(value: string | number | Date | null | undefined): string {
  if (value === null || value === undefined) return '—';
  const date = toDate(value);
  return date ? dateFormat.format(date) : '—';
}

/** "3 Dec 2025, 14:05" in the reader's locale and time zone. */
export function formatDateTime(value: string | number | Date | null | undefined): string {
  if (value === null || value === undefined) return '—';
  const date = toDate(value);
  return date ? dateTimeFormat.format(date) : '—';
}

const calendarDateFormat = new Intl.DateTimeFormat(undefined, { year: 'numeric', month: 'short', day: 'numeric', timeZone: 'UTC' });

/**
 * A calendar date from the API (`2024-09-02`, no time zone) as "2 Sep 2024". Read as UTC
 * midnight and printed in UTC, so a reader west of Greenwich never sees the day before.
 */
export function formatCalendarDate(value: string | null | undefined): string {
  if (!value) return '—';
  const date = new Date(`${value.slice(0, 10)}T00:00:00Z`);
  return Number.isNaN(date.getTime()) ? value : calendarDateFormat.format(date);
}

/**
 * A measured figure for reading: at most `digits` significant digits (default 3), trailing
 * zeros dropped, grouped by the locale ("0.0412", "86.5", "1,250"). The API keeps full values.
 */
export function formatNumber(value: number | null | undefined, digits = 3): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  const rounded = Number(value.toPrecision(digits));
  return rounded.toLocaleString(undefined, { maximumFractionDigits: 20 });
}

/** Today's calendar date in the reader's time zone, `YYYY-MM-DD` (default for date inputs). */
export function todayCalendarDate(now: Date = new Date()): string {
  const local = new Date(now.getTime() - now.getTimezoneOffset() * 60_000);
  return local.toISOString().slice(0, 10);
}
