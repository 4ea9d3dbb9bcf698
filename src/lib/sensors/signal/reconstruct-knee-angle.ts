import { MotionInputError } from './motion-input-error';
import { motionSampleCount, STANDARD_GRAVITY_MS2, type MotionRecording } from './motion-recording';
import { LOW_RATE_HZ, motionTiming, type MotionTiming } from './motion-timing';
import { principalAxis } from './principal-axis';
import { rateAxisOrder, type RateAxisOrder } from './rate-axis-order';

export interface KneeAngleOptions {
  /** Name used in refusal messages. */
  readonly fileName?: string;
  /**
   * Knee flexion at the held start (deg), when the examiner knows it better than the phone (e.g. from a
   * goniometer). Default: the phone's own reading of the shank against gravity.
   */
  readonly startAngleDeg?: number;
}

/** The reconstructed knee angle and what was learnt about the sensor on the way. */
export interface KneeAngleReconstruction {
  /** Time stamps in seconds, in the recording's own time base (time_ms / 1000). */
  readonly timeS: Float64Array;
  /** Knee flexion (deg, 0 = straight with a level thigh), increasing as the knee bends. */
  readonly angleDeg: Float64Array;
  /** Gyro-only angle (rest bias removed, no gravity correction), from the same start, for comparison. */
  readonly gyroAngleDeg: Float64Array;
  /** Knee rotation axis on the device axes (x, y, z), oriented so that flexion is positive. */
  readonly axis: Float64Array;
  /** Share of the gyro's second moment about that axis (1 = a pure hinge). */
  readonly axisShare: number;
  /** Gyro rate about the axis (deg/s) averaged over the held start, and over the final rest (the bias used). */
  readonly biasStartDps: number;
  readonly biasEndDps: number;
  /** Held start and final rest as [start, end) sample ranges. */
  readonly hold: readonly [number, number];
  readonly rest: readonly [number, number];
  /** Sample where the first fall starts (the rotation rate first rises past ONSET_RATE_DPS). */
  readonly fallOnset: number;
  /** Knee flexion at the held start, from gravity along the shank (or the caller's startAngleDeg). */
  readonly startAngleDeg: number;
  /** Which device axis was taken as the shank's line ('+y' = the phone's top edge points to the ankle). */
  readonly shankAxis: '+x' | '-x' | '+y' | '-y';
  /**
   * Bound (deg) on absolute angles (start, rest, peaks) from the phone's tilt on the shank within the
   * swing plane, which no reading reveals: MOUNTING_TILT_BOUND_DEG. A0, A1 and R2 are differences and
   * do not carry it.
   */
  readonly absoluteAngleBoundDeg: number;
  /** Angle between the knee axis and the horizontal during the hold (deg); 0 for a level thigh. */
  readonly axisTiltDeg: number;
  /** Rest minus start: by gravity alone and by the gyro alone (deg); their gap says how well they agree. */
  readonly gravityExcursionDeg: number;
  readonly gyroExcursionDeg: number;
  /** The rotation-rate column order used ('current' W3C text unless the data showed the older one). */
  readonly rateOrder: RateAxisOrder;
  readonly timing: MotionTiming;
  /** Plain-language notes on the recording (low rate, dropped samples, older column order, …). */
  readonly warnings: string[];
}

/** Smoothing of the rate magnitude for finding the first fall: ±20 ms moving mean. */
const SMOOTH_HALF_WINDOW_MS = 20;
/** A fall reaches hundreds of deg/s; anything slower than this is no pendulum test (common practice). */
const MIN_FALL_RATE_DPS = 60;
/** The first fall is the first stretch above 30 % of the fastest rate (and above MIN_FALL_RATE_DPS). */
const FALL_SHARE = 0.3;
/** The fall starts where the smoothed rate last rose past this: well above a held leg's tremor and sway
 * (≤ 3 deg/s), bias (≤ 2.6 deg/s in magnitude) and smoothed noise. */
