/**
 * How Kinnote writes dates for people, in one place: a day as "3 Dec 2026" and a moment as
 * "3 Dec 2026, 14:05" (en-GB; the order, month words and separators follow the locale, from the
 * runtime's Intl data, ECMA-402). Used by the patient page, the report (page and PDF), the visits
 * list and the saved swing, so one record's dates read the same everywhere. Machine dates (ISO
 * 8601 in files and `datetime` attributes) are not written here.
 */
export interface DateWriter {
  /** A calendar day (YYYY-MM-DD) as it is: read at UTC noon, so no time zone moves it to the day before. */
  day(isoDay: string): string;
  /** A calendar day without its year ("27 Apr"), for a row of weeks under a heading that gives the years. */
  dayInYear(isoDay: string): string;
  /** The day of an instant (ISO 8601 text or epoch ms) in the writer's time zone. */
  dayOf(instant: string | number): string;
  /** An instant with its hour and minute in the writer's time zone. */
  dateTime(instant: string | number): string;
}

const DAY = { day: 'numeric', month: 'short', year: 'numeric' } as const satisfies Intl.DateTimeFormatOptions;
const DATE_TIME = { ...DAY, hour: '2-digit', minute: '2-digit' } as const satisfies Intl.DateTimeFormatOptions;

const epochMs = (instant: string | number): number => (typeof instant === 'number' ? instant : Date.parse(instant));

/**
 * A date writer for a locale (BCP 47, e.g. "en-GB"; undefined: the runtime's) and an IANA time zone
 * for instants (undefined: the runtime's). Pure: reads no clock. Throws RangeError for an unknown
 * locale or time zone; an unreadable date throws RangeError when written ("Invalid time value").
 */
export function dateWriter(options: { readonly locale?: string; readonly timeZone?: string } = {}): DateWriter {
  const calendarDay = new Intl.DateTimeFormat(options.locale, { ...DAY, timeZone: 'UTC' });
  const calendarDayInYear = new Intl.DateTimeFormat(options.locale, { day: 'numeric', month: 'short', timeZone: 'UTC' });
  const localDay = new Intl.DateTimeFormat(options.locale, { ...DAY, timeZone: options.timeZone });
  const localMoment = new Intl.DateTimeFormat(options.locale, { ...DATE_TIME, timeZone: options.timeZone });
  return {
    day: (isoDay) => calendarDay.format(Date.parse(`${isoDay}T12:00:00Z`)),
    dayInYear: (isoDay) => calendarDayInYear.format(Date.parse(`${isoDay}T12:00:00Z`)),
    dayOf: (instant) => localDay.format(epochMs(instant)),
    dateTime: (instant) => localMoment.format(epochMs(instant)),
  };
}
