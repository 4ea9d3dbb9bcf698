import { MEASURE_CATALOGUE, findMeasure, findSite, type Measure, type Observation } from '../domain';
import { changeVerdict, type ChangeVerdict, type MdcProvenance, type MeasureScale } from './change-verdict';
import { chooseMdc, type LocalMdc } from './choose-mdc';
import { seriesKey } from './series-key';
import { mannKendall, type MannKendall } from './mann-kendall';
import { olsTrend } from './ols-trend';
import { selectBaseline, type Baseline, type BaselineRule } from './select-baseline';
import { theilSen } from './theil-sen';

const dayMs = 86_400_000;

/** One point of a measure's series: time, the value charted (grade rank for ordinal scales), its text. */
export interface OutcomePoint {
  readonly timeMs: number;
  readonly value: number;
  readonly text: string;
  readonly observationId: string;
  readonly assessmentId: string;
  readonly clinicianId: string;
}

export interface OutcomeTrend {
  /** Least squares for continuous measures; Theil–Sen (with Mann–Kendall) for ordinal grades. */
  readonly method: 'least-squares' | 'theil-sen';
  readonly slopePer30Days: number;
  readonly slopeCi95Per30Days: readonly [number, number];
  /** Value at t0Ms and slope per day, for drawing. */
  readonly intercept: number;
  readonly t0Ms: number;
  readonly slopePerDay: number;
  /** R² of the least-squares line; null for Theil–Sen. */
  readonly rSquared: number | null;
  readonly mannKendall: MannKendall | null;
}

/** Everything the patient page and its chart show for one measure at one site and side. */
export interface OutcomeSeries {
  /** measure|site|side|mode, stable across sessions. */
  readonly key: string;
  readonly measure: Measure;
  readonly siteCode: string;
  readonly side: Observation['side'];
  readonly mode: Observation['mode'];
  /** e.g. "Left elbow flexors · Modified Ashworth Scale". */
  readonly title: string;
  /** What is charted, e.g. "Spasticity angle R2 − R1" for Tardieu. */
  readonly valueLabel: string;
  readonly unitLabel: string;
  readonly ordinalLabels: readonly string[] | null;
  readonly betterWhen: 'lower' | 'higher' | null;
  readonly points: readonly OutcomePoint[];
  readonly baseline: Baseline | null;
  readonly latest: OutcomePoint;
  readonly verdict: ChangeVerdict | null;
  readonly mdc: MdcProvenance | null;
  /** Why there is no MDC; null when there is one. */
  readonly mdcNote: string | null;
  /** Each point's change from baseline judged by the same rule (null for baseline points and earlier ones). */
  readonly judgements: readonly (ChangeVerdict | null)[];
  readonly trend: OutcomeTrend | null;
}

export interface OutcomeOptions {
  readonly baselineRule: { readonly kind: 'first' } | { readonly kind: 'meanOfFirstTwo' } | { readonly kind: 'lastBeforeEvent'; readonly eventMs: number };
  /** MDCs the team adopted from its own reliability studies (see chooseMdc). */
  readonly localMdc?: readonly LocalMdc[];
  /**
   * The examining clinician of each assessment (Assessment.assessorId) by assessment id, for the rater
   * design of a comparison; without it an observation's own clinicianId stands in.
   */
  readonly assessorByAssessment?: ReadonlyMap<string, string>;
}

function pointValue(measure: Measure, obs: Observation): { value: number; text: string } {
  const v = obs.value;
  switch (v.kind) {
    case 'ordinal':
      return { value: v.rank, text: v.grade };
    case 'tardieu':
      return { value: v.spasticityAngleDeg, text: `R2 − R1 ${v.spasticityAngleDeg}° (R1 ${v.r1Deg}°, R2 ${v.r2Deg}°, quality ${v.quality})` };
    case 'angle':
      return { value: v.angleDeg, text: `${v.angleDeg}°` };
    default:
      return { value: v.value, text: `${v.value}${measure.unit === 'deg' ? '°' : ''}` };
  }
}

