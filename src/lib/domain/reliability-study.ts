import * as v from 'valibot';
import { IdSchema, IsoDateTimeSchema, NonEmptyTextSchema, recordBaseEntries, TextSchema } from './record-base';

export const RELIABILITY_DESIGNS = ['intra-rater', 'inter-rater', 'test-retest'] as const;

/**
 * Repeated measurements of one measure per subject, from which the team derives its own SEM and MDC.
 * Subjects are labels (volunteers or patient codes), not identities.
 */
export const ReliabilityStudySchema = v.pipe(
  v.strictObject({
    ...recordBaseEntries,
    title: NonEmptyTextSchema(200),
    measureCode: v.string(),
    siteCode: v.string(),
    design: v.picklist(RELIABILITY_DESIGNS),
    raterIds: v.pipe(v.array(IdSchema), v.minLength(1)),
    trials: v.array(
      v.strictObject({
        subjectLabel: NonEmptyTextSchema(100),
        raterIndex: v.pipe(v.number(), v.integer(), v.minValue(0)),
        trial: v.pipe(v.number(), v.integer(), v.minValue(1)),
        value: v.pipe(v.number(), v.finite()),
      }),
    ),
    notes: v.nullable(TextSchema(5000)),
    /**
     * The MDC the team adopted from this study for its verdicts on this measure and site; null (or,
     * in records written before the field existed, absent) when not adopted.
     */
    adoption: v.optional(
      v.nullable(
        v.strictObject({
          mdc95: v.pipe(v.number(), v.finite(), v.gtValue(0, 'must be above 0')),
          sem: v.pipe(v.number(), v.finite(), v.minValue(0)),
          /** Which ICC form the study's design called for, e.g. "ICC(2,1)". */
          iccForm: NonEmptyTextSchema(40),
          adoptedAt: IsoDateTimeSchema,
        }),
      ),
      null,
    ),
  }),
  v.forward(
    v.check((s) => s.trials.every((t) => t.raterIndex < s.raterIds.length), 'raterIndex must point into raterIds'),
    ['trials'],
  ),
);
export type ReliabilityStudy = v.InferOutput<typeof ReliabilityStudySchema>;
