import * as v from 'valibot';
import { isUuidV7 } from './uuid-v7';

const ISO_DATE = /^(\d{4})-(\d{2})-(\d{2})$/;
const DAYS_IN_MONTH = [31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];

/** Whether the day exists in the (proleptic) Gregorian calendar, as ECMAScript's Date counts. */
function isRealDate(year: number, month: number, day: number): boolean {
  if (month < 1 || month > 12 || day < 1) return false;
  const leap = (year % 4 === 0 && year % 100 !== 0) || year % 400 === 0;
  return day <= (month === 2 && leap ? 29 : DAYS_IN_MONTH[month - 1]!);
}

/** What a date-time in another form is told. */
export const ISO_DATE_TIME_MESSAGE = 'must be a UTC date-time like 2025-03-01T09:30:00.000Z';
/**
 * UTC instant as `YYYY-MM-DDTHH:mm:ss.sssZ` (the form of Date.prototype.toISOString). One fixed
 * form makes string order equal time order, which merging by updatedAt relies on.
 */
export const IsoDateTimeSchema = v.pipe(v.string(), v.check(isIsoDateTime, ISO_DATE_TIME_MESSAGE));

/**
 * True when `s` is a real UTC instant in the one form IsoDateTimeSchema accepts (the form
 * Date.prototype.toISOString writes for years 0000-9999). Read by character codes, without a
 * regular expression's match array or a Date: records are checked by the thousand (the bulk path).
 */
export function isIsoDateTime(s: string): boolean {
  if (s.length !== 24) return false;
  for (let i = 0; i < 24; i++) {
    const c = s.charCodeAt(i);
    const wanted = DATE_TIME_SEPARATORS[i];
    if (wanted === undefined ? c < 48 || c > 57 : c !== wanted) return false;
  }
  return isRealDate(digits(s, 0, 4), digits(s, 5, 2), digits(s, 8, 2)) && digits(s, 11, 2) < 24 && digits(s, 14, 2) < 60 && digits(s, 17, 2) < 60;
}

function digits(s: string, from: number, count: number): number {
  let n = 0;
  for (let i = from; i < from + count; i++) n = n * 10 + s.charCodeAt(i) - 48;
  return n;
}

/** The fixed characters of YYYY-MM-DDTHH:mm:ss.sssZ by position; every other position is a digit 0-9. */
const DATE_TIME_SEPARATORS: readonly (number | undefined)[] = Array.from('0000-00-00T00:00:00.000Z', (c) => (c === '0' ? undefined : c.charCodeAt(0)));

/** Calendar date `YYYY-MM-DD` (no time zone: a day in the clinician's calendar). */
export const IsoDateSchema = v.pipe(
  v.string(),
  v.check((s) => {
    const m = ISO_DATE.exec(s);
    return m !== null && isRealDate(+m[1]!, +m[2]!, +m[3]!);
  }, 'must be a date like 2025-03-01'),
);

/** A UUIDv7 record id. */
/** What an id in another form is told. */
export const ID_MESSAGE = 'must be a UUIDv7 id';
export const IdSchema = v.pipe(v.string(), v.check(isUuidV7, ID_MESSAGE));

/** Free text with a sane upper bound (keeps a pasted document out of a single field). */
export const TextSchema = (maxLength = 2000) => v.pipe(v.string(), v.maxLength(maxLength, `must be at most ${maxLength} characters`));
export const NonEmptyTextSchema = (maxLength = 200) =>
  v.pipe(v.string(), v.trim(), v.minLength(1, 'must not be empty'), v.maxLength(maxLength, `must be at most ${maxLength} characters`));

/**
 * Fields every record carries, so that bundles from several devices merge by id and a later
 * sync service can keep the same rows: time-ordered id, stamps, author, device and tombstone.
 */
export const recordBaseEntries = {
  id: IdSchema,
  createdAt: IsoDateTimeSchema,
  updatedAt: IsoDateTimeSchema,
  deviceId: IdSchema,
  clinicianId: IdSchema,
  deleted: v.boolean(),
} as const;

export interface RecordBase {
  readonly id: string;
  readonly createdAt: string;
  readonly updatedAt: string;
  readonly deviceId: string;
  readonly clinicianId: string;
  readonly deleted: boolean;
}

/** The names of the base fields, which the store stamps and callers never supply. */
export const RECORD_BASE_FIELDS = ['id', 'createdAt', 'updatedAt', 'deviceId', 'clinicianId', 'deleted'] as const;

/** A record's own fields, without the base fields the store stamps. */
export type RecordInput<T extends RecordBase> = Omit<T, (typeof RECORD_BASE_FIELDS)[number]>;

export type Side = 'left' | 'right';
export const SIDES = ['left', 'right'] as const satisfies readonly Side[];
