import type { Observation } from '../domain';
import { changeVerdict, chooseMdc, cohortChangeSummary, type ChangeVerdict, type CohortChangeSummary, type MdcChoice, type MdcProvenance } from '../stats';
import { CohortExportError } from './cohort-export-error';
import type { LocalMdc } from './cohort-types';
import { measureQuantities, type MeasureQuantity } from './measure-quantities';
import type { Cohort, CohortPair } from './select-cohort';

/** The summary of one measure, site, mode and quantity over the cohort. */
export interface CohortGroupSummary {
  /** `measure|site|mode|quantity`, the key wide rows use to find their group. */
  readonly key: string;
  readonly measureCode: string;
  readonly measureLabel: string;
  readonly siteCode: string;
  readonly mode: string | null;
  readonly quantity: MeasureQuantity;
  /** Pairs (patient × side) with a change; a patient measured on both sides counts twice. */
  readonly pairs: number;
  readonly patients: number;
  /** Changes (follow-up − baseline) in pair order: for the distribution chart. */
  readonly changes: Float64Array;
  /** The MDC used, with where it came from; null when none is known or when it differs between pairs. */
  readonly mdc: MdcProvenance | null;
  /** Each pair's own MDC (chooseMdc on its baseline and follow-up): what its verdict and the count use. */
  readonly mdcByPair: ReadonlyMap<CohortPair, MdcProvenance | null>;
  /** Why there is no MDC (catalogue reason, or no direction of improvement); null when there is one. */
  readonly mdcNote: string | null;
  /** n, median and IQR, proportion improved beyond the MDC with Wilson 95 %, Wilcoxon, SRM. */
  readonly summary: CohortChangeSummary;
}

export interface CohortSummary {
  readonly groups: readonly CohortGroupSummary[];
  readonly byKey: ReadonlyMap<string, CohortGroupSummary>;
}

/** One pair's change in one quantity, with the verdict against the group's MDC. */
export interface PairChange {
  readonly baseline: number;
  readonly followUp: number;
  readonly change: number;
  /** changeVerdict's verdict; 'no-direction' when the measure has no better direction. */
  readonly verdict: ChangeVerdict['verdict'] | 'no-direction';
}

export interface SummariseOptions {
  /** MDCs from the clinic's own reliability studies; they take precedence over the catalogue. */
  readonly localMdc?: readonly LocalMdc[];
}

/** Group key of a pair and quantity. */
export function groupKey(pair: CohortPair, quantity: MeasureQuantity): string {
  const s = pair.series;
  return `${s.measure.code}|${s.siteCode}|${s.mode ?? ''}|${quantity.key}`;
}

/**
 * Baseline, follow-up and change of one pair in one quantity, and its verdict by the stats engine's
 * changeVerdict (ordinal quantities change in whole grade steps between ranks). Cost O(1).
 */
export function pairChange(pair: CohortPair, quantity: MeasureQuantity, mdc: MdcProvenance | null): PairChange {
  const s = pair.series;
  const baseline = quantity.read((s.observations[pair.baselineIndex] as Observation).value);
  const followUp = quantity.read((s.observations[pair.followUpIndex] as Observation).value);
  const change = followUp - baseline;
  if (quantity.betterWhen === 'none') return { baseline, followUp, change, verdict: 'no-direction' };
  const verdict = changeVerdict({
    measureLabel: quantity.label,
    betterWhen: quantity.betterWhen,
    scale: quantity.grades ? { kind: 'ordinal', grades: quantity.grades } : { kind: 'continuous', unit: quantity.unit },
    baseline: { low: baseline, high: baseline },
    followUp,
    mdc,
  }).verdict;
  return { baseline, followUp, change, verdict };
}

/**
 * The MDC of one pair and quantity: chooseMdc (the one rule shared with a patient's page) asked about
 * this pair's baseline and follow-up observations, their instruments and assessors. Never throws.
 */
function pairMdc(pair: CohortPair, quantity: MeasureQuantity, primary: boolean, localMdc: readonly LocalMdc[]): MdcChoice {
  const s = pair.series;
  return chooseMdc({
    measureCode: s.measure.code,
    siteCode: s.siteCode,
    quantity: primary ? null : quantity.key,
    compared: [pair.baselineIndex, pair.followUpIndex].map((i) => ({
      instrument: (s.observations[i] as Observation).instrument,
      assessorId: s.assessments[i]?.assessorId ?? null,
    })),
    localMdc,
  });
}