const ONSET_RATE_DPS = 15;
/** Before the hold the angle is gravity's, smoothed over ±100 ms (the hand's tremor and sensor noise). */
const PRE_HOLD_SMOOTH_HALF_WINDOW_MS = 100;
/** The hold is judged over up to 1 s ending 0.1 s before the onset, and needs at least 0.3 s. */
const HOLD_GAP_MS = 100;
const HOLD_MAX_MS = 1000;
const HOLD_MIN_MS = 300;
/** Averaging block for judging a hold or a rest on means rather than single samples. */
const HOLD_BLOCK_MS = 100;
const REST_BLOCK_MS = 250;
/** A hold: every 0.1 s mean of the rotation rate within 8 deg/s of the hold's mean (hand sway reaches ~3). */
const HOLD_RATE_SPREAD_DPS = 8;
/** A rest: every 0.25 s mean within 4 deg/s of the rest's mean (a 0.5° wobble at 1 Hz reaches ~3). */
const REST_RATE_SPREAD_DPS = 4;
/** The final rest is the last 1.5 s (at least 1 s of samples). */
const REST_MS = 1500;
const REST_MIN_MS = 1000;
/** Mean acceleration of a hold or rest within this of g (m/s²): otherwise the phone was being carried. */
const GRAVITY_TOLERANCE_MS2 = 0.6;
/** Samples faster than this (bias removed) count as swing for the axis estimate. */
const MOTION_RATE_DPS = 20;
/** Knee-axis share under which the rotation is no hinge: refused; under the second, a warning. */
const MIN_AXIS_SHARE = 0.8;
const WARN_AXIS_SHARE = 0.95;
/** Knee axis farther than this from level: gravity cannot give the shank's angle. */
const MAX_AXIS_TILT_DEG = 30;
/** Gyro and gravity must agree on start-to-rest within this (deg); a bias error of 0.5 deg/s over 10 s is 5°. */
const MAX_DISAGREEMENT_DEG = 8;
/** Where a pendulum test starts: candidates for the shank's line are judged by their distance from 15°. */
const EXPECTED_START_DEG = 15;
const START_RANGE_DEG: readonly [number, number] = [-25, 60];
/** The first fall must bend the knee by at least this (deg); even a severe catch lets it drop more. */
const MIN_FIRST_FALL_DEG = 10;
/** A hanging leg rests in this range (deg of flexion). */
const REST_RANGE_DEG: readonly [number, number] = [20, 130];
/**
 * How far the phone's long edge may lie off the shank's line within the swing plane (deg): the
 * placement instruction ("along the shin bone") allows 15°; the tibia's front surface itself is a few
 * degrees off the knee–ankle line (from memory). Project choice; no reading can measure it.
 */
export const MOUNTING_TILT_BOUND_DEG = 15;
const DEG = Math.PI / 180;

/**
 * Reconstructs the knee flexion angle of a seated pendulum test from a phone strapped to the shank,
 * recorded with a hand-held start.
 *
 * Method (this project's design; the ingredients are standard inertial-sensing practice):
 * 1. First fall first: the rotation-rate magnitude, smoothed over ±20 ms, first passes 30 % of its
 *    maximum (and 60 deg/s) in the fall; walking back to where it rose past 15 deg/s gives the onset.
 *    Nothing before that is assumed still sample by sample: a held leg shakes with tremor and sway.
 * 2. The hold is the window up to 1 s ending 0.1 s before the onset, judged on 0.1 s means (rotation
 *    within 8 deg/s of its mean, mean acceleration ≈ g); its mean acceleration is gravity at the start.
 * 3. The final rest is the last 1.5 s, judged on 0.25 s means; its mean rotation rate is the gyro bias
 *    (a hanging leg is truly still; the hold's mean carries the hand's sway), and its mean acceleration
 *    is gravity at rest.
 * 4. Knee axis: the dominant eigenvector of Σ ωωᵀ over the bias-free swing samples (principalAxis),
 *    oriented so that the first fall turns positively: the first fast motion is flexion.
 * 5. Shank line: the device x or y axis (the phone lies along the shin, upright, upside down or
 *    sideways), projected on the swing plane; of the four signed candidates, the one that puts the held
 *    start nearest 15° of flexion (candidates are 90° apart, starts lie within 5–25°).
 *    Flexion = atan2(d·s, d·(k × s)) with d the downward direction in the swing plane: 0° with the
 *    shank level, 90° hanging (a level thigh is assumed, as the test prescribes).
 * 6. Angle: the start from gravity, then the gyro about the axis (trapezoidal integration); the gap
 *    between the gyro's and gravity's start-to-rest excursions is removed as a linear bias drift
 *    between the hold's and the rest's centres (exact for a constant bias error). Before the judged
 *    hold (a recording may run minutes before the release) the angle is gravity's, smoothed: the gyro
 *    integrated back over minutes would carry its bias error into the trace.
 * 7. Shape checks, each a refusal that names the recording and the phone: a fall, a steady hold, a
 *    hinge, a level knee axis, gyro and gravity agreeing, a start near extension, a fall into flexion,
 *    a plausible rest.
 *
 * Cost: O(n), a few passes. Throws MotionInputError (file, row, reason) for malformed columns (row
 * named where one row is at fault) and, with no row, for every failed shape check.
 */
