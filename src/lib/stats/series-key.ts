import type { Observation } from '../domain';

/**
 * The one key of a patient's series: `measure|site|side|mode` (mode empty when the measure has
 * none). The patient page, the caseload, the cohort index, the per-patient CSV and the report all
 * group observations by it, so "the same series" means the same thing everywhere.
 */
export function seriesKey(o: Pick<Observation, 'measureCode' | 'siteCode' | 'side' | 'mode'>): string {
  return `${o.measureCode}|${o.siteCode}|${o.side}|${o.mode ?? ''}`;
}
