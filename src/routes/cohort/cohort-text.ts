import { findMeasure } from '$lib/domain';
import type { CohortGroupSummary } from '$lib/export';
import { mdcSourceLine } from '$lib/stats';
import * as t from './cohort-messages';

// How the cohort page writes its figures (the summary table, the charts' captions, the export list).

/** "Modified Ashworth Scale · Elbow flexors", with the quantity only where it differs (Tardieu parts). */
export function groupTitle(g: { measureLabel: string; measureCode: string; siteCode: string; mode: string | null; quantity: { label: string } }): string {
  const site = findMeasure(g.measureCode)?.sites.find((x) => x.code === g.siteCode)?.label ?? g.siteCode;
  const part = g.quantity.label === g.measureLabel ? '' : ` · ${g.quantity.label}`;
  return `${g.measureLabel} · ${site}${g.mode ? ` (${g.mode})` : ''}${part}`;
}
export const fmt = (v: number, d = 2) => (Number.isFinite(v) ? v.toFixed(d) : '–');
/** "grade step" or "grade steps" after a number; degrees as °. */
export const changeUnit = (unit: string, v: number) =>
  unit === 'deg' ? '°' : unit === 'grade steps' ? (Math.abs(v) === 1 ? t.gradeStep : t.gradeSteps) : unit === '1' ? '' : ` ${unit.replace(/^\{(.*)\}$/, '$1')}`;
/** Too few patients for a test statistic to mean much (common practice; no fixed rule). */
export const SMALL_SAMPLE = 6;
/** The note under the table for a group's MDC: its source, or why there is none. */
export const noteText = (g: CohortGroupSummary): string => {
  if (!g.mdc) return g.mdcNote ?? t.none;
  if (g.mdc.source === 'reference') return t.publishedFigure(g.mdc.citation);
  return mdcSourceLine(g.mdc, '', false).replace(/^MDC [^:]*: /, '').replace(/^./, (c) => c.toUpperCase());
};
export const pct = (v: number) => `${(100 * v).toFixed(0)} %`;
