import { butterworthLowPass } from './butterworth-low-pass';
import { centralDifference } from './central-difference';
import { detectRelease, MIN_DROP_VELOCITY_DPS, type Release } from './detect-release';
import { detectRest, REST_WINDOW_S, type RestPlateau } from './detect-rest';
import { emgEnvelope } from './emg-envelope';
import { fitDampedCosine } from './fit-damped-cosine';
import { integrateGyro } from './integrate-gyro';
import { PendulumInputError } from './pendulum-input-error';
import type {
  PendulumAnalysis,
  PendulumEmgBurst,
  PendulumEmgIndices,
  PendulumEmgPhase,
  PendulumFitIndices,
  PendulumIndices,
} from './pendulum-result';
import { prominentPeaks } from './prominent-peaks';
import { medianInPlace } from './quickselect';
import { removeSpikes } from './remove-spikes';
import { resampleLinear } from './resample-linear';
import { uniformSampleRate } from './uniform-sample-rate';
import { zeroPhaseFilter } from './zero-phase-filter';

/** A recording as typed columns (seconds, degrees, deg/s, µV), e.g. from parsePendulumCsv. */
export interface PendulumTraceInput {
  readonly timeS: Float64Array;
  readonly angleDeg?: Float64Array | null;
  readonly gyroDps?: Float64Array | null;
  readonly emgUv?: Float64Array | null;
  /** File line of each sample, for messages; defaults to index + 2 (header on line 1). */
  readonly lines?: Int32Array;
}

export interface PendulumOptions {
  /** Name used in refusal messages. */
  readonly fileName?: string;
  /** Gyro-only input: the angle at which the leg was held before release (default 0 = full extension). */
  readonly gyroStartAngleDeg?: number;
  /** EMG burst-on threshold k in median + k·robust SD of the silent baseline (default 3); see EMG_* below. */
  readonly emgThresholdK?: number;
}

/** Lowest sampling rate accepted (Hz). */
export const MIN_SAMPLE_RATE_HZ = 20;
/**
 * Angle low-pass: 2nd-order Butterworth at 10 Hz run forward and backward (effective 4th order,
 * −6 dB at 10 Hz, zero phase). Why: the pendulum swings at about 0.7–1 Hz and reflex catches
 * shape it within tens of milliseconds (content up to a few Hz), while sensor noise and
 * quantisation spread to the Nyquist frequency; 10 Hz keeps the release corner and the peak
 * velocity (attenuation < 0.1 % below 3 Hz) and removes most noise. Zero phase keeps event times
 * unbiased. At rates under 25 Hz the corner drops to 0.4 × the rate.
 */
export const ANGLE_CUTOFF_HZ = 10;
const FILTER_ORDER = 2;
/** A flexion peak counts when it passes the resting angle by more than this (deg). */
export const PEAK_COUNT_MARGIN_DEG = 1;
/** R2 of a typical relaxed leg (Bajd & Vodovnik 1984, from memory), for the normalised index. */
export const TYPICAL_RELAXATION_INDEX = 1.6;
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
/** An EMG burst lasts at least this long above the off threshold (s); a reflex burst lasts 50–200 ms (common practice). */
const EMG_MIN_BURST_S = 0.05;
/** An EMG burst peaks at least this many times the on threshold's distance above baseline. Project choice. */
const EMG_CONFIRM_FACTOR = 2;
const SPIKE_FLOOR_DEG = 3;
const SHORT_REST_WINDOW_S = 0.5;
const SPIKE_FLOOR_DPS = 50;
const FIT_RATE_HZ = 100;

interface AngleStage {
  readonly angleDeg: Float64Array;
  readonly velocityDps: Float64Array;
  readonly release: Release;
  readonly rest: RestPlateau;
  readonly filteredNoiseDeg: number;
  readonly restToleranceDeg: number;
}