export function reconstructKneeAngle(recording: MotionRecording, options: KneeAngleOptions = {}): KneeAngleReconstruction {
  const file = options.fileName ?? 'recording';
  const refuse = (reason: string): never => {
    throw new MotionInputError(file, null, reason);
  };
  let n: number;
  try {
    n = motionSampleCount(recording);
  } catch (error) {
    throw new MotionInputError(file, null, (error as Error).message);
  }
  const lineOf = (i: number): number => (recording.lines ? recording.lines[i] : i + 2);
  if (n < 2) refuse(n === 0 ? 'no samples' : 'only one sample; a recording needs many');
  const { timeMs, accXMs2: ax, accYMs2: ay, accZMs2: az } = recording;
  for (let i = 0; i < n; i++) {
    if (![timeMs[i], recording.rateAlphaDps[i], recording.rateBetaDps[i], recording.rateGammaDps[i], ax[i], ay[i], az[i]].every(Number.isFinite)) {
      throw new MotionInputError(file, lineOf(i), 'non-finite value');
    }
    if (i > 0 && !(timeMs[i] > timeMs[i - 1])) throw new MotionInputError(file, lineOf(i), 'time not strictly increasing');
  }
  const timing = motionTiming(timeMs);
  const warnings: string[] = [];
  if (timing.rateHz < LOW_RATE_HZ) {
    warnings.push(`the motion sensor delivered ${round(timing.rateHz, 1)} samples per second, under ${LOW_RATE_HZ}; the fast first swing may be under-sampled`);
  }
  if (timing.droppedSamples > 0) {
    warnings.push(
      `the phone skipped ${timing.droppedSamples} sample${timing.droppedSamples === 1 ? '' : 's'} (longest gap ${round(timing.longestGapMs, 0)} ms); the angle is integrated across the gaps`,
    );
  }
  // Device axes of the rotation rate: the current W3C text ("alpha: rate of rotation around the X
  // axis", beta around Y, gamma around Z; w3c/deviceorientation PR #43 for issue #44), as Chrome and
  // Firefox on Android and Safari on iOS deliver it, unless the data clearly follow the older
  // alpha-about-z order (a file from an older tool): then that order, said loudly.
  const orderEvidence = rateAxisOrder(recording);
  const rateOrder: RateAxisOrder = orderEvidence.order === 'legacy' ? 'legacy' : 'current';
  if (rateOrder === 'legacy') {
    warnings.push(
      `the rotation-rate columns look like the older order (rate_alpha_dps about the phone's z axis, beta about x, gamma about y): read in today's order the acceleration along the knee axis would swing by ${round(orderEvidence.currentSpreadMs2, 1)} m/s² instead of ${round(orderEvidence.legacySpreadMs2, 1)} m/s²; analysed in the older order. Today's browsers deliver alpha about x, beta about y, gamma about z`,
    );
  }
  const gx = rateOrder === 'legacy' ? recording.rateBetaDps : recording.rateAlphaDps;
  const gy = rateOrder === 'legacy' ? recording.rateGammaDps : recording.rateBetaDps;
  const gz = rateOrder === 'legacy' ? recording.rateAlphaDps : recording.rateGammaDps;

  // 1. The first fall.
  const smooth = movingMean(timeMs, (i) => Math.hypot(gx[i], gy[i], gz[i]), SMOOTH_HALF_WINDOW_MS);
  let fastest = 0;
  for (let i = 0; i < n; i++) if (smooth[i] > fastest) fastest = smooth[i];
  if (fastest < MIN_FALL_RATE_DPS) {
    refuse(`no fall found: the phone never turned faster than ${round(fastest, 0)} deg/s (a released leg reaches hundreds); was the phone strapped to the shank and the leg let go?`);
  }
  const fallThreshold = Math.max(MIN_FALL_RATE_DPS, FALL_SHARE * fastest);
  let fall = 0;
  while (smooth[fall] <= fallThreshold) fall++;
  let onset = fall;
  while (onset > 0 && smooth[onset - 1] > ONSET_RATE_DPS) onset--;

  // 2. The hold, judged on averages.
  const holdEndMs = timeMs[onset] - HOLD_GAP_MS;
  let holdEnd = onset;
  while (holdEnd > 0 && timeMs[holdEnd - 1] > holdEndMs) holdEnd--;
  let holdStart = holdEnd;
  while (holdStart > 0 && timeMs[holdStart - 1] >= holdEndMs - HOLD_MAX_MS) holdStart--;
  if (holdEnd - holdStart < 5 || timeMs[holdEnd - 1] - timeMs[holdStart] < HOLD_MIN_MS) {
    refuse(`the recording starts ${round((timeMs[onset] - timeMs[0]) / 1000, 2)} s before the leg starts to fall; start recording while the leg is held, then let go after a second`);
  }
  const holdRateSpread = blockSpread(timeMs, gx, gy, gz, holdStart, holdEnd, HOLD_BLOCK_MS);
  if (holdRateSpread > HOLD_RATE_SPREAD_DPS) {
    refuse(`the leg was moving before it was let go: in the second before the fall the phone's turning rate varied by ${round(holdRateSpread, 0)} deg/s on average; hold the leg steady, then let go`);
  }
  const gHold = meanVector(ax, ay, az, holdStart, holdEnd);
  const gHoldNorm = norm(gHold);
  if (Math.abs(gHoldNorm - STANDARD_GRAVITY_MS2) > GRAVITY_TOLERANCE_MS2) {
    refuse(`the phone measured ${round(gHoldNorm, 2)} m/s² before the fall instead of gravity's ${round(STANDARD_GRAVITY_MS2, 2)}: it was being moved or its accelerometer is off`);
  }

  // 3. The final rest, judged on averages; its mean rotation rate is the bias.
  let restStart = n;
  while (restStart > 0 && timeMs[restStart - 1] >= timeMs[n - 1] - REST_MS) restStart--;
  const restEnd = n;
  if (restStart <= onset || timeMs[n - 1] - timeMs[restStart] < REST_MIN_MS || restEnd - restStart < 10) {
    refuse('the recording ends before the leg came to rest: keep recording until the leg has hung still for two seconds');
  }
  const restRateSpread = blockSpread(timeMs, gx, gy, gz, restStart, restEnd, REST_BLOCK_MS);
  const gRest = meanVector(ax, ay, az, restStart, restEnd);
  const gRestNorm = norm(gRest);
  if (restRateSpread > REST_RATE_SPREAD_DPS || Math.abs(gRestNorm - STANDARD_GRAVITY_MS2) > GRAVITY_TOLERANCE_MS2) {
    refuse('the recording ends before the leg came to rest (the phone was still turning in its last 1.5 s): keep recording until the leg has hung still for two seconds');
  }
  const bias = meanVector(gx, gy, gz, restStart, restEnd);
  const holdRate = meanVector(gx, gy, gz, holdStart, holdEnd);

  // 4. Knee axis from the swing, oriented so that the first fall is flexion.
  const moment = new Float64Array(9);
  let largest = 0;
  const seed = new Float64Array(3);
  let motionCount = 0;
  const w = new Float64Array(3);
  for (let i = onset; i < restStart; i++) {
    w[0] = gx[i] - bias[0];
    w[1] = gy[i] - bias[1];
    w[2] = gz[i] - bias[2];
    const magnitude = norm(w);
    if (magnitude < MOTION_RATE_DPS) continue;
    motionCount++;
    if (magnitude > largest) {
      largest = magnitude;
      seed.set(w);
    }
    for (let r = 0; r < 3; r++) for (let c = 0; c < 3; c++) moment[3 * r + c] += w[r] * w[c];
  }
  if (motionCount < 3) refuse(`no swing found: the phone turned faster than ${MOTION_RATE_DPS} deg/s on fewer than three samples`);
  const principal = principalAxis(moment, seed);
  const k = principal.axis;
  if (principal.share < MIN_AXIS_SHARE) {
    refuse(`the phone did not turn about one axis (only ${round(100 * principal.share, 0)} % of the rotation was about the knee's): the strap may have slipped or the leg twisted`);
  }
  if (principal.share < WARN_AXIS_SHARE) {
    warnings.push(`only ${round(100 * principal.share, 0)} % of the rotation was about one axis; the leg may have twisted or the phone moved on its strap`);
  }
  let fallSum = 0;
  for (let i = onset; i <= fall; i++) fallSum += k[0] * (gx[i] - bias[0]) + k[1] * (gy[i] - bias[1]) + k[2] * (gz[i] - bias[2]);
  if (fallSum < 0) for (let c = 0; c < 3; c++) k[c] = -k[c];

  const axisTiltDeg = Math.asin(Math.min(1, Math.abs(dot(k, gHold)) / gHoldNorm)) / DEG;
  if (axisTiltDeg > MAX_AXIS_TILT_DEG) {
    refuse(`the knee axis was ${round(axisTiltDeg, 0)}° from level, so gravity cannot give the shank's angle: seat the person with the thigh level`);
  }

  // 5. The shank's line: a signed device x or y axis in the swing plane, nearest a 15° start.
  const candidates: Array<['+x' | '-x' | '+y' | '-y', number[]]> = [
    ['+x', [1, 0, 0]],
    ['-x', [-1, 0, 0]],
    ['+y', [0, 1, 0]],
    ['-y', [0, -1, 0]],
  ];
  let shankAxis: KneeAngleReconstruction['shankAxis'] = '+y';
  let shank = new Float64Array(3);
  let bestStart = Number.NaN;
  for (const [name, e] of candidates) {
    const along = e[0] * k[0] + e[1] * k[1] + e[2] * k[2];
    const s = Float64Array.of(e[0] - along * k[0], e[1] - along * k[1], e[2] - along * k[2]);
    const length = norm(s);
    if (length < 0.5) continue;
    for (let c = 0; c < 3; c++) s[c] /= length;
    const start = flexionFromGravity(gHold, k, s);
    if (Number.isNaN(bestStart) || Math.abs(start - EXPECTED_START_DEG) < Math.abs(bestStart - EXPECTED_START_DEG)) {
      bestStart = start;
      shank = s;
      shankAxis = name;
    }
  }
  if (!(bestStart >= START_RANGE_DEG[0] && bestStart <= START_RANGE_DEG[1])) {
    refuse(
      `the phone's long edge does not seem to lie along the shank, or the leg was not held near straight (the start reads ${round(bestStart, 0)}° of flexion, expected ${START_RANGE_DEG[0]}° to ${START_RANGE_DEG[1]}°)`,
    );
  }
  const gravityStart = bestStart;
  const gravityRest = flexionFromGravity(gRest, k, shank);

  // 6. Gyro about the axis, anchored at the start, drift removed between hold and rest.
  const rate = new Float64Array(n);
  for (let i = 0; i < n; i++) rate[i] = k[0] * (gx[i] - bias[0]) + k[1] * (gy[i] - bias[1]) + k[2] * (gz[i] - bias[2]);
  const psi = new Float64Array(n);
  integrate(timeMs, rate, psi);
  const psiHold = mean(psi, holdStart, holdEnd);
  const gyroExcursionDeg = mean(psi, restStart, restEnd) - psiHold;
  const gravityExcursionDeg = wrap180(gravityRest - gravityStart);
  const disagreement = gyroExcursionDeg - gravityExcursionDeg;
  if (Math.abs(disagreement) > MAX_DISAGREEMENT_DEG) {
    refuse(
      `the phone's gyroscope and its gravity reading disagree by ${round(Math.abs(disagreement), 0)}° between the held start and the rest: the phone may have slipped on its strap or the leg moved other than about the knee`,
    );
  }
  const startAngleDeg = options.startAngleDeg ?? gravityStart;
  const tHold = 0.5 * (timeMs[holdStart] + timeMs[holdEnd - 1]);
  const tRest = 0.5 * (timeMs[restStart] + timeMs[restEnd - 1]);
  const angleDeg = new Float64Array(n);
  const gyroAngleDeg = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const ramp = Math.min(1, Math.max(0, (timeMs[i] - tHold) / (tRest - tHold)));
    gyroAngleDeg[i] = startAngleDeg + psi[i] - psiHold;
    angleDeg[i] = gyroAngleDeg[i] - ramp * disagreement;
  }
  // Before the judged hold the gyro is not anchored: integrated back through minutes of a held leg, the
  // bias left after the rest's estimate (its noise) walks the angle anywhere (issue 20). There the angle
  // is gravity's reading, smoothed, on the same knee axis and shank line: bounded, and as good as the
  // start's own anchor. The test itself starts at the hold.
  if (holdStart > 0) {
    const before = timeMs.subarray(0, holdStart);
    const gxMean = movingMean(before, (i) => ax[i], PRE_HOLD_SMOOTH_HALF_WINDOW_MS);
    const gyMean = movingMean(before, (i) => ay[i], PRE_HOLD_SMOOTH_HALF_WINDOW_MS);
    const gzMean = movingMean(before, (i) => az[i], PRE_HOLD_SMOOTH_HALF_WINDOW_MS);
    const g = new Float64Array(3);
    for (let i = 0; i < holdStart; i++) {
      g[0] = gxMean[i];
      g[1] = gyMean[i];
      g[2] = gzMean[i];
      angleDeg[i] = startAngleDeg + wrap180(flexionFromGravity(g, k, shank) - gravityStart);
    }
  }

  // 7. Shape: a fall into flexion, a plausible rest.
  let deepest = -Infinity;
  for (let i = onset; i < n && timeMs[i] <= timeMs[onset] + 1500; i++) deepest = Math.max(deepest, angleDeg[i]);
  if (deepest - startAngleDeg < MIN_FIRST_FALL_DEG) {
    refuse(`the leg did not fall into flexion: the first fast motion bent the knee by only ${round(deepest - startAngleDeg, 0)}°`);
  }
  const restAngle = startAngleDeg + gravityExcursionDeg;
  if (restAngle < REST_RANGE_DEG[0] || restAngle > REST_RANGE_DEG[1] || restAngle <= startAngleDeg + MIN_FIRST_FALL_DEG) {
    refuse(`the leg came to rest at ${round(restAngle, 0)}° of flexion, which a freely hanging leg does not (expected ${REST_RANGE_DEG[0]}° to ${REST_RANGE_DEG[1]}°, beyond the start)`);
  }
  if (Math.abs(disagreement) > 5) {
    warnings.push(`gyro and gravity disagree by ${round(Math.abs(disagreement), 1)}° between start and rest; gravity was used to correct the angle`);
  }
  const timeS = new Float64Array(n);
  for (let i = 0; i < n; i++) timeS[i] = timeMs[i] / 1000;
  return {
    timeS,
    angleDeg,
    gyroAngleDeg,
    axis: Float64Array.from(k),
    axisShare: principal.share,
    biasStartDps: dot(k, holdRate),
    biasEndDps: dot(k, bias),
    hold: [holdStart, holdEnd],
    rest: [restStart, restEnd],
    fallOnset: onset,
    startAngleDeg,
    shankAxis,
    absoluteAngleBoundDeg: MOUNTING_TILT_BOUND_DEG,
    axisTiltDeg,
    gravityExcursionDeg,
    gyroExcursionDeg,
    rateOrder,
    timing,
    warnings,
  };
}

