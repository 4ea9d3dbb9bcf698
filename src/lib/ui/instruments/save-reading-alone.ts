import { goto } from '$app/navigation';
import type { Assessment } from '$lib/domain';
import { INSTRUMENT_MESSAGES as m } from '../messages/instrument-messages';
import { session } from '../session.svelte';
import { saveReadingAlone, type VisitReading } from '../visit-readings';

/**
 * What every instrument page does with a reading taken outside a visit: saves it as a visit of its own
 * and opens the patient's page ("Assessment saved."). When the record left values out, the page stays
 * and the returned text names them (the rest is saved).
 */
export async function saveReadingAndReturn(
  patientId: string,
  reading: VisitReading,
  context: { setting: Assessment['setting']; position: Assessment['conditions']['position'] },
): Promise<string | null> {
  const store = await session.open();
  await saveReadingAlone(store, patientId, reading, context);
  session.changed();
  if (reading.skipped.length > 0) return m.savedExcept(reading.skipped.join('; '));
  await goto(`/patients/${patientId}?saved=1`);
  return null;
}