function unitLabel(measure: Measure): string {
  return measure.unit === 'deg' ? '°' : '';
}

function capitalise(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}

/** Label of one series, e.g. "Left knee extensors (quadriceps) · Modified Ashworth Scale". */
export function seriesTitle(measure: Measure, siteCode: string, side: Observation['side'], mode: Observation['mode']): string {
  const site = findSite(measure, siteCode)?.label ?? siteCode;
  const where = side === 'none' ? site : `${capitalise(side)} ${site.charAt(0).toLowerCase()}${site.slice(1)}`;
  return `${where}${mode ? ` (${mode})` : ''} · ${measure.label}`;
}

/**
 * Groups a patient's observations into series (measure, site, side, ROM mode), and for each gives
 * the baseline (by `baselineRule`), the latest value, the change verdict against the MDC chosen by
 * chooseMdc (the one rule, shared with the cohort and every export) and a trend (least squares per 30 days; Theil–Sen with Mann–Kendall for ordinal grades).
 * Tombstoned observations are left out. Series are ordered by measure catalogue order, then title.
 *
 * @example
 * const series = outcomeSeries(patientObservations, { baselineRule: { kind: 'first' } });
 * series[0].points; // one point per assessment, each with its change from baseline and verdict against the MDC
 */
export function outcomeSeries(observations: readonly Observation[], options: OutcomeOptions): OutcomeSeries[] {
  return buildSeries(observations, options, 'full');
}

/**
 * Each series' title and latest verdict only (what the caseload's improved/worsened flags need),
 * by the very code outcomeSeries runs, in the same order, without judging every earlier point and
 * without the trend (Theil–Sen and Mann–Kendall cost O(n²) in the series length). Cost: a sort
 * and one verdict per series. `verdict` is always the `verdict` outcomeSeries gives that series;
 * `mdcNote` is why there is no MDC (the catalogue's reason), as outcomeSeries gives it.
 */
export function latestVerdicts(
  observations: readonly Observation[],
  options: OutcomeOptions,
): { readonly key: string; readonly title: string; readonly verdict: ChangeVerdict | null; readonly mdcNote: string | null }[] {
  return buildSeries(observations, options, 'latest').map(({ key, title, verdict, mdcNote }) => ({ key, title, verdict, mdcNote }));
}

