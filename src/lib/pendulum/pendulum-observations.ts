import { findMeasure, findSite, type Observation, type ObservationValue } from '../domain';
import type { PendulumIndices } from './pendulum-result';

/** One pendulum observation: the caller's context (patient, time, side, ids) plus measure and value. */
export type PendulumObservation<C> = C & {
  readonly measureCode: string;
  readonly siteCode: 'knee';
  readonly mode: null;
  readonly instrument: null;
  readonly value: ObservationValue;
};

/**
 * The five pendulum measures of the catalogue from the engine's indices (relaxation index, normalised
 * index, first swing excursion A1, resting angle, swing count), at site "knee". `context` carries
 * whatever the caller's save needs (patient, time, side, and ids or a trace index) and is copied into
 * each observation. A value that is not finite or lies outside the catalogue's limits is left out and
 * named in `skipped` (never clamped).
 */
export function pendulumObservations<C extends { readonly side: Observation['side'] }>(indices: PendulumIndices, context: C): { observations: PendulumObservation<C>[]; skipped: string[] } {
  const candidates: Array<[string, ObservationValue, number]> = [
    ['pendulum-ri', { kind: 'index', value: indices.relaxationIndex }, indices.relaxationIndex],
    ['pendulum-ri-normalised', { kind: 'index', value: indices.normalizedRelaxationIndex }, indices.normalizedRelaxationIndex],
    ['pendulum-first-swing', { kind: 'angle', angleDeg: indices.a1Deg }, indices.a1Deg],
    ['pendulum-resting-angle', { kind: 'angle', angleDeg: indices.restAngleDeg }, indices.restAngleDeg],
    ['pendulum-swing-count', { kind: 'count', value: indices.peakCount }, indices.peakCount],
  ];
  const observations: PendulumObservation<C>[] = [];
  const skipped: string[] = [];
  for (const [code, value, x] of candidates) {
    const measure = findMeasure(code);
    const limits = measure && measure.kind !== 'ordinal' && measure.kind !== 'tardieu' ? (findSite(measure, 'knee')?.limits ?? measure.limits) : null;
    if (!Number.isFinite(x) || !limits || x < limits.min || x > limits.max) {
      skipped.push(`${measure?.label ?? code}: ${Number.isFinite(x) ? x.toFixed(2) : 'not measurable'} is outside what the record accepts`);
      continue;
    }
    observations.push({ ...context, measureCode: code, siteCode: 'knee', mode: null, instrument: null, value });
  }
  return { observations, skipped };
}
