import { MEASURE_CATALOGUE, findMeasure, findSite, type Measure, type Observation } from '../domain';
import type { ChangeVerdict, MdcProvenance } from './change-verdict';
import type { LocalMdc } from './choose-mdc';
import type { MannKendall } from './mann-kendall';
import { selectBaseline, type Baseline, type BaselineRule } from './select-baseline';
import { seriesJudge } from './series-judge';
import { seriesGroups, seriesPoints } from './series-points';
import { seriesTrend } from './series-trend';
import type { SeriesIdentity } from './series-key';

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
export interface OutcomeSeries extends SeriesIdentity {
  /** measure|site|side|mode, stable across sessions. */
  readonly key: string;
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

/**
 * 'latest': judgements left empty and trend null (only latestVerdicts sees such series).
 * Steps: group (series-points' seriesGroups), points, baseline (selectBaseline), judge each point
 * (seriesJudge), trend (seriesTrend), then order by catalogue and title.
 */
function buildSeries(observations: readonly Observation[], options: OutcomeOptions, detail: 'full' | 'latest'): OutcomeSeries[] {
  const result: OutcomeSeries[] = [];
  for (const [key, list] of seriesGroups(observations)) {
    const measure = findMeasure(list[0]!.measureCode) as Measure;
    const first = list[0]!;
    const ordinal = measure.kind === 'ordinal';
    const { points, timesDay, values, t0Ms } = seriesPoints(measure, list);
    const rule: BaselineRule =
      options.baselineRule.kind === 'lastBeforeEvent'
        ? { kind: 'lastBeforeEvent', eventDay: (options.baselineRule.eventMs - t0Ms) / dayMs }
        : options.baselineRule;
    const baseline = selectBaseline(timesDay, values, rule, ordinal);
    const judge = seriesJudge(measure, list, points, baseline, options);
    const last = judge(points.length - 1);
    const judgements = detail === 'full' ? points.map((_, i) => (i === points.length - 1 ? last : judge(i)).verdict) : [];
    result.push({
      key,
      measure,
      siteCode: first.siteCode,
      side: first.side,
      mode: first.mode,
      title: seriesTitle(measure, first.siteCode, first.side, first.mode),
      valueLabel: measure.kind === 'tardieu' ? 'Spasticity angle R2 − R1' : measure.label,
      unitLabel: unitLabel(measure),
      ordinalLabels: ordinal ? measure.grades.map((g) => g.label) : null,
      betterWhen: measure.improvement === 'none' ? null : measure.improvement,
      points,
      baseline,
      latest: points[points.length - 1]!,
      verdict: last.verdict,
      mdc: last.mdc,
      mdcNote: last.mdcNote,
      judgements,
      trend: detail === 'full' ? seriesTrend(timesDay, values, t0Ms, ordinal) : null,
    });
  }
  const rank = (m: Measure) => MEASURE_CATALOGUE.indexOf(m);
  return result.sort((a, b) => rank(a.measure) - rank(b.measure) || a.title.localeCompare(b.title));
}