/**
 * Analyses one knee pendulum recording and returns its indices and processed signals.
 *
 * Steps: check the columns; resample to a uniform rate (1 / median interval, linear interpolation);
 * replace isolated spikes; low-pass the angle (ANGLE_CUTOFF_HZ, zero phase); for gyro-only input,
 * integrate the gyro after removing a bias estimated from the still periods before release and
 * after rest (two passes: the rest plateau found in the first pass pins the bias in the second);
 * find the release (detectRelease), the rest plateau (detectRest), the flexion and extension
 * extrema by prominence; compute the indices listed in PendulumIndices; fit a damped cosine
 * (fitDampedCosine, from release to one second into the plateau, at about 100 Hz); with EMG,
 * envelope, baseline threshold and bursts per swing phase. Every index is defined in
 * pendulum-result.ts. No index grades the leg; `warnings` says in words what looks unusual.
 *
 * Cost: O(n) apart from the fit (bounded iterations over ≤ 100 samples per second of swing).
 * Throws PendulumInputError (file, row where one row is at fault, reason) for: columns of unequal
 * length, fewer than two samples, non-finite values, time not strictly increasing, a sampling rate
 * under 20 Hz, no release (the leg never falls), a recording that ends before the leg is at rest.
 */
export function analysePendulumTrace(input: PendulumTraceInput, options: PendulumOptions = {}): PendulumAnalysis {
  const file = options.fileName ?? 'trace';
  const { timeS } = input;
  const angleIn = input.angleDeg ?? null;
  const gyroIn = input.gyroDps ?? null;
  const emgIn = input.emgUv ?? null;
  const lineOf = (i: number): number => (input.lines ? input.lines[Math.min(i, input.lines.length - 1)] : i + 2);
  const lastLine = lineOf(timeS.length - 1);
  checkColumns(file, timeS, angleIn, gyroIn, emgIn, lineOf);

  const warnings: string[] = [];
  const timing = uniformSampleRate(timeS);
  if (!(timing.rateHz >= MIN_SAMPLE_RATE_HZ)) {
    throw new PendulumInputError(file, null, `sampling rate ${round(timing.rateHz, 2)} Hz is under ${MIN_SAMPLE_RATE_HZ} Hz (rows 2–${lastLine})`);
  }
  const fs = timing.rateHz;
  if (timing.maxJitter > 0.1) {
    warnings.push(
      `sample times are irregular (intervals up to ${round(timing.maxIntervalS, 4)} s against a median of ${round(1 / fs, 4)} s); resampled to ${round(fs, 3)} Hz by linear interpolation`,
    );
  }
  if (fs < 50) warnings.push(`sampling rate ${round(fs, 2)} Hz is low; peaks and velocities may be underestimated`);
  const startS = timeS[0];
  const m = Math.floor((timeS[timeS.length - 1] - startS) * fs + 1e-6) + 1;
  const gridS = new Float64Array(m);
  for (let i = 0; i < m; i++) gridS[i] = i / fs;
  const cutoffHz = Math.min(ANGLE_CUTOFF_HZ, 0.4 * fs);
  const sos = butterworthLowPass(FILTER_ORDER, cutoffHz, fs);

  let gyroRaw: Float64Array | null = null;
  let gyroFiltered: Float64Array | null = null;
  let spikes = 0;
  if (gyroIn) {
    gyroRaw = resampleLinear(timeS, gyroIn, startS, fs, new Float64Array(m));
    spikes += removeSpikes(gyroRaw, SPIKE_FLOOR_DPS);
    gyroFiltered = zeroPhaseFilter(sos, gyroRaw, new Float64Array(m), edgePad(fs, cutoffHz));
  }

  let stage: AngleStage;
  let gyroBias: ((i: number) => number) | null = null;
  if (angleIn) {
    const angleRaw = resampleLinear(timeS, angleIn, startS, fs, new Float64Array(m));
    spikes += removeSpikes(angleRaw, SPIKE_FLOOR_DEG);
    stage = angleStage(file, angleRaw, sos, fs, cutoffHz, lastLine);
  } else {
    const gyro = gyroRaw as Float64Array;
    const filtered = gyroFiltered as Float64Array;
    const startAngle = options.gyroStartAngleDeg ?? 0;
    const result = reconstructFromGyro(file, gyro, filtered, sos, fs, cutoffHz, startAngle, lastLine, warnings);
    stage = result.stage;
    gyroBias = result.bias;
    warnings.push(
      `angle reconstructed from gyro_dps; absolute angles assume the leg was held at ${round(startAngle, 2)}° (A0, A1, R2 and areas do not depend on this)`,
    );
  }
  if (spikes > 0) warnings.push(`${spikes} isolated spike${spikes === 1 ? '' : 's'} replaced by the local median`);

  const { angleDeg, velocityDps, release, rest, filteredNoiseDeg } = stage;
  const releaseIndex = release.index;
  const i0 = Math.min(Math.ceil(releaseIndex), m - 1);
  const restAngle = rest.restAngleDeg;
  const startAngle = release.startAngleDeg;
  const window = Math.max(3, Math.round(REST_WINDOW_S * fs));

  // Extrema by prominence between release and the start of the plateau.
  const extremaEnd = Math.min(m, rest.onsetIndex + window);
  const minProminence = Math.max(0.5, 4 * filteredNoiseDeg);
  const capacity = Math.max(4, Math.ceil(((extremaEnd - i0) / fs) * 20));
  const maxBuffer = new Int32Array(capacity);
  const minBuffer = new Int32Array(capacity);
  const maxCount = prominentPeaks(angleDeg, i0, extremaEnd, minProminence, maxBuffer, 1);
  const minCount = prominentPeaks(angleDeg, i0, extremaEnd, minProminence, minBuffer, -1);
  const flexionPeaks = maxBuffer.slice(0, maxCount);
  const extensionPeaks = minBuffer.slice(0, minCount);

  // First flexion peak: first prominent maximum after the fastest flexion; else the stall.
  let firstPeakIndex = -1;
  let firstPeakAt = Number.NaN;
  let firstPeakDeg = Number.NaN;
  for (const p of flexionPeaks) {
    if (p > release.peakVelocityIndex) {
      firstPeakIndex = p;
      [firstPeakAt, firstPeakDeg] = refineExtremum(angleDeg, p);
      break;
    }
  }
  if (firstPeakIndex < 0) {
    let i = release.peakVelocityIndex;
    const stall = 0.1 * velocityDps[release.peakVelocityIndex];
    while (i < rest.onsetIndex && !(velocityDps[i] <= stall && velocityDps[i] <= velocityDps[i + 1])) i++;
    firstPeakIndex = i;
    firstPeakAt = i;
    firstPeakDeg = angleDeg[i];
    warnings.push('the first swing did not turn back before rest; the first peak is taken where the downswing stalled');
  }

  const a0 = restAngle - startAngle;
  const a1 = firstPeakDeg - startAngle;
  const r2 = a0 > 0 ? a1 / a0 : Number.NaN;
  if (!(a0 > 0)) warnings.push(`resting angle is not beyond the starting angle (A0 = ${round(a0, 2)}°); R2 is undefined`);

  let peakCount = 0;
  let firstPeriodS: number | null = null;
  let firstCountingAt = Number.NaN;
  for (const p of flexionPeaks) {
    if (p < firstPeakIndex) continue;
    const [at, value] = refineExtremum(angleDeg, p);
    if (!(value - restAngle > PEAK_COUNT_MARGIN_DEG)) continue;
    peakCount++;
    // First period: between the first two flexion peaks that pass rest by the margin, whichever they
    // are (an early catch in an extension-type leg can make the very first maximum fall short).
    if (peakCount === 1) firstCountingAt = at;
    else if (peakCount === 2) firstPeriodS = (at - firstCountingAt) / fs;
  }

  // Peak flexion velocity of the first downswing (the gyro, when given, measures it directly).
  let peakVelocity = -Infinity;
  for (let i = i0; i <= firstPeakIndex; i++) {
    const v = gyroFiltered && angleIn ? gyroFiltered[i] : gyroFiltered && gyroBias ? gyroFiltered[i] - gyroBias(i) : velocityDps[i];
    if (v > peakVelocity) peakVelocity = v;
  }

  const [flexionArea, extensionArea] = sideAreas(angleDeg, restAngle, releaseIndex, rest.onsetIndex, fs);
  const dominantSide =
    flexionArea >= DOMINANT_AREA_RATIO * extensionArea && flexionArea > 0
      ? 'flexion'
      : extensionArea >= DOMINANT_AREA_RATIO * flexionArea && extensionArea > 0
        ? 'extension'
        : 'balanced';

  // Damped-cosine fit from release to one second into the plateau, at about 100 Hz.
  const fitEnd = Math.min(m, rest.onsetIndex + Math.round(fs));
  const firstPeakS = (firstPeakAt - releaseIndex) / fs;
  const decayRatio = (firstPeakDeg - restAngle) / Math.max(a0, 1e-9);
  const fit = fitDampedCosine(gridS, angleDeg, i0, fitEnd, Math.max(1, Math.round(fs / FIT_RATE_HZ)), {
    restDeg: restAngle,
    amplitudeDeg: Math.max(a0, 1),
    tauS: decayRatio > 0.01 && decayRatio < 1 ? -firstPeakS / Math.log(decayRatio) : firstPeakS,
    omegaRadS: Math.PI / Math.max(firstPeakS, 2 / fs),
    phaseRad: Math.PI,
  });
  const fitIndices: PendulumFitIndices = fit.converged
    ? { amplitudeDeg: fit.amplitudeDeg, tauS: fit.tauS, omegaRadS: fit.omegaRadS, r2: fit.r2, converged: true, phaseRad: fit.phaseRad, restDeg: fit.restDeg }
    : { amplitudeDeg: null, tauS: null, omegaRadS: null, r2: null, converged: false, phaseRad: null, restDeg: null };
  if (!fit.converged) warnings.push('the damped-cosine fit did not converge; no fit values are reported');
  else if (fit.r2 < 0.8) warnings.push(`the damped-cosine fit explains ${round(100 * fit.r2, 0)} % of the swing; it is not a simple damped oscillation`);

  let emg: PendulumEmgIndices | null = null;
  let envelope: Float64Array | null = null;
  if (emgIn) {
    const emgRaw = resampleLinear(timeS, emgIn, startS, fs, new Float64Array(m));
    envelope = emgEnvelope(emgRaw, fs, new Float64Array(m));
    if (fs < 500) warnings.push(`EMG sampled at ${round(fs, 1)} Hz; surface EMG needs about 1000 Hz, so the envelope is only indicative`);
    emg = emgSummary(envelope, fs, releaseIndex, rest, flexionPeaks, extensionPeaks, firstPeakIndex, options.emgThresholdK ?? 3, warnings);
  }

  cautionWarnings(warnings, {
    startAngle,
    restAngle,
    r2,
    peakCount,
    dominantSide,
    fitTau: fit.converged ? fit.tauS : Number.NaN,
    holdS: release.holdS,
    plateauS: (m - rest.onsetIndex) / fs,
  });

  const indices: PendulumIndices = {
    releaseTimeS: startS + releaseIndex / fs,
    startAngleDeg: startAngle,
    restAngleDeg: restAngle,
    firstPeakDeg,
    firstPeakTimeS: firstPeakS,
    a0Deg: a0,
    a1Deg: a1,
    relaxationIndex: r2,
    normalizedRelaxationIndex: r2 / TYPICAL_RELAXATION_INDEX,
    peakCount,
    firstPeriodS,
    peakFlexionVelocityDps: peakVelocity,
    flexionAreaDegS: flexionArea,
    extensionAreaDegS: extensionArea,
    dominantSide,
    fit: fitIndices,
    emg,
    sampleRateHz: fs,
    restOnsetS: (rest.onsetIndex - releaseIndex) / fs,
    angleSource: angleIn ? 'angle' : 'gyro',
    warnings,
  };
  return {
    indices,
    signals: {
      startS,
      sampleRateHz: fs,
      angleDeg,
      velocityDps,
      emgEnvelopeUv: envelope,
      releaseIndex,
      firstPeakIndex: firstPeakAt,
      restOnsetIndex: rest.onsetIndex,
      restEndIndex: rest.endIndex,
      flexionPeakIndices: flexionPeaks,
      extensionPeakIndices: extensionPeaks,
    },
  };
}