/**
 * Summarises the cohort per measure, site, ROM mode and quantity with the stats engine's
 * cohortChangeSummary (Hyndman & Fan type 7 quartiles; Wilson 95 % interval, Newcombe 1998
 * method 3; Wilcoxon signed-rank, exact for n ≤ 50 without ties; SRM, Liang et al. 1990).
 * Each pair's MDC comes from pairMdc, i.e. chooseMdc, the same rule as a patient's own page; the
 * group shows it when every pair has the same, else says that it differs and counts each pair
 * against its own. Cost O(n log n) per group.
 * Throws CohortExportError for a local MDC that is not positive and finite.
 */
export function summariseCohort(cohort: Cohort, options: SummariseOptions = {}): CohortSummary {
  const local = options.localMdc ?? [];
  local.forEach((m, i) => {
    if (!(m.value > 0) || !Number.isFinite(m.value)) throw new CohortExportError(`options.localMdc[${i}].value`, `${m.value} must be positive and finite`);
  });
  interface Building {
    readonly pairs: CohortPair[];
    readonly quantity: MeasureQuantity;
    readonly primary: boolean;
  }
  const building = new Map<string, Building>();
  for (const pair of cohort.pairs) {
    const quantities = measureQuantities(pair.series.measure);
    quantities.forEach((quantity, qi) => {
      const key = groupKey(pair, quantity);
      const group = building.get(key);
      if (group) group.pairs.push(pair);
      else building.set(key, { pairs: [pair], quantity, primary: qi === 0 });
    });
  }

  const groups: CohortGroupSummary[] = [];
  for (const [key, { pairs, quantity, primary }] of building) {
    const s = (pairs[0] as CohortPair).series;
    const choices = pairs.map((pair) => (quantity.betterWhen === 'none' ? null : pairMdc(pair, quantity, primary, local)));
    const mdcByPair = new Map(pairs.map((pair, i) => [pair, choices[i]?.mdc ?? null]));
    const first = choices[0] ?? null;
    const uniform = choices.every((c) => c?.mdc?.value === first?.mdc?.value && c?.mdc?.citation === first?.mdc?.citation);
    const everyHasMdc = choices.every((c) => c?.mdc);
    let mdc: MdcProvenance | null = null;
    let mdcNote: string | null;
    if (quantity.betterWhen === 'none') mdcNote = 'no direction of improvement for this measure: improvement is not counted';
    else if (uniform) {
      mdc = first?.mdc ?? null;
      mdcNote = first?.note ?? null;
    } else {
      const values = choices.flatMap((c) => (c?.mdc ? [c.mdc.value] : []));
      mdcNote = everyHasMdc
        ? `the MDC differs with instrument and rater design (${+Math.min(...values).toFixed(2)}–${+Math.max(...values).toFixed(2)}): each patient judged by their own`
        : 'no MDC for some patients (instrument or rater design): improvement is not counted';
    }
    const changes = new Float64Array(pairs.length);
    const patientIds = new Set<string>();
    pairs.forEach((pair, i) => {
      changes[i] = pairChange(pair, quantity, null).change;
      patientIds.add(pair.series.patient.id);
    });
    const thresholds = everyHasMdc && quantity.betterWhen !== 'none' ? Float64Array.from(choices, (c) => c?.mdc?.value as number) : null;
    const summary = cohortChangeSummary(changes, quantity.betterWhen === 'lower' ? 'lower' : 'higher', thresholds);
    groups.push({
      key,
      measureCode: s.measure.code,
      measureLabel: s.measure.label,
      siteCode: s.siteCode,
      mode: s.mode,
      quantity,
      pairs: pairs.length,
      patients: patientIds.size,
      changes,
      mdc,
      mdcByPair,
      mdcNote,
      summary,
    });
  }
  groups.sort((a, b) => (a.key < b.key ? -1 : a.key > b.key ? 1 : 0));
  return { groups, byKey: new Map(groups.map((g) => [g.key, g])) };
}
