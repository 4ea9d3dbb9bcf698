import { adoptedLocalMdc, type AdoptableStudy, type LocalMdc } from '$lib/stats';
import type { KinnoteStore } from '$lib/store';

/** MDCs the team adopted from its own reliability studies on this device (see adoptedLocalMdc). */
export async function localMdcList(store: KinnoteStore): Promise<LocalMdc[]> {
  const studies: AdoptableStudy[] = [];
  for (const row of await store.reliabilityStudies.list()) {
    const study = store.reliabilityStudies.redact(row);
    if (study) studies.push(study);
  }
  return adoptedLocalMdc(studies);
}
