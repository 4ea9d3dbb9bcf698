const MS_PER_DAY = 86_400_000;
const DATE_PATTERN = /^\d{4}-\d{2}-\d{2}$/;

/**
 * Day number (days since 1970-01-01, UTC) of a calendar date `YYYY-MM-DD`; NaN when the text is
 * not a real date. Days are UTC calendar days throughout the export, so intervals are whole days.
 */
export function dayOfDate(date: string): number {
  if (!DATE_PATTERN.test(date)) return Number.NaN;
  const ms = Date.parse(`${date}T00:00:00.000Z`);
  if (Number.isNaN(ms) || new Date(ms).toISOString().slice(0, 10) !== date) return Number.NaN;
  return ms / MS_PER_DAY;
}

/** UTC day number of an ISO instant (`…Z`); NaN when it does not parse. */
export function dayOfInstant(instant: string): number {
  return Math.floor(Date.parse(instant) / MS_PER_DAY);
}

/** Calendar date `YYYY-MM-DD` of a UTC day number. */
export function dateOfDay(day: number): string {
  return new Date(day * MS_PER_DAY).toISOString().slice(0, 10);
}
