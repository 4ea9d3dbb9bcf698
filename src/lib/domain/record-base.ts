import * as v from 'valibot';
import { isUuidV7 } from './uuid-v7';

const ISO_DATE_TIME = /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2}):(\d{2})\.(\d{3})Z$/;
const ISO_DATE = /^(\d{4})-(\d{2})-(\d{2})$/;

function isRealDate(year: number, month: number, day: number): boolean {
  const d = new Date(Date.UTC(year, month - 1, day));
  return d.getUTCFullYear() === year && d.getUTCMonth() === month - 1 && d.getUTCDate() === day;
}

/**
 * UTC instant as `YYYY-MM-DDTHH:mm:ss.sssZ` (the form of Date.prototype.toISOString). One fixed
 * form makes string order equal time order, which merging by updatedAt relies on.
 */
/** What a date-time in another form is told. */
export const ISO_DATE_TIME_MESSAGE = 'must be a UTC date-time like 2025-03-01T09:30:00.000Z';
export const IsoDateTimeSchema = v.pipe(v.string(), v.check(isIsoDateTime, ISO_DATE_TIME_MESSAGE));

/** The last string found to be a valid date-time: records written together share their stamps. */
let lastIsoDateTime = '';

/** True when `s` is a real UTC instant in the one form IsoDateTimeSchema accepts. */
export function isIsoDateTime(s: string): boolean {
  if (s === lastIsoDateTime) return true;
  const m = ISO_DATE_TIME.exec(s);
  if (!m) return false;
  const ok = isRealDate(+m[1]!, +m[2]!, +m[3]!) && +m[4]! < 24 && +m[5]! < 60 && +m[6]! < 60;
  if (ok) lastIsoDateTime = s;
  return ok;
}

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
