import type { Measure, Observation } from '../domain';

/**
 * The one key of a patient's series: `measure|site|side|mode` (mode empty when the measure has
 * none). The patient page, the caseload, the cohort index, the per-patient CSV and the report all
 * group observations by it, so "the same series" means the same thing everywhere.
 */
export function seriesKey(o: Pick<Observation, 'measureCode' | 'siteCode' | 'side' | 'mode'>): string {
  return `${o.measureCode}|${o.siteCode}|${o.side}|${o.mode ?? ''}`;
}

/**
 * What names one series, with its measure resolved: the fields `seriesKey` reads. The patient page's
 * OutcomeSeries and the cohort audit's CohortSeries both start with it.
 */
export interface SeriesIdentity {
  readonly measure: Measure;
  readonly siteCode: string;
  readonly side: Observation['side'];
  readonly mode: Observation['mode'];
}
