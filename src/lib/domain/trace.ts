import * as v from 'valibot';
import { IdSchema, IsoDateTimeSchema, NonEmptyTextSchema, recordBaseEntries } from './record-base';

export const TRACE_KINDS = ['pendulum-knee-angle', 'inclinometer-angle', 'other'] as const;

/** One sampled signal column; samples flow unchanged as a Float64Array from sensor to store to chart. */
export const TraceChannelSchema = v.strictObject({
  name: NonEmptyTextSchema(100),
  /** UCUM unit of the samples, e.g. "deg", "rad", "rad/s". */
  unit: NonEmptyTextSchema(40),
  samples: v.pipe(
    v.instance(Float64Array),
    v.check((samples) => samples.every(Number.isFinite), 'every sample must be a finite number (no NaN or Infinity)'),
  ),
});

/** Raw samples behind an observation (e.g. a pendulum test), stored as typed-array columns. */
export const TraceSchema = v.pipe(
  v.strictObject({
    ...recordBaseEntries,
    patientId: IdSchema,
    assessmentId: v.nullable(IdSchema),
    kind: v.picklist(TRACE_KINDS),
    startedAt: IsoDateTimeSchema,
    sampleRateHz: v.pipe(v.number(), v.finite(), v.gtValue(0, 'must be above 0'), v.maxValue(100000)),
    channels: v.pipe(v.array(TraceChannelSchema), v.minLength(1, 'needs at least one channel')),
  }),
  v.forward(
    v.check(
      (t) => t.channels.every((c) => c.samples.length === t.channels[0]!.samples.length),
      'every channel must hold the same number of samples',
    ),
    ['channels'],
  ),
);
export type Trace = v.InferOutput<typeof TraceSchema>;
