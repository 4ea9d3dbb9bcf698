import { findMeasure, findSite } from './measure-catalogue';
import type { ErrorReference, MeasurementErrorFigure, RaterDesign } from './measure-types';
import type { Instrument } from './observation';

/** 1.96·√2: turns an SEM into an MDC95 (Weir 2005; REFERENCES.md §6a, VERIFIED in descriptions). */
export const SEM_TO_MDC95 = 1.96 * Math.SQRT2;

export interface ReferenceMdc {
  /** MDC95 in the measure's unit: the upper end of a published range (the cautious choice). */
  readonly mdc95: number;
  readonly figure: MeasurementErrorFigure;
  /** True when the figure was an SEM converted with SEM_TO_MDC95. */
  readonly convertedFromSem: boolean;
}

/** The error reference that applies at a site: the site's own, else the measure's. */
export function errorReference(measureCode: string, siteCode: string): ErrorReference | undefined {
  const measure = findMeasure(measureCode);
  if (!measure) return undefined;
  return findSite(measure, siteCode)?.reference ?? measure.reference;
}

/**
 * Picks the published MDC95 that fits best: same instrument and rater design first, then same
 * instrument, then same rater design with no instrument stated; among equals the largest (cautious).
 * Returns null when nothing is published ("none: establish locally") or nothing fits. Never throws.
 */
export function referenceMdc95(
  measureCode: string,
  siteCode: string,
  context: { instrument: Instrument | null; raters: RaterDesign },
): ReferenceMdc | null {
  const reference = errorReference(measureCode, siteCode);
  if (!reference || reference.kind === 'none') return null;
  const score = (f: MeasurementErrorFigure): number => {
    const instrumentFits = f.instrument === context.instrument ? 2 : f.instrument === null ? 1 : 0;
    const ratersFit = f.raters === context.raters ? 2 : f.raters === 'unspecified' ? 1 : 0;
    return instrumentFits === 0 || ratersFit === 0 ? -1 : instrumentFits * 3 + ratersFit;
  };
  let best: ReferenceMdc | null = null;
  let bestScore = -1;
  for (const figure of reference.figures) {
    const s = score(figure);
    if (s < 0) continue;
    const convertedFromSem = figure.statistic === 'SEM';
    const mdc95 = convertedFromSem ? figure.high * SEM_TO_MDC95 : figure.high;
    if (s > bestScore || (s === bestScore && best !== null && mdc95 > best.mdc95)) {
      best = { mdc95, figure, convertedFromSem };
      bestScore = s;
    }
  }
  return best;
}
