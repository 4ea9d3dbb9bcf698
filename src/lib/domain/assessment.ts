import * as v from 'valibot';
import { IdSchema, IsoDateTimeSchema, recordBaseEntries, TextSchema } from './record-base';

export const ASSESSMENT_SETTINGS = ['clinic', 'home', 'remote'] as const;
export const POSITIONS = ['supine', 'prone', 'side-lying', 'sitting', 'standing', 'other'] as const;

/** Conditions that change spasticity readings, so that sessions are compared like with like. */
export const AssessmentConditionsSchema = v.strictObject({
  position: v.nullable(v.picklist(POSITIONS)),
  /** Minutes since the last dose of antispastic medication; null when none or unknown. */
  minutesSinceMedication: v.nullable(v.pipe(v.number(), v.integer(), v.minValue(0), v.maxValue(60 * 24 * 7))),
  /** Pain at the time of assessment, 0–10 numeric rating; null when not asked. */
  painNrs: v.nullable(v.pipe(v.number(), v.integer(), v.minValue(0), v.maxValue(10))),
});

/**
 * One session of measurement. `assessorId` is the clinician who examined (the base `clinicianId`
 * is whoever typed the record). `notes` is protected free text, encrypted at rest.
 */
export const AssessmentSchema = v.strictObject({
  ...recordBaseEntries,
  patientId: IdSchema,
  assessorId: IdSchema,
  performedAt: IsoDateTimeSchema,
  setting: v.picklist(ASSESSMENT_SETTINGS),
  conditions: AssessmentConditionsSchema,
  notes: v.nullable(TextSchema(10000)),
});
export type Assessment = v.InferOutput<typeof AssessmentSchema>;
