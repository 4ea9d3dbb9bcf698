import { dateWriter } from '$lib/domain';
import type { VisitOutcome } from './home-log';

/**
 * The words of the patient page's home-log timeline (HomeLogTimeline, HomeLogTables), in one typed
 * catalogue like the programme's (ui/programme/therapist-messages.ts). English only for now: a second
 * language is one more object of this shape. Messages with numbers are functions (plurals and word
 * order per language).
 */
const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;
// Dates as the rest of the patient page writes them (domain/date-writer.ts).
const dates = dateWriter();
const percent = (share: number) => (Number.isNaN(share) ? 'nothing planned' : `${Math.round(100 * share)} %`);

export const HOME_LOG_MESSAGES = {
  title: 'Home log beside the measured outcomes',
  empty: "No home log yet: adherence and the patient's own spasm ratings appear here when a report from the patient's phone is imported.",
  lede: 'One time axis, oldest on the left: what was measured at each visit, weekly adherence to the home programme, and the patient’s own spasm ratings.',
  /** A date on the axis and in the tables, from a day number (days since 1970-01-01, UTC). */
  day: (dayNumber: number) => dates.day(new Date(dayNumber * 86_400_000).toISOString().slice(0, 10)),
  outcomesRow: 'Measured at each visit: ▲ measures better, ▼ measures worse than when first measured, by at least the MDC',
  adherenceRow: 'Adherence per week: bar height = share of planned sessions done',
  spasmRow: 'Spasm frequency, the patient’s own rating: Penn 0–4, higher = more spasms',
  /** The text alternative of the drawing (the tables below hold every value). */
  description: (from: string, to: string, visits: readonly VisitOutcome[], weeks: number, ratings: number) => {
    const better = visits.filter((v) => v.better > 0).length;
    const worse = visits.filter((v) => v.worse > 0).length;
    return (
      `From ${from} to ${to}: ${plural(visits.length, 'visit', 'visits')} with measured outcomes ` +
      `(${plural(better, 'visit', 'visits')} with a measure better and ${plural(worse, 'visit', 'visits')} with a measure worse than when first measured, by at least the MDC), ` +
      `${plural(weeks, 'week', 'weeks')} of home-programme adherence, ${plural(ratings, 'day', 'days')} with the patient’s own spasm rating. The tables below give every value.`
    );
  },
  tables: 'The same as tables',
  visitsCaption: 'Visits: each measure better or worse than when first measured by at least the MDC, within it, or with no MDC known',
  visitColumn: 'Visit',
  measuresColumn: 'Measures',
  betterColumn: '▲ Better',
  worseColumn: '▼ Worse',
  withinColumn: 'Within MDC',
  noMdcColumn: 'No MDC',
  firstTimeColumn: 'First measured',
  weeksCaption: 'Home-programme adherence per week',
  weekColumn: 'Week from',
  doneColumn: 'Sessions done',
  shareColumn: 'Share',
  doneOfPlanned: (done: number, planned: number) => `${done} of ${planned}`,
  share: percent,
  ratingsCaption: 'The patient’s own spasm ratings',
  ratingDayColumn: 'Day',
  pennColumn: 'Frequency (Penn 0–4)',
  severityColumn: 'Severity (0–10)',
  notRated: '–',
  /** The marks drawn above and below a visit's tick (the tables say the same in words). */
  betterMark: (n: number) => `▲${n}`,
  worseMark: (n: number) => `▼${n}`,
} as const;
