import { errorReference, findMeasure, referenceMdc95, type Instrument } from '../domain';
import type { MdcProvenance } from './change-verdict';

/** An MDC the team adopted from its own reliability study; it overrides the catalogue's reference. */
export interface LocalMdc {
  readonly measureCode: string;
  /** null: every site of the measure. */
  readonly siteCode: string | null;
  /** Quantity key (see the export's measureQuantities); null or absent: the measure's primary quantity. */
  readonly quantity?: string | null;
  /** In the quantity's unit, or grade steps for an ordinal measure. */
  readonly value: number;
  /** e.g. "Knee study 2026, ICC(2,1), adopted 2026-03-01". */
  readonly citation: string;
}

/** One observation as far as the MDC choice cares: its instrument and who assessed it. */
export interface ComparedObservation {
  readonly instrument: Instrument | null;
  /** The examining clinician (Assessment.assessorId); null when unknown. */
  readonly assessorId: string | null;
}

/** What a change is judged on: which measure, site and quantity, and the observations compared. */
export interface MdcQuestion {
  readonly measureCode: string;
  readonly siteCode: string;
  /** Quantity key; null for the measure's primary quantity (the one a patient's series charts). */
  readonly quantity: string | null;
  /** The baseline observation(s) and the follow-up observation. */
  readonly compared: readonly ComparedObservation[];
  readonly localMdc?: readonly LocalMdc[];
}

/** The MDC chosen, or why there is none. */
export interface MdcChoice {
  readonly mdc: MdcProvenance | null;
  /** Why there is no MDC (the catalogue's reason, or no direction of improvement); null when there is one. */
  readonly note: string | null;
}

/**
 * An ordinal scale has no published MDC; a change of one whole grade step is the threshold in common
 * use (common practice, no source), and the provenance says so.
 */
export const ORDINAL_STEP_MDC: MdcProvenance = {
  value: 1,
  source: 'rule',
  citation: 'one whole grade step: common practice for ordinal scales; no published MDC exists',
};

/**
 * The instrument and rater design of a comparison: the one instrument of every compared observation
 * (null when they differ or none is stated), and 'same-rater' only when one known assessor took them all.
 */
function comparisonDesign(compared: readonly ComparedObservation[]): { instrument: Instrument | null; raters: 'same-rater' | 'different-raters' } {
  let instrument: Instrument | null | undefined;
  let assessor: string | null | undefined;
  let sameRater = true;
  for (const c of compared) {
    if (instrument === undefined) instrument = c.instrument;
    else if (instrument !== c.instrument) instrument = null;
    if (c.assessorId === null) sameRater = false;
    else if (assessor === undefined) assessor = c.assessorId;
    else if (assessor !== c.assessorId) sameRater = false;
  }
  return { instrument: instrument ?? null, raters: sameRater && compared.length > 0 ? 'same-rater' : 'different-raters' };
}

function localFor(list: readonly LocalMdc[], q: MdcQuestion): LocalMdc | null {
  let general: LocalMdc | null = null;
  for (const m of list) {
    if (m.measureCode !== q.measureCode || (m.quantity ?? null) !== q.quantity) continue;
    if (m.siteCode === q.siteCode) return m;
    if (m.siteCode === null) general = m;
  }
  return general;
}

/**
 * The one rule that picks the MDC a change is judged by, for a patient's page, the caseload flags,
 * the cohort summary, every CSV and the report:
 * 1. the team's adopted reliability study (`localMdc`; site-specific before measure-wide);
 * 2. else, for the measure's primary quantity, the catalogue's published MDC95 matched on the
 *    comparison's instrument and rater design (referenceMdc95; the upper end of a range; an SEM
 *    turned into an MDC95 by 1.96·√2, Weir 2005);
 * 3. else, for the primary quantity of an ordinal-grade measure, one whole grade step
 *    (ORDINAL_STEP_MDC, common practice);
 * 4. else none, with the catalogue's reason.
 * A measure with no direction of improvement gets none (nothing to judge). Never throws; an unknown
 * measure code gets none with a note. Cost O(figures + local MDCs).
 */
