// Calendar days as `YYYY-MM-DD` text. Arithmetic goes through UTC midnight so that a day is
// always 86,400,000 ms (no daylight-saving jumps); the text itself carries no time zone.
const MS_PER_DAY = 86_400_000;
const DAY_PATTERN = /^\d{4}-\d{2}-\d{2}$/;

/** UTC day number (days since 1970-01-01) of `day`. Throws RangeError when `day` is not a real date. */
export function dayNumber(day: string): number {
  const ms = DAY_PATTERN.test(day) ? Date.parse(`${day}T00:00:00.000Z`) : Number.NaN;
  if (Number.isNaN(ms) || new Date(ms).toISOString().slice(0, 10) !== day) throw new RangeError(`not a calendar date: ${JSON.stringify(day)}`);
  return ms / MS_PER_DAY;
}

/** The calendar date of a UTC day number. */
function dayFromNumber(n: number): string {
  return new Date(n * MS_PER_DAY).toISOString().slice(0, 10);
}

/** `day` moved by `count` days (negative goes back). */
export function addDays(day: string, count: number): string {
  return dayFromNumber(dayNumber(day) + count);
}

/**
 * The Monday that starts the week holding `day`: weeks run Monday to Sunday as in ISO 8601
 * (1970-01-01, day number 0, was a Thursday, hence the offset of 3).
 */
export function weekStartOf(day: string): string {
  const n = dayNumber(day);
  const weekday = (((n + 3) % 7) + 7) % 7; // 0 = Monday … 6 = Sunday
  return dayFromNumber(n - weekday);
}

/** The local calendar date of an instant on this device (for "today" in the page). */
export function localDayOf(instantMs: number, timezoneOffsetMin: number): string {
  return new Date(instantMs - timezoneOffsetMin * 60_000).toISOString().slice(0, 10);
}