/** Knee flexion (deg) from a gravity reading g (points up), knee axis k and shank line s (unit, ⊥ k). */
function flexionFromGravity(g: Float64Array, k: Float64Array, s: Float64Array): number {
  // Downward direction d = −g; flexion θ satisfies d·s = sin θ·|d⊥|, d·(k × s) = cos θ·|d⊥|.
  const e0 = k[1] * s[2] - k[2] * s[1];
  const e1 = k[2] * s[0] - k[0] * s[2];
  const e2 = k[0] * s[1] - k[1] * s[0];
  const alongS = -(g[0] * s[0] + g[1] * s[1] + g[2] * s[2]);
  const alongE = -(g[0] * e0 + g[1] * e1 + g[2] * e2);
  return Math.atan2(alongS, alongE) / DEG;
}

/** Moving mean of value(i) over ±halfWindowMs (two pointers, O(n)). */
function movingMean(timeMs: Float64Array, value: (i: number) => number, halfWindowMs: number): Float64Array {
  const n = timeMs.length;
  const values = new Float64Array(n);
  for (let i = 0; i < n; i++) values[i] = value(i);
  const out = new Float64Array(n);
  let lo = 0;
  let hi = 0;
  let sum = 0;
  for (let i = 0; i < n; i++) {
    while (hi < n && timeMs[hi] <= timeMs[i] + halfWindowMs) sum += values[hi++];
    while (timeMs[lo] < timeMs[i] - halfWindowMs) sum -= values[lo++];
    out[i] = sum / (hi - lo);
  }
  return out;
}

