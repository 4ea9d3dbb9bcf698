// The one way Kinnote writes a day and a moment (domain/date-writer.ts), with a fixed locale and
// time zone. Expected texts are written by hand from the rules named beside each case, not from
// the code under test. Then: the pages that show one patient's dates write them through it only.
import { readFileSync, readdirSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { describe, expect, it } from 'vitest';
import { dateWriter } from '../../../src/lib/domain';
import { reportDayFormatter, reportWeekFormatter } from '../../../src/lib/export';

const ROOT = join(__dirname, '../../..');

describe('dateWriter', () => {
  const madrid = dateWriter({ locale: 'en-GB', timeZone: 'Europe/Madrid' });

  it('writes a calendar day as it is, whatever the time zone', () => {
    // en-GB short date: day, abbreviated month, full year (CLDR en-GB "d MMM y").
    expect(madrid.day('2026-12-03')).toBe('3 Dec 2026');
    // UTC+14 and UTC−11: a calendar day is not an instant, so neither zone moves it.
    expect(dateWriter({ locale: 'en-GB', timeZone: 'Pacific/Kiritimati' }).day('2026-01-01')).toBe('1 Jan 2026');
    expect(dateWriter({ locale: 'en-GB', timeZone: 'Pacific/Pago_Pago' }).day('2026-01-01')).toBe('1 Jan 2026');
    // The locale sets the order (CLDR en-US "MMM d, y").
    expect(dateWriter({ locale: 'en-US' }).day('2026-12-03')).toBe('Dec 3, 2026');
    // Without the year (CLDR en-GB "d MMM"), for the report's row of weeks.
    expect(madrid.dayInYear('2026-04-27')).toBe('27 Apr');
  });

  it('writes the day of an instant in its time zone', () => {
    // 02:00 UTC on 3 Dec is 18:00 on 2 Dec in Los Angeles (PST, UTC−8 in December) and 03:00 on 3 Dec in Madrid (CET, UTC+1).
    expect(dateWriter({ locale: 'en-GB', timeZone: 'America/Los_Angeles' }).dayOf('2026-12-03T02:00:00Z')).toBe('2 Dec 2026');
    expect(madrid.dayOf('2026-12-03T02:00:00Z')).toBe('3 Dec 2026');
    // Epoch milliseconds and ISO text name the same instant.
    expect(madrid.dayOf(Date.UTC(2026, 11, 2, 23, 30))).toBe('3 Dec 2026');
  });

  it('writes a moment with its local hour and minute, across the summer-time change', () => {
    // EU summer time starts on the last Sunday of March at 01:00 UTC (Directive 2000/84/EC): 29 Mar 2026.
    expect(madrid.dateTime('2026-03-29T00:30:00Z')).toBe('29 Mar 2026, 01:30'); // CET, UTC+1
    expect(madrid.dateTime('2026-03-29T01:30:00Z')).toBe('29 Mar 2026, 03:30'); // CEST, UTC+2
    expect(madrid.dateTime(Date.UTC(2026, 2, 29, 1, 30))).toBe('29 Mar 2026, 03:30');
  });

  it('refuses what it cannot write', () => {
    expect(() => dateWriter({ timeZone: 'Mars/Olympus_Mons' })).toThrow(RangeError);
    expect(() => madrid.day('03/12/2026')).toThrow(RangeError);
    expect(() => madrid.dateTime('not a date')).toThrow(RangeError);
  });

  it('is the report\'s day format too', () => {
    for (const day of ['2026-12-03', '2025-02-28', '2024-02-29']) {
      expect(reportDayFormatter('en-GB')(day)).toBe(dateWriter({ locale: 'en-GB' }).day(day));
      expect(reportWeekFormatter('en-GB')(day)).toBe(dateWriter({ locale: 'en-GB' }).dayInYear(day));
    }
  });
});

/** Files that show a patient's dates: the patient page (its visits list and events), the report, the saved swing, the progress chart. */
const DATE_PAGES = ['src/routes/patients/[id]', 'src/lib/charts/ProgressChart.svelte', 'src/lib/export/report-wording.ts'];
/** Not moved yet (other work): the visit form, the home-log timeline. */
const DATE_PAGES_NOT_YET = ['src/routes/patients/[id]/assess', 'src/routes/patients/[id]/programme', 'src/routes/patients/[id]/HomeLogTimeline.svelte'];

function sources(path: string): string[] {
  if (DATE_PAGES_NOT_YET.some((p) => path === join(ROOT, p))) return [];
  if (!statSync(path).isDirectory()) return /\.(svelte|ts)$/.test(path) ? [path] : [];
  return readdirSync(path).flatMap((name) => sources(join(path, name)));
}

/** Places that build their own date format (a DateTimeFormat with options, toLocale…String) instead of using dateWriter. */
export function ownDateFormats(text: string): string[] {
  const found: string[] = [];
  for (const [n, line] of text.split('\n').entries()) {
    if (/Intl\.DateTimeFormat\([^)]|toLocale(?:Date|Time)?String\(/.test(line)) found.push(`${n + 1}: ${line.trim()}`);
  }
  return found;
}

describe('one date format on the patient page and the report', () => {
  it('finds a page that builds its own date format', () => {
    expect(ownDateFormats("const f = new Intl.DateTimeFormat(undefined, { day: 'numeric' });")).toHaveLength(1);
    expect(ownDateFormats('const t = new Date(x).toLocaleString();')).toHaveLength(1);
    // Asking the runtime for its time zone formats nothing.
    expect(ownDateFormats('const zone = Intl.DateTimeFormat().resolvedOptions().timeZone;')).toEqual([]);
  });

  it('has no date format of its own in those files', () => {
    const own: string[] = [];
    for (const part of DATE_PAGES) for (const file of sources(join(ROOT, part))) for (const f of ownDateFormats(readFileSync(file, 'utf8'))) own.push(`${relative(ROOT, file)}:${f}`);
    expect(own, 'date formats written outside domain/date-writer.ts').toEqual([]);
  });
});
