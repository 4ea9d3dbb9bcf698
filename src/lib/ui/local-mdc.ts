import type { MdcProvenance } from '$lib/stats';
import type { KinnoteStore } from '$lib/store';

/**
 * MDCs the team adopted from its own reliability studies, keyed `measureCode|siteCode`. The latest
 * adoption per measure and site wins; a withdrawn adoption (null) leaves the catalogue's reference.
 */
export async function localMdcMap(store: KinnoteStore): Promise<Map<string, MdcProvenance>> {
  const map = new Map<string, MdcProvenance & { at: string }>();
  for (const row of await store.reliabilityStudies.list()) {
    const study = store.reliabilityStudies.redact(row);
    const adoption = study?.adoption;
    if (!study || !adoption) continue;
    const key = `${study.measureCode}|${study.siteCode}`;
    const previous = map.get(key);
    if (previous && previous.at >= adoption.adoptedAt) continue;
    map.set(key, {
      value: adoption.mdc95,
      source: 'local',
      citation: `${study.title}, ${adoption.iccForm}, adopted ${adoption.adoptedAt.slice(0, 10)}`,
      at: adoption.adoptedAt,
    });
  }
  return new Map([...map].map(([k, { at: _at, ...mdc }]) => [k, mdc]));
}
