import { STANDARD_GRAVITY_MS2, type MotionRecording } from './motion-recording';

/** Limits of "holding still" for an inclinometer reading. */
export interface SteadyLimits {
  /** Length of the averaging window ending at the latest sample (ms); default 1000. */
  readonly windowMs?: number;
  /** Every |rotation rate| in the window under this (deg/s); default 5. */
  readonly maxRateDps?: number;
  /** Every sample's gravity direction within this of the window mean (deg); default 2. */
  readonly maxSpreadDeg?: number;
  /** |mean acceleration| within this of g (m/s²); default 0.5. */
  readonly maxGravityErrorMs2?: number;
  /** At least this many samples in the window; default 10. */
  readonly minSamples?: number;
}

/** The averaged reading over the latest window, and whether it was steady enough to keep. */
export interface SteadyReading {
  readonly steady: boolean;
  /** Why not steady, in words (empty when steady). */
  readonly reason: string;
  /** Mean acceleration vector over the window (m/s²). */
  readonly meanX: number;
  readonly meanY: number;
  readonly meanZ: number;
  /** Largest angle between one sample's vector and the mean (deg). */
  readonly spreadDeg: number;
  readonly maxRateDps: number;
  readonly samples: number;
}

/**
 * Averages the accelerometer over the last `windowMs` of a recording (samples [0, end)) and checks that
 * the device was held still: few enough rotation, a tight spread of gravity directions, and a mean
 * length near g (no one shaking it). Averaging N samples divides white noise by √N; a 1 s window at
 * 60 Hz turns 0.05 m/s² noise (≈ 0.3°) into ≈ 0.04°. Limits are this project's choice.
 * O(window). Never throws; an empty window is reported as not steady.
 */
export function steadyReading(recording: MotionRecording, end: number, limits: SteadyLimits = {}): SteadyReading {
  const windowMs = limits.windowMs ?? 1000;
  const maxRate = limits.maxRateDps ?? 5;
  const maxSpread = limits.maxSpreadDeg ?? 2;
  const maxGravityError = limits.maxGravityErrorMs2 ?? 0.5;
  const minSamples = limits.minSamples ?? 10;
  const { timeMs, accXMs2: ax, accYMs2: ay, accZMs2: az } = recording;
  let start = end;
  while (start > 0 && timeMs[end - 1] - timeMs[start - 1] <= windowMs) start--;
  const count = end - start;
  let sx = 0;
  let sy = 0;
  let sz = 0;
  let rate = 0;
  for (let i = start; i < end; i++) {
    sx += ax[i];
    sy += ay[i];
    sz += az[i];
    const r = Math.hypot(recording.rateAlphaDps[i], recording.rateBetaDps[i], recording.rateGammaDps[i]);
    if (r > rate) rate = r;
  }
  const mx = count > 0 ? sx / count : Number.NaN;
  const my = count > 0 ? sy / count : Number.NaN;
  const mz = count > 0 ? sz / count : Number.NaN;
  const meanNorm = Math.hypot(mx, my, mz);
  let spread = 0;
  for (let i = start; i < end; i++) {
    const norm = Math.hypot(ax[i], ay[i], az[i]);
    const cos = (ax[i] * mx + ay[i] * my + az[i] * mz) / (norm * meanNorm);
    const angle = Math.acos(Math.min(1, Math.max(-1, cos))) * (180 / Math.PI);
    if (angle > spread) spread = angle;
  }
  let reason = '';
  if (count < minSamples) reason = 'waiting for readings';
  else if (rate > maxRate) reason = 'the phone is turning';
  else if (spread > maxSpread) reason = 'the phone is shaking';
  else if (Math.abs(meanNorm - STANDARD_GRAVITY_MS2) > maxGravityError) reason = 'the phone is being moved';
  return { steady: reason === '', reason, meanX: mx, meanY: my, meanZ: mz, spreadDeg: spread, maxRateDps: rate, samples: count };
}
