import type { Measure, Observation } from '../domain';
import { changeVerdict, type ChangeVerdict, type MdcProvenance, type MeasureScale } from './change-verdict';
import { chooseMdc } from './choose-mdc';
import type { OutcomeOptions, OutcomePoint } from './outcome-series';
import type { Baseline } from './select-baseline';

/** The MDC chosen for one comparison, why there is none, and the verdict (null for a baseline point or an earlier one). */
export interface PointJudgement {
  readonly mdc: MdcProvenance | null;
  readonly mdcNote: string | null;
  readonly verdict: ChangeVerdict | null;
}

function measureScale(measure: Measure): MeasureScale {
  return measure.kind === 'ordinal'
    ? { kind: 'ordinal', grades: measure.grades.map((g) => ({ label: g.label, rank: g.rank })) }
    : { kind: 'continuous', unit: measure.unit === 'deg' ? '°' : '', decimals: measure.kind === 'index' ? 2 : 0 };
}

/**
 * The judging step of outcomeSeries: returns a function that judges point i of a series against its
 * baseline. The MDC fits the comparison actually made (chooseMdc over the baseline observation(s)
 * and that point: their instruments and assessors); a baseline point itself is no change, so a
 * verdict needs a later assessment and a direction of improvement.
 */
export function seriesJudge(
  measure: Measure,
  list: readonly Observation[],
  points: readonly OutcomePoint[],
  baseline: Baseline | null,
  options: OutcomeOptions,
): (i: number) => PointJudgement {
  const betterWhen = measure.improvement === 'none' ? null : measure.improvement;
  const scale = measureScale(measure);
  const siteCode = list[0]!.siteCode;
  return (i) => {
    const compared = baseline ? [...baseline.indices, i] : [i];
    const choice = chooseMdc({
      measureCode: measure.code,
      siteCode,
      quantity: null,
      compared: compared.map((k) => ({
        instrument: list[k]!.instrument,
        assessorId: options.assessorByAssessment?.get(list[k]!.assessmentId) ?? list[k]!.clinicianId,
      })),
      ...(options.localMdc ? { localMdc: options.localMdc } : {}),
    });
    const verdict =
      baseline && betterWhen && !baseline.indices.includes(i) && i > Math.min(...baseline.indices)
        ? changeVerdict({ betterWhen, scale, baseline, followUp: points[i]!.value, mdc: choice.mdc })
        : null;
    return { mdc: choice.mdc, mdcNote: choice.note, verdict };
  };
}
