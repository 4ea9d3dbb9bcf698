import { roundTo } from '../stats';
import type { RestPlateau } from './detect-rest';
import { emgEnvelope } from './emg-envelope';
import type { PendulumEmgBurst, PendulumEmgIndices, PendulumEmgPhase } from './pendulum-result';
import { medianInPlace } from './quickselect';
import { resampleLinear } from './resample-linear';
import type { UniformGrid } from './uniform-grid';

/** An EMG burst lasts at least this long above the off threshold (s); a reflex burst lasts 50–200 ms (common practice). */
const EMG_MIN_BURST_S = 0.05;
/** An EMG burst peaks at least this many times the on threshold's distance above baseline. Project choice. */
const EMG_CONFIRM_FACTOR = 2;

/** The swing as the EMG summary divides it (grid indices). */
export interface SwingForEmg {
  readonly releaseIndex: number;
  readonly rest: RestPlateau;
  readonly flexionPeaks: Int32Array;
  readonly extensionPeaks: Int32Array;
  readonly firstPeakIndex: number;
}

/**
 * Step 7 of analysePendulumTrace, with an EMG column: envelope on the grid (emgEnvelope), then the
 * summary (emgSummary). Warns when the rate is too low for surface EMG.
 */
export function emgStage(timeS: Float64Array, emgUv: Float64Array, grid: UniformGrid, swing: SwingForEmg, k: number, warnings: string[]): { envelope: Float64Array; emg: PendulumEmgIndices | null } {
  const { startS, rateHz: fs, length: m } = grid;
  const emgRaw = resampleLinear(timeS, emgUv, startS, fs, new Float64Array(m));
  const envelope = emgEnvelope(emgRaw, fs, new Float64Array(m));
  if (fs < 500) warnings.push(`EMG sampled at ${roundTo(fs, 1)} Hz; surface EMG needs about 1000 Hz, so the envelope is only indicative`);
  return { envelope, emg: emgSummary(envelope, fs, swing, k, warnings) };
}

/**
 * Baseline and thresholds from the silent stretches, the swing phases, and the bursts in them.
 * Null (with a warning) when less than 0.1 s precedes the release.
 */
function emgSummary(envelope: Float64Array, fs: number, swing: SwingForEmg, k: number, warnings: string[]): PendulumEmgIndices | null {
  const { releaseIndex, rest } = swing;
  const baselineEnd = Math.floor(releaseIndex - 0.05 * fs);
  const baselineStart = Math.max(0, Math.floor(releaseIndex - 1.05 * fs));
  if (baselineEnd - baselineStart < Math.round(0.1 * fs)) {
    warnings.push('EMG: less than 0.1 s of recording before release, so no baseline for burst detection');
    return null;
  }
  // Robust baseline over both silent stretches: the second before release and the rest plateau
  // after its first half second (the leg hangs still there). Median and MAD ignore a stray blip,
  // where a mean and SD over one second were pulled by it and set the bar too low or too high.
  const restFrom = Math.min(rest.endIndex, rest.onsetIndex + Math.round(0.5 * fs));
  const baseline = new Float64Array(baselineEnd - baselineStart + Math.max(0, rest.endIndex - restFrom));
  baseline.set(envelope.subarray(baselineStart, baselineEnd));
  baseline.set(envelope.subarray(restFrom, rest.endIndex), baselineEnd - baselineStart);
  const mean = medianInPlace(baseline);
  for (let i = 0; i < baseline.length; i++) baseline[i] = Math.abs(baseline[i] - mean);
  const sd = 1.4826 * medianInPlace(baseline);
  const threshold = mean + k * sd;
  const phases = swingPhases(swing, fs);
  const bursts = emgBursts(envelope, fs, swing, phases, { on: threshold, off: mean + 0.5 * k * sd, confirm: mean + EMG_CONFIRM_FACTOR * k * sd });
  return { baselineMeanUv: mean, baselineSdUv: sd, thresholdUv: threshold, thresholdK: k, bursts, phases };
}

/** Swing phases: release → first flexion peak → next extension trough → next flexion peak … → rest. */
function swingPhases(swing: SwingForEmg, fs: number): PendulumEmgPhase[] {
  const { releaseIndex, rest, flexionPeaks, extensionPeaks } = swing;
  const boundaries: number[] = [releaseIndex];
  const names: string[] = [];
  let current = swing.firstPeakIndex;
  let count = 1;
  if (current < rest.onsetIndex) {
    boundaries.push(current);
    names.push('flexion 1');
    for (;;) {
      const trough = extensionPeaks.find((p) => p > current && p < rest.onsetIndex);
      if (trough === undefined) break;
      boundaries.push(trough);
      names.push(`extension ${count}`);
      count++;
      const crest = flexionPeaks.find((p) => p > trough && p < rest.onsetIndex);
      if (crest === undefined) break;
      boundaries.push(crest);
      names.push(`flexion ${count}`);
      current = crest;
    }
  }
  boundaries.push(rest.onsetIndex);
  names.push(names.length % 2 === 1 ? `extension ${count}` : `flexion ${count}`);
  const phases: PendulumEmgPhase[] = names.map((phase, p) => ({
    phase,
    startS: (boundaries[p] - releaseIndex) / fs,
    endS: (boundaries[p + 1] - releaseIndex) / fs,
    burstCount: 0,
  }));
  phases.push({ phase: 'rest', startS: (rest.onsetIndex - releaseIndex) / fs, endS: (rest.endIndex - releaseIndex) / fs, burstCount: 0 });
  return phases;
}

/**
 * Hysteresis and a minimum duration hold the false-alarm rate over a whole recording: a burst
 * starts when the envelope passes the on threshold, runs while it stays above the lower off
 * threshold (its onset stays where it passed the on threshold: the zero-phase envelope already
 * spreads a burst backwards by tens of milliseconds), and counts only when it lasts
 * EMG_MIN_BURST_S and peaks at EMG_CONFIRM_FACTOR times the on threshold's distance from baseline.
 * A 6 Hz envelope of noise wanders for tens of milliseconds at a time, so single crossings of
 * baseline + 3·SD happen every few seconds in a silent muscle; a reflex burst is many times that.
 * Counts each burst in its phase (`phases` is updated in place).
 */
function emgBursts(envelope: Float64Array, fs: number, swing: SwingForEmg, phases: PendulumEmgPhase[], thresholds: { on: number; off: number; confirm: number }): PendulumEmgBurst[] {
  const { releaseIndex, rest } = swing;
  const minRun = Math.max(1, Math.round(EMG_MIN_BURST_S * fs));
  const bursts: PendulumEmgBurst[] = [];
  let i = Math.ceil(releaseIndex);
  while (i < rest.endIndex) {
    if (envelope[i] < thresholds.on) {
      i++;
      continue;
    }
    const onset = i;
    let peak = envelope[i];
    while (i < envelope.length && envelope[i] >= thresholds.off) {
      if (envelope[i] > peak) peak = envelope[i];
      i++;
    }
    if (i - onset < minRun || peak < thresholds.confirm) continue;
    const onsetS = (onset - releaseIndex) / fs;
    let phaseIndex = phases.length - 1;
    for (let p = 0; p < phases.length - 1; p++) {
      if (onsetS >= phases[p].startS && onsetS < phases[p].endS) {
        phaseIndex = p;
        break;
      }
    }
    const phase = phases[phaseIndex];
    phases[phaseIndex] = { ...phase, burstCount: phase.burstCount + 1 };
    bursts.push({ onsetS, offsetS: (i - releaseIndex) / fs, peakUv: peak, phase: phase.phase });
  }
  return bursts;
}
