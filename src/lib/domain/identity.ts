import * as v from 'valibot';
import { IdSchema, IsoDateSchema, NonEmptyTextSchema, recordBaseEntries, TextSchema } from './record-base';

/**
 * The fields that identify a person. Encrypted at rest as one sealed block (the store never writes
 * them in clear), kept in their own table, never in audit snapshots or de-identified exports.
 */
export const IdentityFieldsSchema = v.strictObject({
  familyName: NonEmptyTextSchema(200),
  givenName: NonEmptyTextSchema(200),
  dateOfBirth: v.nullable(IsoDateSchema),
  contact: v.nullable(TextSchema(500)),
});
export type IdentityFields = v.InferOutput<typeof IdentityFieldsSchema>;

/** An Identity in clear: what the vault returns while unlocked, and what an encrypted bundle carries. */
export const IdentitySchema = v.strictObject({
  ...recordBaseEntries,
  patientId: IdSchema,
  ...IdentityFieldsSchema.entries,
});
export type Identity = v.InferOutput<typeof IdentitySchema>;