function checkColumns(
  file: string,
  timeS: Float64Array,
  angle: Float64Array | null,
  gyro: Float64Array | null,
  emg: Float64Array | null,
  lineOf: (i: number) => number,
): void {
  if (!angle && !gyro) throw new PendulumInputError(file, null, 'no angle and no gyro column');
  const n = timeS.length;
  if (n < 2) throw new PendulumInputError(file, null, n === 0 ? 'no data rows' : 'only one data row; a recording needs many');
  const columns: [string, Float64Array | null][] = [['angle', angle], ['gyro', gyro], ['emg', emg]];
  for (const [name, column] of columns) {
    if (column && column.length !== n) throw new PendulumInputError(file, null, `${name} column has ${column.length} samples, time has ${n}`);
  }
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(timeS[i])) throw new PendulumInputError(file, lineOf(i), 'non-finite time');
    if (i > 0 && !(timeS[i] > timeS[i - 1])) throw new PendulumInputError(file, lineOf(i), 'time not strictly increasing');
  }
  for (const [name, column] of columns) {
    if (!column) continue;
    for (let i = 0; i < n; i++) {
      if (!Number.isFinite(column[i])) throw new PendulumInputError(file, lineOf(i), `non-finite ${name} value`);
    }
  }
  if (angle) {
    for (let i = 0; i < n; i++) {
      if (angle[i] < -30 || angle[i] > 180) {
        throw new PendulumInputError(file, lineOf(i), `angle ${round(angle[i], 3)} degrees outside -30..180 degrees`);
      }
    }
  }
}

