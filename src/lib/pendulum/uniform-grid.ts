import { RecordingInputError } from '../domain';
import { roundTo } from '../stats';
import { butterworthLowPass } from './butterworth-low-pass';
import { uniformSampleRate } from './uniform-sample-rate';

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

/** The uniform time grid every later step works on, and the low-pass filter for that rate. */
export interface UniformGrid {
  /** Time of the first sample (s); grid times are startS + i / rateHz. */
  readonly startS: number;
  readonly rateHz: number;
  /** Number of grid samples. */
  readonly length: number;
  /** Grid times from the first sample (s). */
  readonly gridS: Float64Array;
  readonly cutoffHz: number;
  /** Second-order sections of the angle low-pass at `cutoffHz`. */
  readonly sos: Float64Array;
}

/**
 * Step 2 of analysePendulumTrace: the uniform rate (1 / median interval), the grid and the filter.
 * Pushes warnings for irregular or low rates. Throws RecordingInputError for a rate under MIN_SAMPLE_RATE_HZ.
 */
export function uniformGrid(file: string, timeS: Float64Array, lastLine: number, warnings: string[]): UniformGrid {
  const timing = uniformSampleRate(timeS);
  if (!(timing.rateHz >= MIN_SAMPLE_RATE_HZ)) {
    throw new RecordingInputError(file, null, `sampling rate ${roundTo(timing.rateHz, 2)} Hz is under ${MIN_SAMPLE_RATE_HZ} Hz (rows 2–${lastLine})`);
  }
  const fs = timing.rateHz;
  if (timing.maxJitter > 0.1) {
    warnings.push(
      `sample times are irregular (intervals up to ${roundTo(timing.maxIntervalS, 4)} s against a median of ${roundTo(1 / fs, 4)} s); resampled to ${roundTo(fs, 3)} Hz by linear interpolation`,
    );
  }
  if (fs < 50) warnings.push(`sampling rate ${roundTo(fs, 2)} Hz is low; peaks and velocities may be underestimated`);
  const startS = timeS[0];
  const length = Math.floor((timeS[timeS.length - 1] - startS) * fs + 1e-6) + 1;
  const gridS = new Float64Array(length);
  for (let i = 0; i < length; i++) gridS[i] = i / fs;
  const cutoffHz = Math.min(ANGLE_CUTOFF_HZ, 0.4 * fs);
  return { startS, rateHz: fs, length, gridS, cutoffHz, sos: butterworthLowPass(FILTER_ORDER, cutoffHz, fs) };
}

/**
 * Edge padding of three filter time constants (3·fs/fc samples): long enough for the start-up
 * transient to die out inside the padding, so a slope at either end of the recording is kept.
 */
export function edgePad(fs: number, cutoffHz: number): number {
  return Math.ceil((3 * fs) / cutoffHz);
}
