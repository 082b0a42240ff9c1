import type { Clock } from '../clock';

/*
 * Calendar dates (`YYYY-MM-DD`, no time zone) as the shift results and plans use them. Arithmetic
 * runs on UTC midnights, so no daylight-saving change can skip or repeat a day.
 */

const dayMs = 86_400_000;

/** Today's date in UTC. */
export function today(clock: Clock): string {
  return clock.now().toISOString().slice(0, 10);
}

/**
 * The latest date that is not yet in the future anywhere on Earth (UTC+14). A shift date after it
 * is refused; checking against this rather than UTC today never refuses a shift worked "today" in
 * a time zone ahead of UTC.
 */
export function latestPossibleDate(clock: Clock): string {
  return new Date(clock.now().getTime() + 14 * 3_600_000).toISOString().slice(0, 10);
}

/** `date` plus `days` (may be negative). */
export function addDays(date: string, days: number): string {
  return new Date(Date.parse(`${date}T00:00:00Z`) + days * dayMs).toISOString().slice(0, 10);
}

/** Saturday or Sunday. */
export function isWeekend(date: string): boolean {
  const day = new Date(`${date}T00:00:00Z`).getUTCDay();
  return day === 0 || day === 6;
}

/** English weekday name of a date (for field sheets). */
export function weekdayOf(date: string): string {
  return ['Sunday', 'Monday', 'Tuesday', 'Wednesday', 'Thursday', 'Friday', 'Saturday'][new Date(`${date}T00:00:00Z`).getUTCDay()];
}

/** Every date from `start` to `end`, both included. */
export function eachDate(start: string, end: string): string[] {
  const dates: string[] = [];
  for (let date = start; date <= end; date = addDays(date, 1)) dates.push(date);
  return dates;
}

/** Whether a real calendar date is written `YYYY-MM-DD` (2025-02-30 is not). */
export function isCalendarDate(text: string): boolean {
  if (!/^\d{4}-\d{2}-\d{2}$/.test(text)) return false;
  const parsed = new Date(`${text}T00:00:00Z`);
  return !Number.isNaN(parsed.getTime()) && parsed.toISOString().slice(0, 10) === text;
}
