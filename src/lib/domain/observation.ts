import * as v from 'valibot';
import { IdSchema, IsoDateTimeSchema, recordBaseEntries } from './record-base';

/** What an infinite number is told. */
export const FINITE_MESSAGE = 'must be a finite number';
const finite = () => v.pipe(v.number(), v.finite(FINITE_MESSAGE));

/** Value of an observation, by the measure's kind (the catalogue says which kind a measure has). */
export const ObservationValueSchema = v.variant('kind', [
  /** Ordinal grade: the grade label as written (e.g. "1+") and its rank 0..n−1 for ordering. */
  v.strictObject({ kind: v.literal('ordinal'), grade: v.string(), rank: v.pipe(v.number(), v.integer()) }),
  /** Modified Tardieu: R1 (catch at fast stretch), R2 (slow passive range), quality 0–5, R2 − R1. */
  v.strictObject({
    kind: v.literal('tardieu'),
    r1Deg: finite(),
    r2Deg: finite(),
    quality: v.pipe(v.number(), v.integer()),
    spasticityAngleDeg: finite(),
  }),
  v.strictObject({ kind: v.literal('angle'), angleDeg: finite() }),
  v.strictObject({ kind: v.literal('index'), value: finite() }),
  v.strictObject({ kind: v.literal('count'), value: v.pipe(v.number(), v.integer()) }),
  v.strictObject({ kind: v.literal('rating'), value: v.pipe(v.number(), v.integer()) }),
]);
export type ObservationValue = v.InferOutput<typeof ObservationValueSchema>;

export const OBSERVATION_SIDES = ['left', 'right', 'none'] as const;
export const ROM_MODES = ['active', 'passive'] as const;
export const INSTRUMENTS = ['universal-goniometer', 'inclinometer', 'phone-sensor'] as const;
export type Instrument = (typeof INSTRUMENTS)[number];
export type RomMode = (typeof ROM_MODES)[number];

/**
 * One measure at one site and side in one assessment. `takenAt` repeats the assessment's time so
 * that charts read one index ([patientId+measureCode+takenAt]) without a join. The structure is
 * checked here; the measure-specific rules (site, range, grade) by `checkObservation`.
 */
export const ObservationSchema = v.strictObject({
  ...recordBaseEntries,
  patientId: IdSchema,
  assessmentId: IdSchema,
  takenAt: IsoDateTimeSchema,
  measureCode: v.string(),
  siteCode: v.string(),
  side: v.picklist(OBSERVATION_SIDES),
  mode: v.nullable(v.picklist(ROM_MODES)),
  instrument: v.nullable(v.picklist(INSTRUMENTS)),
  value: ObservationValueSchema,
  traceId: v.nullable(IdSchema),
});
export type Observation = v.InferOutput<typeof ObservationSchema>;
