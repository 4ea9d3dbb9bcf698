import { errorReference, referenceMdc95, type Instrument, type Observation } from '../domain';
import { changeVerdict, cohortChangeSummary, ORDINAL_STEP_MDC, type ChangeVerdict, type CohortChangeSummary, type MdcProvenance } from '../stats';
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
  /** The MDC used, with where it came from; null when none is known. */
  readonly mdc: MdcProvenance | null;
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

function localFor(list: readonly LocalMdc[], measureCode: string, siteCode: string, quantity: MeasureQuantity, primary: boolean): LocalMdc | null {
  let general: LocalMdc | null = null;
  for (const m of list) {
    if (m.measureCode !== measureCode) continue;
    const q = m.quantity ?? null;
    if (q === null ? !primary : q !== quantity.key) continue;
    if (m.siteCode === siteCode) return m;
    if (m.siteCode === null) general = m;
  }
  return general;
}

/**
 * Summarises the cohort per measure, site, ROM mode and quantity with the stats engine's
 * cohortChangeSummary (Hyndman & Fan type 7 quartiles; Wilson 95 % interval, Newcombe 1998
 * method 3; Wilcoxon signed-rank, exact for n ≤ 50 without ties; SRM, Liang et al. 1990).
 * The MDC is, in order: a local value from `options.localMdc` (site-specific before measure-wide),
 * else the catalogue's published reference for the measure's primary quantity (referenceMdc95,
 * with the group's one instrument, or none when mixed, and 'same-rater' only when every pair kept
 * its assessor), else for ordinal grades one whole grade step (ORDINAL_STEP_MDC, common practice, said
 * in its citation), else none, with the catalogue's reason. Cost O(n log n) per group.
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
    let mdc: MdcProvenance | null = null;
    let mdcNote: string | null = null;
    if (quantity.betterWhen === 'none') {
      mdcNote = 'no direction of improvement for this measure: improvement is not counted';
    } else {
      const localValue = localFor(local, s.measure.code, s.siteCode, quantity, primary);
      if (localValue) {
        mdc = { value: localValue.value, source: 'local', citation: localValue.citation };
      } else if (primary) {
        const reference = referenceMdc95(s.measure.code, s.siteCode, { instrument: groupInstrument(pairs), raters: groupRaters(pairs) });
        if (reference) {
          const f = reference.figure;
          mdc = {
            value: reference.mdc95,
            source: 'reference',
            citation: `${f.source}; ${f.statistic} ${f.low === f.high ? f.high : `${f.low}–${f.high} (upper end used)`}${reference.convertedFromSem ? ' × 1.96·√2' : ''}; ${f.status}`,
          };
        } else if (s.measure.kind === 'ordinal') {
          // The same convention as a patient's verdicts (outcomeSeries): one whole grade step.
          mdc = ORDINAL_STEP_MDC;
        }
      }
      if (!mdc) {
        const reference = errorReference(s.measure.code, s.siteCode);
        mdcNote = !primary
          ? 'no MDC for this component: establish locally'
          : reference?.kind === 'none'
            ? reference.reason
            : 'no published MDC fits this instrument and rater design: establish locally';
      }
    }
    const changes = new Float64Array(pairs.length);
    const patientIds = new Set<string>();
    pairs.forEach((pair, i) => {
      changes[i] = pairChange(pair, quantity, null).change;
      patientIds.add(pair.series.patient.id);
    });
    const summary = cohortChangeSummary(changes, quantity.betterWhen === 'lower' ? 'lower' : 'higher', mdc ? mdc.value : null);
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
      mdcNote,
      summary,
    });
  }
  groups.sort((a, b) => (a.key < b.key ? -1 : a.key > b.key ? 1 : 0));
  return { groups, byKey: new Map(groups.map((g) => [g.key, g])) };
}

function groupInstrument(pairs: readonly CohortPair[]): Instrument | null {
  let found: Instrument | null | undefined;
  for (const p of pairs) {
    for (const i of [p.baselineIndex, p.followUpIndex]) {
      const instrument = p.series.observations[i]?.instrument ?? null;
      if (found === undefined) found = instrument;
      else if (found !== instrument) return null;
    }
  }
  return found ?? null;
}

function groupRaters(pairs: readonly CohortPair[]): 'same-rater' | 'different-raters' {
  for (const p of pairs) {
    if (p.series.assessments[p.baselineIndex]?.assessorId !== p.series.assessments[p.followUpIndex]?.assessorId) return 'different-raters';
  }
  return 'same-rater';
}