function angleStage(file: string, angleRaw: Float64Array, sos: Float64Array, fs: number, cutoffHz: number, lastLine: number): AngleStage {
  const m = angleRaw.length;
  const angleDeg = zeroPhaseFilter(sos, angleRaw, new Float64Array(m), edgePad(fs, cutoffHz));
  // Noise: robust spread of what the filter removed, scaled to the share of white noise it keeps.
  // Every k-th sample (at most ~4000) estimates a noise level as well as all of them.
  const stride = Math.max(1, Math.floor(m / 4000));
  const residual = new Float64Array(Math.ceil(m / stride));
  for (let i = 0, j = 0; i < m; i += stride, j++) residual[j] = Math.abs(angleRaw[i] - angleDeg[i]);
  const removedNoise = 1.4826 * medianInPlace(residual);
  const kept = Math.min(0.8, (2 * cutoffHz) / fs);
  const filteredNoiseDeg = removedNoise * Math.sqrt(kept / (1 - kept));
  const velocityDps = centralDifference(angleDeg, fs, new Float64Array(m));
  const release = detectRelease(angleDeg, velocityDps, fs);
  if (!release) {
    let fastest = 0;
    for (let i = 0; i < m; i++) if (velocityDps[i] > fastest) fastest = velocityDps[i];
    throw new PendulumInputError(
      file,
      null,
      `no release found: the leg never falls (fastest flexion ${round(fastest, 1)} deg/s, a drop reaches at least ${MIN_DROP_VELOCITY_DPS} deg/s)`,
    );
  }
  let top = release.peakVelocityIndex;
  while (top < m - 1 && velocityDps[top] > 0) top++;
  const restToleranceDeg = Math.max(1, 6 * filteredNoiseDeg);
  // A recording may stop soon after the leg settles: then half the window with half the band.
  const rest =
    detectRest(angleDeg, fs, top, restToleranceDeg) ??
    detectRest(angleDeg, fs, top, Math.max(0.5, 0.5 * restToleranceDeg), SHORT_REST_WINDOW_S);
  if (!rest) {
    throw new PendulumInputError(
      file,
      lastLine,
      `the recording ends before the leg has come to rest (no ${REST_WINDOW_S} s stretch after the first swing stays within ${round(restToleranceDeg, 2)}°)`,
    );
  }
  if (release.peakVelocityIndex - release.index < 2 && release.onsetIndex === 0) {
    throw new PendulumInputError(file, null, 'no release found: the recording starts while the leg is already falling');
  }
  return { angleDeg, velocityDps, release, rest, filteredNoiseDeg, restToleranceDeg };
}

