import { RecordingInputError } from '../../domain';
import { roundTo } from '../../stats';
import { motionSampleCount, type MotionRecording } from './motion-recording';
import { LOW_RATE_HZ, motionTiming, type MotionTiming } from './motion-timing';
import { rateAxisOrder, type RateAxisOrder } from './rate-axis-order';

/** A checked recording's columns, the rotation rate in device axes (x, y, z) in the order used. */
export interface MotionColumns {
  readonly n: number;
  readonly timeMs: Float64Array;
  readonly gx: Float64Array;
  readonly gy: Float64Array;
  readonly gz: Float64Array;
  readonly ax: Float64Array;
  readonly ay: Float64Array;
  readonly az: Float64Array;
  readonly timing: MotionTiming;
  readonly rateOrder: RateAxisOrder;
}

/**
 * Step 0 of reconstructKneeAngle: refuses malformed columns (RecordingInputError naming the row where
 * one row is at fault), times the samples (motionTiming) and picks the rotation-rate order. Device
 * axes of the rotation rate: the current W3C text ("alpha: rate of rotation around the X axis", beta
 * around Y, gamma around Z; w3c/deviceorientation PR #43 for issue #44), as Chrome and Firefox on
 * Android and Safari on iOS deliver it, unless the data clearly follow the older alpha-about-z order
 * (a file from an older tool): then that order, said loudly.
 */
export function motionColumns(file: string, recording: MotionRecording, warnings: string[]): MotionColumns {
  let n: number;
  try {
    n = motionSampleCount(recording);
  } catch (error) {
    throw new RecordingInputError(file, null, (error as Error).message);
  }
  const lineOf = (i: number): number => (recording.lines ? recording.lines[i] : i + 2);
  if (n < 2) throw new RecordingInputError(file, null, n === 0 ? 'no samples' : 'only one sample; a recording needs many');
  const { timeMs, accXMs2: ax, accYMs2: ay, accZMs2: az } = recording;
  for (let i = 0; i < n; i++) {
    if (![timeMs[i], recording.rateAlphaDps[i], recording.rateBetaDps[i], recording.rateGammaDps[i], ax[i], ay[i], az[i]].every(Number.isFinite)) {
      throw new RecordingInputError(file, lineOf(i), 'non-finite value');
    }
    if (i > 0 && !(timeMs[i] > timeMs[i - 1])) throw new RecordingInputError(file, lineOf(i), 'time not strictly increasing');
  }
  const timing = motionTiming(timeMs);
  if (timing.rateHz < LOW_RATE_HZ) {
    warnings.push(`the motion sensor delivered ${roundTo(timing.rateHz, 1)} samples per second, under ${LOW_RATE_HZ}; the fast first swing may be under-sampled`);
  }
  if (timing.droppedSamples > 0) {
    warnings.push(
      `the phone skipped ${timing.droppedSamples} sample${timing.droppedSamples === 1 ? '' : 's'} (longest gap ${roundTo(timing.longestGapMs, 0)} ms); the angle is integrated across the gaps`,
    );
  }
  const orderEvidence = rateAxisOrder(recording);
  const rateOrder: RateAxisOrder = orderEvidence.order === 'legacy' ? 'legacy' : 'current';
  if (rateOrder === 'legacy') {
    warnings.push(
      `the rotation-rate columns look like the older order (rate_alpha_dps about the phone's z axis, beta about x, gamma about y): read in today's order the acceleration along the knee axis would swing by ${roundTo(orderEvidence.currentSpreadMs2, 1)} m/s² instead of ${roundTo(orderEvidence.legacySpreadMs2, 1)} m/s²; analysed in the older order. Today's browsers deliver alpha about x, beta about y, gamma about z`,
    );
  }
  const legacy = rateOrder === 'legacy';
  const gx = legacy ? recording.rateBetaDps : recording.rateAlphaDps;
  const gy = legacy ? recording.rateGammaDps : recording.rateBetaDps;
  const gz = legacy ? recording.rateAlphaDps : recording.rateGammaDps;
  return { n, timeMs, gx, gy, gz, ax, ay, az, timing, rateOrder };
}
