import * as v from 'valibot';
import { ExerciseDoseSchema } from './exercise-dose';
import { IdSchema, IsoDateSchema, NonEmptyTextSchema, recordBaseEntries, TextSchema } from './record-base';

/**
 * One exercise of a home programme: the therapist's words (`name`), the structured dose, and
 * `dosage`, free text kept as it was written before doses were structured (schema version 6).
 * `dosage` is shown as written while `dose` is null, and cleared when the therapist saves a
 * structured dose. Records written before version 6 have no `dose`: it reads as null.
 */
export const HomeProgrammeItemSchema = v.strictObject({
  name: NonEmptyTextSchema(200),
  dosage: TextSchema(200),
  dose: v.optional(v.nullable(ExerciseDoseSchema), null),
});
export type HomeProgrammeItem = v.InferOutput<typeof HomeProgrammeItemSchema>;

/** The patient's home exercise or positioning programme. */
export const HomeProgrammeSchema = v.pipe(
  v.strictObject({
    ...recordBaseEntries,
    patientId: IdSchema,
    title: NonEmptyTextSchema(200),
    items: v.array(HomeProgrammeItemSchema),
    // 0 when no exercise says how often (its dose is free text or has no frequency).
    sessionsPerWeek: v.pipe(v.number(), v.integer(), v.minValue(0), v.maxValue(50)),
    startsOn: IsoDateSchema,
    endsOn: v.nullable(IsoDateSchema),
  }),
  v.forward(v.check((p) => p.endsOn === null || p.endsOn >= p.startsOn, 'must not be before startsOn'), ['endsOn']),
);
export type HomeProgramme = v.InferOutput<typeof HomeProgrammeSchema>;
