import type { MotionRecording } from './motion-recording';
import { principalAxis } from './principal-axis';

/** Which device axis each rotation-rate column measures. */
export type RateAxisOrder = 'current' | 'legacy';

/** What the data say about the column order, with the evidence. */
export interface RateAxisOrderEvidence {
  /** 'current' or 'legacy' when the evidence is clear; 'undecided' when both read alike. */
  readonly order: RateAxisOrder | 'undecided';
  /** SD of the acceleration along the knee axis during the swing, read in each order (m/s²). */
  readonly currentSpreadMs2: number;
  readonly legacySpreadMs2: number;
}

/** Rotation faster than this counts as swing for the test (deg/s). */
const SWING_RATE_DPS = 30;
/** The wrong order must spread the along-axis acceleration this many times more, and by this much. */
const SPREAD_RATIO = 3;
const MIN_SPREAD_MS2 = 0.8;

/**
 * Writes the angular velocity of sample i on the device axes (x, y, z) under a column order:
 * 'current' (alpha, beta, gamma) as the current W3C text and today's browsers; 'legacy'
 * (beta, gamma, alpha), the older text's alpha-about-z reading.
 */
function angularVelocityInOrder(recording: MotionRecording, i: number, order: RateAxisOrder, out: Float64Array): Float64Array {
  if (order === 'current') {
    out[0] = recording.rateAlphaDps[i];
    out[1] = recording.rateBetaDps[i];
    out[2] = recording.rateGammaDps[i];
  } else {
    out[0] = recording.rateBetaDps[i];
    out[1] = recording.rateGammaDps[i];
    out[2] = recording.rateAlphaDps[i];
  }
  return out;
}

/**
 * Tells from the data whether the rotation-rate columns follow the current W3C order (alpha about x,
 * beta about y, gamma about z) or the older one (alpha about z, beta about x, gamma about y).
 *
 * Physics: the knee is a hinge, so the knee axis is fixed in the phone's frame and every acceleration
 * of a point of the shank (tangential α × p, centripetal ω × (ω × p)) is perpendicular to it; the
 * accelerometer's component along the axis is gravity's, which a horizontal-ish axis keeps nearly
 * constant through the swing. Read in the wrong order, the gyro's principal axis (the knee axis for
 * the right order) points elsewhere, and the acceleration along it swings by metres per second
 * squared. The order whose axis keeps that component steadier wins when it is clearly steadier
 * (SPREAD_RATIO times and MIN_SPREAD_MS2 apart; project choice). If the knee axis happens to lie
 * near (1, 1, 1) on the device axes both orders read alike: 'undecided', and either gives the same
 * angle then.
 *
 * O(n), two passes per order. Never throws; with fewer than 10 swing samples returns 'undecided'.
 */
export function rateAxisOrder(recording: MotionRecording): RateAxisOrderEvidence {
  const currentSpreadMs2 = alongAxisSpread(recording, 'current');
  const legacySpreadMs2 = alongAxisSpread(recording, 'legacy');
  let order: RateAxisOrderEvidence['order'] = 'undecided';
  if (currentSpreadMs2 > SPREAD_RATIO * legacySpreadMs2 && currentSpreadMs2 - legacySpreadMs2 > MIN_SPREAD_MS2) order = 'legacy';
  else if (legacySpreadMs2 > SPREAD_RATIO * currentSpreadMs2 && legacySpreadMs2 - currentSpreadMs2 > MIN_SPREAD_MS2) order = 'current';
  return { order, currentSpreadMs2, legacySpreadMs2 };
}

function alongAxisSpread(recording: MotionRecording, order: RateAxisOrder): number {
  const n = recording.timeMs.length;
  const w = new Float64Array(3);
  const moment = new Float64Array(9);
  const start = new Float64Array(3);
  let largest = 0;
  let count = 0;
  for (let i = 0; i < n; i++) {
    angularVelocityInOrder(recording, i, order, w);
    const magnitude = Math.hypot(w[0], w[1], w[2]);
    if (magnitude < SWING_RATE_DPS) continue;
    count++;
    if (magnitude > largest) {
      largest = magnitude;
      start.set(w);
    }
    for (let r = 0; r < 3; r++) for (let c = 0; c < 3; c++) moment[3 * r + c] += w[r] * w[c];
  }
  if (count < 10) return Number.NaN;
  const axis = principalAxis(moment, start).axis;
  let sum = 0;
  let sumSquares = 0;
  for (let i = 0; i < n; i++) {
    angularVelocityInOrder(recording, i, order, w);
    if (Math.hypot(w[0], w[1], w[2]) < SWING_RATE_DPS) continue;
    const along = axis[0] * recording.accXMs2[i] + axis[1] * recording.accYMs2[i] + axis[2] * recording.accZMs2[i];
    sum += along;
    sumSquares += along * along;
  }
  const mean = sum / count;
  return Math.sqrt(Math.max(0, sumSquares / count - mean * mean));
}
