import { findMeasure, type Measure, type Observation } from '../domain';
import type { OutcomePoint } from './outcome-series';
import { seriesKey } from './series-key';

const dayMs = 86_400_000;

/**
 * The grouping step of outcomeSeries: live observations of known measures by series key (measure,
 * site, side, ROM mode), each list sorted by time, then id.
 */
export function seriesGroups(observations: readonly Observation[]): Map<string, Observation[]> {
  const groups = new Map<string, Observation[]>();
  for (const obs of observations) {
    if (obs.deleted || !findMeasure(obs.measureCode)) continue;
    const key = seriesKey(obs);
    const list = groups.get(key);
    if (list) list.push(obs);
    else groups.set(key, [obs]);
  }
  for (const list of groups.values()) list.sort((a, b) => (a.takenAt < b.takenAt ? -1 : a.takenAt > b.takenAt ? 1 : a.id < b.id ? -1 : 1));
  return groups;
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

/**
 * The points step of outcomeSeries: one point per observation (the value charted: a grade's rank,
 * Tardieu's R2 − R1, an angle or a number), and the times in days from the first point with the
 * values as typed arrays for the baseline and trend steps.
 */
export function seriesPoints(measure: Measure, list: readonly Observation[]): { points: OutcomePoint[]; timesDay: Float64Array; values: Float64Array; t0Ms: number } {
  const points: OutcomePoint[] = list.map((obs) => ({
    timeMs: Date.parse(obs.takenAt),
    ...pointValue(measure, obs),
    observationId: obs.id,
    assessmentId: obs.assessmentId,
    clinicianId: obs.clinicianId,
  }));
  const timesDay = new Float64Array(points.length);
  const values = new Float64Array(points.length);
  const t0Ms = points[0]!.timeMs;
  points.forEach((p, i) => {
    timesDay[i] = (p.timeMs - t0Ms) / dayMs;
    values[i] = p.value;
  });
  return { points, timesDay, values, t0Ms };
}
