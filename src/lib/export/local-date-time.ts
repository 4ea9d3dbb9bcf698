/** A moment as a clinician's calendar shows it in one time zone. */
export interface LocalDateTime {
  /** YYYY-MM-DD in the time zone. */
  readonly date: string;
  /** HH:MM (24 h) in the time zone. */
  readonly time: string;
  /** ISO 8601 with the zone's offset at that moment, e.g. 2026-03-01T11:00:00+01:00 (RFC 3339). */
  readonly iso: string;
}

const formatters = new Map<string, Intl.DateTimeFormat>();

/**
 * The local date, time and offset of an instant in an IANA time zone (e.g. "Europe/Berlin"), from
 * the runtime's time-zone data (Intl, ECMA-402); summer time is whatever that data says for the
 * instant. Pure: no clock is read. Cost O(1) after the first call per zone.
 * Throws RangeError for an unknown time zone or a non-finite instant.
 */
export function localDateTime(instantMs: number, timeZone: string): LocalDateTime {
  if (!Number.isFinite(instantMs)) throw new RangeError(`localDateTime: ${instantMs} is not an instant`);
  let format = formatters.get(timeZone);
  if (!format) {
    format = new Intl.DateTimeFormat('en-GB', { timeZone, hourCycle: 'h23', year: 'numeric', month: '2-digit', day: '2-digit', hour: '2-digit', minute: '2-digit', second: '2-digit' });
    formatters.set(timeZone, format);
  }
  const part: Record<string, number> = {};
  for (const p of format.formatToParts(instantMs)) if (p.type !== 'literal') part[p.type] = Number(p.value);
  const pad = (n: number, w = 2) => String(n).padStart(w, '0');
  const wallMs = Date.UTC(part.year!, part.month! - 1, part.day!, part.hour!, part.minute!, part.second!);
  // Whole seconds only: the offset is the wall clock minus the instant.
  const offsetMin = Math.round((wallMs - Math.floor(instantMs / 1000) * 1000) / 60_000);
  const sign = offsetMin < 0 ? '-' : '+';
  const abs = Math.abs(offsetMin);
  const date = `${pad(part.year!, 4)}-${pad(part.month!)}-${pad(part.day!)}`;
  const time = `${pad(part.hour!)}:${pad(part.minute!)}`;
  return { date, time, iso: `${date}T${time}:${pad(part.second!)}${sign}${pad(Math.floor(abs / 60))}:${pad(abs % 60)}` };
}
