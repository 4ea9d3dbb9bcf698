import * as v from 'valibot';
import { NonEmptyTextSchema, recordBaseEntries, TextSchema } from './record-base';

/** A tablet, phone or laptop on which entries are made; bundles from several devices merge by id. */
export const DeviceSchema = v.strictObject({
  ...recordBaseEntries,
  name: NonEmptyTextSchema(200),
  platform: v.nullable(TextSchema(200)),
});
export type Device = v.InferOutput<typeof DeviceSchema>;