function reconstructFromGyro(
  file: string,
  gyro: Float64Array,
  filtered: Float64Array,
  sos: Float64Array,
  fs: number,
  cutoffHz: number,
  startAngle: number,
  lastLine: number,
  warnings: string[],
): { stage: AngleStage; bias: (i: number) => number } {
  const m = gyro.length;
  let peak = 0;
  for (let i = 1; i < m; i++) if (filtered[i] > filtered[peak]) peak = i;
  if (!(filtered[peak] >= MIN_DROP_VELOCITY_DPS)) {
    throw new PendulumInputError(
      file,
      null,
      `no release found: the leg never falls (fastest flexion ${round(filtered[peak], 1)} deg/s in gyro_dps, a drop reaches at least ${MIN_DROP_VELOCITY_DPS} deg/s)`,
    );
  }
  const threshold = Math.max(5, 0.05 * filtered[peak]);
  let onset = peak;
  while (onset > 0 && filtered[onset] > threshold) onset--;
  // Still period before release: back from the onset while the filtered gyro stays within 5 deg/s
  // of its value there, at most 3 s. The bias is the mean over it (the least-squares estimate:
  // it makes the integrated angle flat over the hold).
  const margin = Math.round(0.05 * fs);
  const preEnd = Math.max(0, onset - margin);
  let preStart = preEnd;
  const still = preEnd > 0 ? filtered[preEnd] : 0;
  while (preStart > 0 && preEnd - preStart < 3 * fs && Math.abs(filtered[preStart - 1] - still) <= 5) preStart--;
  const meanOfGyro = (from: number, to: number): number => meanOf(gyro, from, to);
  let biasPre = 0;
  let anchorPre = 0;
  if (preEnd - preStart >= Math.max(3, Math.round(0.1 * fs))) {
    biasPre = meanOfGyro(preStart, preEnd);
    anchorPre = (preStart + preEnd) / 2;
  } else {
    warnings.push('no still period before release; the gyro bias before release was not estimated');
  }
  // First pass: the final half second pins the bias at the end (a recording ends at rest).
  const tail = Math.max(3, Math.round(0.5 * fs));
  const scratch = new Float64Array(tail);
  scratch.set(gyro.subarray(m - tail, m));
  let biasPost = medianInPlace(scratch);
  let anchorPost = m - tail / 2;
  const angleRaw = new Float64Array(m);
  const build = (): AngleStage => {
    integrateGyro(gyro, fs, biasPre, anchorPre, biasPost, anchorPost, 0, angleRaw);
    const reference = preEnd - preStart >= 3 ? meanOf(angleRaw, preStart, preEnd) : angleRaw[Math.max(onset, 0)];
    for (let i = 0; i < m; i++) angleRaw[i] += startAngle - reference;
    return angleStage(file, angleRaw, sos, fs, cutoffHz, lastLine);
  };
  let stage = build();
  // Second pass: the still period after rest is the last (up to) 3 s of the detected plateau, where
  // any residual wobble is smallest; the mean gyro there is the bias that keeps the angle flat.
  const plateauEnd = stage.rest.endIndex;
  const plateauStart = Math.max(stage.rest.onsetIndex, plateauEnd - Math.round(3 * fs));
  if (plateauEnd - plateauStart >= Math.round(0.3 * fs)) {
    biasPost = meanOfGyro(plateauStart, plateauEnd);
    anchorPost = (plateauStart + plateauEnd) / 2;
    if (!(anchorPre > 0 || preEnd - preStart >= 3)) biasPre = biasPost;
    stage = build();
  }
  const a = biasPre;
  const b = biasPost;
  const span = anchorPost - anchorPre;
  const bias = (i: number): number => (span <= 0 || i <= anchorPre ? a : i >= anchorPost ? b : a + ((b - a) * (i - anchorPre)) / span);
  return { stage, bias };
}

