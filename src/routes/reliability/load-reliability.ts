import type { Clinician, ReliabilityStudy } from '$lib/domain';
import { session } from '$lib/ui';

/** The reliability page's loader: the studies on this device (free text left sealed) and the clinicians who may be raters. */
export async function loadReliability(): Promise<{ studies: ReliabilityStudy[]; clinicians: Clinician[] }> {
  const store = await session.open();
  const studies = (await store.reliabilityStudies.list()).map((r) => store.reliabilityStudies.redact(r)).filter((s): s is ReliabilityStudy => s !== null);
  return { studies, clinicians: (await store.clinicians.list()) as Clinician[] };
}