export function chooseMdc(question: MdcQuestion): MdcChoice {
  const measure = findMeasure(question.measureCode);
  if (!measure) return { mdc: null, note: `"${question.measureCode}" is not a measure of the catalogue` };
  const local = localFor(question.localMdc ?? [], question);
  if (local && local.value > 0 && Number.isFinite(local.value)) return { mdc: { value: local.value, source: 'local', citation: local.citation }, note: null };
  if (question.quantity !== null) return { mdc: null, note: 'no MDC for this component: establish locally' };
  if (measure.improvement === 'none') return { mdc: null, note: 'no direction of improvement for this measure: change is not judged' };
  const reference = referenceMdc95(measure.code, question.siteCode, comparisonDesign(question.compared));
  if (reference) {
    const f = reference.figure;
    const range = f.low === f.high ? `${f.high}` : `${f.low}–${f.high} (upper end used)`;
    return {
      mdc: {
        value: reference.mdc95,
        source: 'reference',
        citation: `${f.source}; ${f.statistic} ${range}${reference.convertedFromSem ? ' × 1.96·√2' : ''}; ${f.status}`,
        shortCitation: shortSource(f.source),
      },
      note: null,
    };
  }
  if (measure.kind === 'ordinal') return { mdc: ORDINAL_STEP_MDC, note: null };
  const ref = errorReference(measure.code, question.siteCode);
  return { mdc: null, note: ref?.kind === 'none' ? ref.reason : 'no published MDC fits this instrument and rater design: establish locally' };
}

/** "Armstrong AD, MacDermid JC, … (1998). Title…" → "Armstrong et al. 1998". */
function shortSource(source: string): string {
  const year = /\((\d{4})\)/.exec(source)?.[1] ?? /\b(19|20)\d{2}\b/.exec(source)?.[0] ?? '';
  const first = /^([A-Z][A-Za-z'-]+)/.exec(source.trim())?.[1] ?? source.split(/[;,(]/)[0]?.trim() ?? source;
  const many = /,\s*[A-Z][A-Za-z'-]+\s+[A-Z]{1,3}\b/.test(source) || /et al/.test(source);
  return `${first}${many ? ' et al.' : ''}${year ? ` ${year}` : ''}`;
}

/**
 * Where an MDC comes from, in plain words for a clinician (the quieter second line under a verdict),
 * e.g. "MDC 6°: published figure (Armstrong et al. 1998)" or "MDC 1 grade step: common practice for
 * ordinal scales (no published figure)". `unit` is appended to the value ("°", "" for an index);
 * `grades` says the value is in grade steps. With no MDC, the catalogue's reason (chooseMdc's note,
 * with what the catalogue found instead), or "none known" when no note is given.
 */
export function mdcSourceLine(mdc: MdcProvenance | null, unit: string, grades: boolean, note: string | null = null): string {
  if (!mdc) {
    if (!note) return 'MDC: none known';
    // The catalogue's reason opens with "none: establish locally…"; what follows it (what was found
    // instead, e.g. an ICC without an error in units) is kept, so the person sees why there is none.
    const lead = /^none:\s*establish locally(?: with a reliability study)?\.?\s*/i.exec(note);
    if (lead || /establish locally/i.test(note)) {
      const detail = lead ? note.slice(lead[0].length).trim() : '';
      return `MDC: none published for this measure; your team can establish one with a reliability study${detail ? `. ${detail}` : ''}`;
    }
    return `MDC: ${note}`;
  }
  const value = grades ? `${+mdc.value.toFixed(2)} grade step${mdc.value === 1 ? '' : 's'}` : `${+mdc.value.toFixed(2)}${unit}`;
  switch (mdc.source) {
    case 'local':
      return `MDC ${value}: your team's reliability study (${mdc.citation})`;
    case 'reference':
      return `MDC ${value}: published figure (${mdc.shortCitation ?? mdc.citation})`;
    default:
      return `MDC ${value}: common practice for ordinal scales (no published figure)`;
  }
}
