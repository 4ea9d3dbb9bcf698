import * as v from 'valibot';
import { IdSchema, IsoDateSchema, NonEmptyTextSchema, recordBaseEntries, TextSchema } from './record-base';

/** The patient's home exercise or positioning programme. */
export const HomeProgrammeSchema = v.pipe(
  v.strictObject({
    ...recordBaseEntries,
    patientId: IdSchema,
    title: NonEmptyTextSchema(200),
    items: v.array(v.strictObject({ name: NonEmptyTextSchema(200), dosage: TextSchema(200) })),
    sessionsPerWeek: v.pipe(v.number(), v.integer(), v.minValue(1), v.maxValue(50)),
    startsOn: IsoDateSchema,
    endsOn: v.nullable(IsoDateSchema),
  }),
  v.forward(v.check((p) => p.endsOn === null || p.endsOn >= p.startsOn, 'must not be before startsOn'), ['endsOn']),
);
export type HomeProgramme = v.InferOutput<typeof HomeProgrammeSchema>;
