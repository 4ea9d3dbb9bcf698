import { CompensatedAccumulator } from '../stats';

/**
 * A side dominates when its area is at least 1.5 times the other's; "balanced" only below that.
 * Why 1.5: a relaxed leg's lightly damped swing puts about as much area on each side of rest (the
 * successive half-waves of a lightly damped oscillation shrink by only a few per cent each, so the
 * first flexion half-swing tips the sum only a little), while a reflex that stops the swing on one
 * side takes most of the other side's area away. Half as much again on one side is a difference a
 * reader can see on the chart, and equals a 20 % share of the total ((1.5 − 1) / (1.5 + 1)), the
 * cut-off used before. Project choice, not a published cut-off.
 */
export const DOMINANT_AREA_RATIO = 1.5;

/**
 * Areas between the curve and the resting line from release to rest onset (deg·s), flexion side and
 * extension side, by the trapezoidal rule with each interval split where it crosses the line
 * (exact for the piecewise-linear curve). Neumaier-compensated sums (stats' CompensatedAccumulator).
 */
export function sideAreas(angle: Float64Array, rest: number, fromIndex: number, toIndex: number, fs: number): [number, number] {
  const flexion = new CompensatedAccumulator();
  const extension = new CompensatedAccumulator();
  const dt = 1 / fs;
  const first = Math.ceil(fromIndex);
  // Partial interval from the fractional release index to the first whole sample.
  let previous = first > 0 && first - fromIndex > 0 ? angle[first - 1] + (angle[first] - angle[first - 1]) * (1 - (first - fromIndex)) - rest : angle[first] - rest;
  let previousDt = (first - fromIndex) * dt;
  for (let i = first; i <= toIndex && i < angle.length; i++) {
    const current = angle[i] - rest;
    const step = i === first ? previousDt : dt;
    if (previous >= 0 && current >= 0) {
      flexion.add(0.5 * (previous + current) * step);
      extension.add(0);
    } else if (previous <= 0 && current <= 0) {
      flexion.add(0);
      extension.add(-0.5 * (previous + current) * step);
    } else {
      const crossing = (Math.abs(previous) / (Math.abs(previous) + Math.abs(current))) * step;
      const a = 0.5 * Math.abs(previous) * crossing;
      const b = 0.5 * Math.abs(current) * (step - crossing);
      flexion.add(previous > 0 ? a : b);
      extension.add(previous > 0 ? b : a);
    }
    previous = current;
    previousDt = dt;
  }
  return [flexion.total, extension.total];
}

/** Which side of rest holds the larger area by DOMINANT_AREA_RATIO, else 'balanced'. */
export function dominantSide(flexionArea: number, extensionArea: number): 'flexion' | 'extension' | 'balanced' {
  if (flexionArea >= DOMINANT_AREA_RATIO * extensionArea && flexionArea > 0) return 'flexion';
  if (extensionArea >= DOMINANT_AREA_RATIO * flexionArea && extensionArea > 0) return 'extension';
  return 'balanced';
}
