import * as v from 'valibot';
import { IdSchema, IsoDateSchema, recordBaseEntries } from './record-base';

/** One week's (or day's) log of a home programme: sessions done against sessions planned. */
export const AdherenceEntrySchema = v.pipe(
  v.strictObject({
    ...recordBaseEntries,
    patientId: IdSchema,
    programmeId: IdSchema,
    periodStart: IsoDateSchema,
    sessionsPlanned: v.pipe(v.number(), v.integer(), v.minValue(1), v.maxValue(100)),
    sessionsDone: v.pipe(v.number(), v.integer(), v.minValue(0), v.maxValue(100)),
    reportedBy: v.picklist(['patient', 'carer', 'clinician']),
  }),
);
export type AdherenceEntry = v.InferOutput<typeof AdherenceEntrySchema>;
