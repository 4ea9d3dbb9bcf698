import type { Observation } from '$lib/domain';
import { describeValue } from '$lib/ui';

/** Local date-time as the form's date and time fields hold it, e.g. "2026-12-01T09:30". */
export function localNow(): string {
  const offsetMs = new Date().getTimezoneOffset() * 60_000;
  return new Date(Date.now() - offsetMs).toISOString().slice(0, 16);
}

/** "Last time" beside a row: the latest value of its series, with its date. */
export function lastTimeText(o: Observation | undefined): string {
  return o ? `Last time ${describeValue(o.value)} (${new Date(o.takenAt).toLocaleDateString()})` : 'No earlier value';
}