/** Largest distance (deg/s) between a block mean of the rotation-rate vector and the window's mean. */
function blockSpread(timeMs: Float64Array, x: Float64Array, y: Float64Array, z: Float64Array, from: number, to: number, blockMs: number): number {
  const overall = meanVector(x, y, z, from, to);
  let worst = 0;
  let start = from;
  while (start < to) {
    let end = start;
    while (end < to && timeMs[end] < timeMs[start] + blockMs) end++;
    const block = meanVector(x, y, z, start, end);
    worst = Math.max(worst, Math.hypot(block[0] - overall[0], block[1] - overall[1], block[2] - overall[2]));
    start = end;
  }
  return worst;
}

/** Trapezoidal integral of a rate (deg/s) over time stamps (ms), from 0; Neumaier-compensated. */
function integrate(timeMs: Float64Array, rateDps: Float64Array, out: Float64Array): void {
  let sum = 0;
  let compensation = 0;
  out[0] = 0;
  for (let i = 1; i < timeMs.length; i++) {
    const increment = 0.5 * (rateDps[i] + rateDps[i - 1]) * ((timeMs[i] - timeMs[i - 1]) / 1000);
    const t = sum + increment;
    compensation += Math.abs(sum) >= Math.abs(increment) ? sum - t + increment : increment - t + sum;
    sum = t;
    out[i] = sum + compensation;
  }
}

function meanVector(x: Float64Array, y: Float64Array, z: Float64Array, from: number, to: number): Float64Array {
  return Float64Array.of(mean(x, from, to), mean(y, from, to), mean(z, from, to));
}

function mean(values: Float64Array, from: number, to: number): number {
  let sum = 0;
  for (let i = from; i < to; i++) sum += values[i];
  return sum / (to - from);
}

function norm(v: ArrayLike<number>): number {
  return Math.hypot(v[0], v[1], v[2]);
}

function dot(a: ArrayLike<number>, b: ArrayLike<number>): number {
  return a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
}

/** Wraps an angle difference into (−180, 180]. */
export function wrap180(deg: number): number {
  const r = deg - 360 * Math.floor((deg + 180) / 360);
  return r === -180 ? 180 : r;
}

function round(x: number, digits: number): number {
  const f = 10 ** digits;
  return Math.round(x * f) / f;
}
