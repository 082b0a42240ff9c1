import { addDays, isCalendarDate } from './dates';

/*
 * Sample start and end times. A time is `HH:MM` (or `HH:MM:SS`) on the shift's date, or a full
 * `YYYY-MM-DDTHH:MM` for a sample that crosses midnight. Minutes are counted from the shift date's
 * midnight, so a night-shift sample from 22:00 to 2025-03-05T06:00 lasts 480 minutes.
 */

const clock = /^([01]\d|2[0-3]):([0-5]\d)(?::([0-5]\d))?$/;
const dateAndClock = /^(\d{4}-\d{2}-\d{2})[T ]([01]\d|2[0-3]):([0-5]\d)(?::([0-5]\d))?$/;

/**
 * Minutes from the shift date's midnight, or undefined when the text is not a time of that form
 * (or names a day other than the shift date and the next one).
 */
export function minutesFromShiftStart(text: string, shiftDate: string): number | undefined {
  const trimmed = text.trim();
  const short = clock.exec(trimmed);
  if (short) return Number(short[1]) * 60 + Number(short[2]) + Number(short[3] ?? 0) / 60;
  const long = dateAndClock.exec(trimmed);
  if (!long || !isCalendarDate(long[1])) return undefined;
  const dayOffset = long[1] === shiftDate ? 0 : long[1] === addDays(shiftDate, 1) ? 1 : undefined;
  if (dayOffset === undefined) return undefined;
  return dayOffset * 1440 + Number(long[2]) * 60 + Number(long[3]) + Number(long[4] ?? 0) / 60;
}

/** A sample period's duration from its start and end, or why it is not one. */
export function sampleMinutes(
  start: string,
  end: string,
  shiftDate: string,
): { ok: true; minutes: number; startMinute: number; endMinute: number } | { ok: false; field: 'startTime' | 'endTime'; message: string } {
  const startMinute = minutesFromShiftStart(start, shiftDate);
  if (startMinute === undefined) return { ok: false, field: 'startTime', message: `expected a time written HH:MM (or ${shiftDate}T08:00), got "${start}"` };
  const endMinute = minutesFromShiftStart(end, shiftDate);
  if (endMinute === undefined)
    return { ok: false, field: 'endTime', message: `expected a time written HH:MM (or ${addDays(shiftDate, 1)}T06:00 after midnight), got "${end}"` };
  if (endMinute <= startMinute)
    return {
      ok: false,
      field: 'endTime',
      message: `the sample ends (${end.trim()}) before or when it starts (${start.trim()}); for a sample past midnight write the end as ${addDays(shiftDate, 1)}T${end.trim().slice(-5)}`,
    };
  return { ok: true, minutes: endMinute - startMinute, startMinute, endMinute };
}
