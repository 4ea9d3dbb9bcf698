import * as v from 'valibot';
import { NonEmptyTextSchema, recordBaseEntries, TextSchema } from './record-base';

export const PROFESSIONS = ['physiotherapist', 'occupational-therapist', 'physician', 'nurse', 'other'] as const;

/** A member of the team who enters or assesses. */
export const ClinicianSchema = v.strictObject({
  ...recordBaseEntries,
  displayName: NonEmptyTextSchema(200),
  profession: v.picklist(PROFESSIONS),
  registration: v.nullable(TextSchema(100)),
});
export type Clinician = v.InferOutput<typeof ClinicianSchema>;