/**
 * Edge padding of three filter time constants (3·fs/fc samples): long enough for the start-up
 * transient to die out inside the padding, so a slope at either end of the recording is kept.
 */
function edgePad(fs: number, cutoffHz: number): number {
  return Math.ceil((3 * fs) / cutoffHz);
}

function meanOf(values: Float64Array, from: number, to: number): number {
  let sum = 0;
  for (let i = from; i < to; i++) sum += values[i];
  return sum / (to - from);
}

/** Parabolic interpolation through the three samples around an extremum: [fractional index, value]. */
function refineExtremum(values: Float64Array, i: number): [number, number] {
  if (i <= 0 || i >= values.length - 1) return [i, values[i]];
  const left = values[i - 1];
  const centre = values[i];
  const right = values[i + 1];
  const curvature = left - 2 * centre + right;
  if (curvature === 0) return [i, centre];
  const offset = Math.max(-0.5, Math.min(0.5, (0.5 * (left - right)) / curvature));
  return [i + offset, centre - 0.25 * (left - right) * offset];
}

/**
 * Areas between the curve and the resting line from release to rest onset (deg·s), flexion side and
 * extension side, by the trapezoidal rule with each interval split where it crosses the line
 * (exact for the piecewise-linear curve). Neumaier-compensated sums.
 */