/** 'latest': judgements left empty and trend null (only latestVerdicts sees such series). */
function buildSeries(observations: readonly Observation[], options: OutcomeOptions, detail: 'full' | 'latest'): OutcomeSeries[] {
  const groups = new Map<string, Observation[]>();
  for (const obs of observations) {
    if (obs.deleted || !findMeasure(obs.measureCode)) continue;
    const key = seriesKey(obs);
    const list = groups.get(key);
    if (list) list.push(obs);
    else groups.set(key, [obs]);
  }
  const result: OutcomeSeries[] = [];
  for (const [key, list] of groups) {
    const measure = findMeasure(list[0]!.measureCode) as Measure;
    list.sort((a, b) => (a.takenAt < b.takenAt ? -1 : a.takenAt > b.takenAt ? 1 : a.id < b.id ? -1 : 1));
    const points: OutcomePoint[] = list.map((obs) => ({
      timeMs: Date.parse(obs.takenAt),
      ...pointValue(measure, obs),
      observationId: obs.id,
      assessmentId: obs.assessmentId,
      clinicianId: obs.clinicianId,
    }));
    const first = list[0]!;
    const ordinal = measure.kind === 'ordinal';
    const timesDay = new Float64Array(points.length);
    const values = new Float64Array(points.length);
    const t0 = points[0]!.timeMs;
    points.forEach((p, i) => {
      timesDay[i] = (p.timeMs - t0) / dayMs;
      values[i] = p.value;
    });
    const rule: BaselineRule =
      options.baselineRule.kind === 'lastBeforeEvent'
        ? { kind: 'lastBeforeEvent', eventDay: (options.baselineRule.eventMs - t0) / dayMs }
        : options.baselineRule;
    const baseline = selectBaseline(timesDay, values, rule, ordinal);
    const latest = points[points.length - 1]!;
    const betterWhen = measure.improvement === 'none' ? null : measure.improvement;

    const scale: MeasureScale =
      measure.kind === 'ordinal'
        ? { kind: 'ordinal', grades: measure.grades.map((g) => ({ label: g.label, rank: g.rank })) }
        : { kind: 'continuous', unit: measure.unit === 'deg' ? '°' : '', decimals: measure.kind === 'index' ? 2 : 0 };
    // Each later point judged against the baseline; the MDC fits the comparison actually made
    // (the baseline observation(s) and that point: their instruments and assessors).
    const judge = (i: number): { mdc: MdcProvenance | null; mdcNote: string | null; verdict: ChangeVerdict | null } => {
      const compared = baseline ? [...baseline.indices, i] : [i];
      const choice = chooseMdc({
        measureCode: measure.code,
        siteCode: first.siteCode,
        quantity: null,
        compared: compared.map((k) => ({
          instrument: list[k]!.instrument,
          assessorId: options.assessorByAssessment?.get(list[k]!.assessmentId) ?? list[k]!.clinicianId,
        })),
        ...(options.localMdc ? { localMdc: options.localMdc } : {}),
      });
      // A baseline point itself is no change: a verdict needs a later assessment.
      const verdict =
        baseline && betterWhen && !baseline.indices.includes(i) && i > Math.min(...baseline.indices)
          ? changeVerdict({ betterWhen, scale, baseline, followUp: points[i]!.value, mdc: choice.mdc })
          : null;
      return { mdc: choice.mdc, mdcNote: choice.note, verdict };
    };
    const last = judge(points.length - 1);
    const judgements = detail === 'full' ? points.map((_, i) => (i === points.length - 1 ? last : judge(i)).verdict) : [];
    const { mdc, mdcNote } = last;
    const title = seriesTitle(measure, first.siteCode, first.side, first.mode);
    const verdict = last.verdict;

    let trend: OutcomeTrend | null = null;
    if (detail === 'full' && points.length >= 3 && timesDay[timesDay.length - 1]! > timesDay[0]!) {
      if (ordinal) {
        const ts = theilSen(timesDay, values);
        let mk: MannKendall | null;
        try {
          mk = mannKendall(timesDay, values);
        } catch {
          mk = null; // tied times (two assessments at the same instant): no trend test
        }
        trend = {
          method: 'theil-sen',
          slopePer30Days: ts.slopePer30Days,
          slopeCi95Per30Days: ts.slopeCiPer30Days,
          intercept: ts.intercept,
          t0Ms: t0,
          slopePerDay: ts.slopePer30Days / 30,
          rSquared: null,
          mannKendall: mk,
        };
      } else {
        const ols = olsTrend(timesDay, values);
        trend = {
          method: 'least-squares',
          slopePer30Days: ols.slopePer30Days,
          slopeCi95Per30Days: ols.slopeCi95Per30Days,
          intercept: ols.intercept,
          t0Ms: t0,
          slopePerDay: ols.slopePer30Days / 30,
          rSquared: ols.rSquared,
          mannKendall: null,
        };
      }
    }
    result.push({
      key,
      measure,
      siteCode: first.siteCode,
      side: first.side,
      mode: first.mode,
      title,
      valueLabel: measure.kind === 'tardieu' ? 'Spasticity angle R2 − R1' : measure.label,
      unitLabel: unitLabel(measure),
      ordinalLabels: measure.kind === 'ordinal' ? measure.grades.map((g) => g.label) : null,
      betterWhen,
      points,
      baseline,
      latest,
      verdict,
      mdc,
      mdcNote,
      judgements,
      trend,
    });
  }
  const rank = (m: Measure) => MEASURE_CATALOGUE.indexOf(m);
  return result.sort((a, b) => rank(a.measure) - rank(b.measure) || a.title.localeCompare(b.title));
}
