import * as v from 'valibot';
import { IdSchema, IsoDateSchema, recordBaseEntries } from './record-base';

const rating = (max: number) => v.nullable(v.pipe(v.number(), v.integer(), v.minValue(0), v.maxValue(max)));

/**
 * The patient's own report for one day: Penn spasm frequency (0–4), spasm severity, stiffness and
 * pain (0–10 numeric ratings). Null means not asked.
 */
export const SelfReportSchema = v.strictObject({
  ...recordBaseEntries,
  patientId: IdSchema,
  reportedOn: IsoDateSchema,
  spasmFrequencyPenn: rating(4),
  spasmSeverityNrs: rating(10),
  stiffnessNrs: rating(10),
  painNrs: rating(10),
});
export type SelfReport = v.InferOutput<typeof SelfReportSchema>;