function sideAreas(angle: Float64Array, rest: number, fromIndex: number, toIndex: number, fs: number): [number, number] {
  let flexion = 0;
  let flexionC = 0;
  let extension = 0;
  let extensionC = 0;
  const dt = 1 / fs;
  const first = Math.ceil(fromIndex);
  // Partial interval from the fractional release index to the first whole sample.
  let previous = first > 0 && first - fromIndex > 0 ? angle[first - 1] + (angle[first] - angle[first - 1]) * (1 - (first - fromIndex)) - rest : angle[first] - rest;
  let previousDt = (first - fromIndex) * dt;
  for (let i = first; i <= toIndex && i < angle.length; i++) {
    const current = angle[i] - rest;
    const step = i === first ? previousDt : dt;
    let positive: number;
    let negative: number;
    if (previous >= 0 && current >= 0) {
      positive = 0.5 * (previous + current) * step;
      negative = 0;
    } else if (previous <= 0 && current <= 0) {
      positive = 0;
      negative = -0.5 * (previous + current) * step;
    } else {
      const crossing = (Math.abs(previous) / (Math.abs(previous) + Math.abs(current))) * step;
      const a = 0.5 * Math.abs(previous) * crossing;
      const b = 0.5 * Math.abs(current) * (step - crossing);
      positive = previous > 0 ? a : b;
      negative = previous > 0 ? b : a;
    }
    let t = flexion + positive;
    flexionC += Math.abs(flexion) >= positive ? flexion - t + positive : positive - t + flexion;
    flexion = t;
    t = extension + negative;
    extensionC += Math.abs(extension) >= negative ? extension - t + negative : negative - t + extension;
    extension = t;
    previous = current;
    previousDt = dt;
  }
  return [flexion + flexionC, extension + extensionC];
}

function emgSummary(
  envelope: Float64Array,
  fs: number,
  releaseIndex: number,
  rest: RestPlateau,
  flexionPeaks: Int32Array,
  extensionPeaks: Int32Array,
  firstPeakIndex: number,
  k: number,
  warnings: string[],
): PendulumEmgIndices | null {
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
  const offThreshold = mean + 0.5 * k * sd;
  const confirm = mean + EMG_CONFIRM_FACTOR * k * sd;

  // Swing phases: release → first flexion peak → next extension trough → next flexion peak … → rest.
  const boundaries: number[] = [releaseIndex];
  const names: string[] = [];
  let current = firstPeakIndex;
  let swing = 1;
  if (current < rest.onsetIndex) {
    boundaries.push(current);
    names.push('flexion 1');
    for (;;) {
      const trough = extensionPeaks.find((p) => p > current && p < rest.onsetIndex);
      if (trough === undefined) break;
      boundaries.push(trough);
      names.push(`extension ${swing}`);
      swing++;
      const crest = flexionPeaks.find((p) => p > trough && p < rest.onsetIndex);
      if (crest === undefined) break;
      boundaries.push(crest);
      names.push(`flexion ${swing}`);
      current = crest;
    }
  }
  boundaries.push(rest.onsetIndex);
  names.push(names.length % 2 === 1 ? `extension ${swing}` : `flexion ${swing}`);
  const phases: PendulumEmgPhase[] = names.map((phase, p) => ({
    phase,
    startS: (boundaries[p] - releaseIndex) / fs,
    endS: (boundaries[p + 1] - releaseIndex) / fs,
    burstCount: 0,
  }));
  phases.push({ phase: 'rest', startS: (rest.onsetIndex - releaseIndex) / fs, endS: (rest.endIndex - releaseIndex) / fs, burstCount: 0 });

  // Hysteresis and a minimum duration hold the false-alarm rate over a whole recording: a burst
  // starts when the envelope passes the on threshold, runs while it stays above the lower off
  // threshold (its onset stays where it passed the on threshold: the zero-phase envelope already
  // spreads a burst backwards by tens of milliseconds), and counts only when it lasts
  // EMG_MIN_BURST_S and peaks at EMG_CONFIRM_FACTOR times the on threshold's distance from baseline.
  // A 6 Hz envelope of noise wanders for tens of milliseconds at a time, so single crossings of
  // baseline + 3·SD happen every few seconds in a silent muscle; a reflex burst is many times that.
  const minRun = Math.max(1, Math.round(EMG_MIN_BURST_S * fs));
  const bursts: PendulumEmgBurst[] = [];
  let i = Math.ceil(releaseIndex);
  while (i < rest.endIndex) {
    if (envelope[i] < threshold) {
      i++;
      continue;
    }
    const onset = i;
    let peak = envelope[i];
    while (i < envelope.length && envelope[i] >= offThreshold) {
      if (envelope[i] > peak) peak = envelope[i];
      i++;
    }
    if (i - onset < minRun || peak < confirm) continue;
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
  return { baselineMeanUv: mean, baselineSdUv: sd, thresholdUv: threshold, thresholdK: k, bursts, phases };
}

interface CautionInput {
  readonly startAngle: number;
  readonly restAngle: number;
  readonly r2: number;
  readonly peakCount: number;
  readonly dominantSide: string;
  readonly fitTau: number;
  readonly holdS: number;
  readonly plateauS: number;
}

/** Plain-language cautions. R2 alone never stands for "unaffected" when another sign disagrees. */
function cautionWarnings(warnings: string[], c: CautionInput): void {
  if (c.startAngle > 30) warnings.push(`starting angle ${round(c.startAngle, 1)}° is far from full extension; A0, A1 and R2 depend on it`);
  if (c.restAngle < 45 || c.restAngle > 110) {
    warnings.push(`resting angle ${round(c.restAngle, 1)}° is unusual for a freely hanging leg; check positioning, calibration or a contracture`);
  }
  if (c.holdS < 0.1) warnings.push('no steady hold before release; the leg may have been moving when let go');
  if (c.plateauS < 1) warnings.push(`the recording ends ${round(c.plateauS, 2)} s after the leg came to rest; the resting angle rests on a short plateau`);
  if (c.r2 >= 1.3) {
    const others: string[] = [];
    if (c.peakCount <= 2) others.push(`only ${c.peakCount} flexion swing${c.peakCount === 1 ? '' : 's'} passed the resting angle`);
    if (c.dominantSide === 'flexion') others.push('the swing stayed mostly on the flexion side of rest');
    if (c.fitTau < 1) others.push(`the swing died out quickly (fit τ = ${round(c.fitTau, 2)} s)`);
    if (c.restAngle < 45 || c.restAngle > 110) others.push('the resting angle is unusual');
    if (others.length > 0) {
      warnings.push(
        `R2 = ${round(c.r2, 2)} is in or near the relaxed range, but ${others.join('; ')}: do not read this leg as unaffected on R2 alone`,
      );
    }
  }
}

function round(x: number, digits: number): number {
  const f = 10 ** digits;
  return Math.round(x * f) / f;
}
