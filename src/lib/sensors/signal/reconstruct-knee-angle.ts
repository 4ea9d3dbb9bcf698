import { MotionInputError } from './motion-input-error';
import { motionSampleCount, STANDARD_GRAVITY_MS2, type MotionRecording } from './motion-recording';
import { LOW_RATE_HZ, motionTiming, type MotionTiming } from './motion-timing';
import { principalAxis } from './principal-axis';
import { maskRuns, quietMask } from './quiet-mask';
import { rateAxisOrder } from './rate-axis-order';

export interface KneeAngleOptions {
  /** Name used in refusal messages. */
  readonly fileName?: string;
  /** Knee flexion at the held start (deg); default 0 = full extension. */
  readonly startAngleDeg?: number;
  /** Complementary-filter crossover time constant (s); default GRAVITY_TIME_CONSTANT_S. */
  readonly gravityTimeConstantS?: number;
}

/** The reconstructed knee angle and what was learnt about the sensor on the way. */
export interface KneeAngleReconstruction {
  /** Time stamps in seconds, in the recording's own time base (time_ms / 1000). */
  readonly timeS: Float64Array;
  /** Knee flexion (deg): startAngleDeg at the held start, increasing as the knee bends. */
  readonly angleDeg: Float64Array;
  /** Gyro-only angle (bias and its drift removed, no other use of gravity), for comparison. */
  readonly gyroAngleDeg: Float64Array;
  /** Knee rotation axis on the device axes (x, y, z), oriented so that flexion is positive. */
  readonly axis: Float64Array;
  /** Share of the gyro's second moment about that axis (1 = a pure hinge). */
  readonly axisShare: number;
  /** Gyro bias about the axis (deg/s) in the held start and in the final rest (NaN when no rest). */
  readonly biasStartDps: number;
  readonly biasEndDps: number;
  /** Held start and final rest as [start, end) sample ranges; rest null when none was found. */
  readonly hold: readonly [number, number];
  readonly rest: readonly [number, number] | null;
  /** Elevation of the phone's long edge (device y) above the horizontal during the hold (deg). */
  readonly phoneTiltAtStartDeg: number;
  /** Angle between the knee axis and the horizontal during the hold (deg); 0 for a level thigh. */
  readonly axisTiltDeg: number;
  /** Rest minus start: by gravity alone and by the gyro alone (deg); their gap says how well they agree. */
  readonly gravityExcursionDeg: number;
  readonly gyroExcursionDeg: number;
  /** Fraction of samples where gravity was trusted. */
  readonly gravityTrustedFraction: number;
  readonly timing: MotionTiming;
  /** Plain-language notes on the recording (low rate, dropped samples, disagreement, …). */
  readonly warnings: string[];
}

/**
 * Complementary-filter time constant: 1 s. Why: the accelerometer's angle is exact on average while
 * the leg is quiet but noisy sample to sample (≈ 0.3° at 0.05 m/s² noise); the gyro is smooth but
 * drifts by its residual bias (≈ 0.01–0.1 °/s after the still-period estimate). With τ = 1 s the gyro
 * carries everything faster than about 0.16 Hz and gravity pins the level. Project choice.
 */
export const GRAVITY_TIME_CONSTANT_S = 1;
/** Still: |ω| under 8 °/s (bias included) and |a| within 0.5 m/s² of g, over ±0.15 s. Common practice. */
const STILL_RATE_DPS = 8;
const STILL_HALF_WINDOW_MS = 150;
const GRAVITY_TOLERANCE_MS2 = 0.5;
/** Gravity is trusted when |ω − bias| stays under 10 °/s over ±0.5 s (about one swing period). */
const TRUST_RATE_DPS = 10;
const TRUST_HALF_WINDOW_MS = 500;
/** Samples faster than this (bias removed) count as motion for the axis estimate. */
const MOTION_RATE_DPS = 20;
/** A held start needs at least this long still (ms). */
const MIN_HOLD_MS = 200;
const DEG = Math.PI / 180;

/**
 * Reconstructs the knee flexion angle of a seated pendulum test from a phone strapped to the shank.
 *
 * Method (this project's design; the ingredients are standard inertial-sensing practice):
 * 1. Still periods: quietMask (|ω| < 8 °/s, |a| ≈ g, ±0.15 s). The first still run before any motion
 *    is the held start (the examiner holds the leg straight); the last still run is the rest.
 * 2. Gyro bias: mean rotation-rate vector over the hold; its slow drift (a MEMS bias moves with
 *    temperature) as a linear ramp to the rest, sized so that the gyro's hold-to-rest excursion
 *    matches gravity's (step 5).
 * 3. Knee axis: the knee is a hinge, so the bias-free angular-velocity vectors all lie on one line
 *    through the origin. Its direction is the dominant eigenvector of their (uncentred) second-moment
 *    matrix Σ ω ωᵀ over motion samples, found by power iteration (principalAxis). Any phone
 *    orientation on the shank works; a low eigenvalue share warns of twisting or a slipping strap.
 * 4. Gravity angle: the accelerometer vector projected on the plane perpendicular to the axis turns
 *    by −θ when the shank turns by +θ about the axis (a world-fixed vector seen from the body); its
 *    angle from the held start is the shank's rotation. Projecting removes the phone's roll on the
 *    shin, and measuring from the hold removes its pitch: the mounting tilt cancels.
 * 5. Fusion: a complementary filter (gyro integration, pulled towards the gravity angle with time
 *    constant τ only where gravity is trusted: slow rotation over ±0.5 s and |a| ≈ g), run forward
 *    and backward and blended by how long each pass has integrated since its last trusted sample
 *    (each pass's drift grows with that time), which makes it zero-lag and drift-free at both ends.
 *    Why not a Kalman filter: with one rotational degree of freedom and the bias already pinned by
 *    still periods, a Kalman filter adds a noise model whose accelerometer term during the swing
 *    (tangential α·r and centripetal ω²·r, up to 5 m/s² at 0.25 m from the knee) is neither white nor
 *    Gaussian; gating gravity out explicitly does the same job with one interpretable parameter.
 * 6. Sign and zero: the axis is oriented so that the leg's net motion from hold to rest is positive
 *    (the pendulum test starts extended and ends hanging), and the held start reads startAngleDeg.
 *
 * Assumption, stated: the held start is full extension (0°) unless told otherwise. With the thigh
 * horizontal, the shank is then horizontal at the start and hangs vertical at 90° flexion, so the
 * shank's angle to the vertical is 90° − flexion; the reconstruction itself needs only that the knee
 * axis is roughly horizontal (it uses the gravity component perpendicular to the axis).
 *
 * Cost: O(n), a few passes. Throws MotionInputError (file, row, reason) for: fewer than two samples,
 * unequal columns, non-finite values, time not strictly increasing, no still hold before the motion,
 * no swing (nothing faster than 20 °/s).
 */
export function reconstructKneeAngle(recording: MotionRecording, options: KneeAngleOptions = {}): KneeAngleReconstruction {
  const file = options.fileName ?? 'recording';
  const tau = options.gravityTimeConstantS ?? GRAVITY_TIME_CONSTANT_S;
  const startAngle = options.startAngleDeg ?? 0;
  let n: number;
  try {
    n = motionSampleCount(recording);
  } catch (error) {
    throw new MotionInputError(file, null, (error as Error).message);
  }
  const lineOf = (i: number): number => (recording.lines ? recording.lines[i] : i + 2);
  if (n < 2) throw new MotionInputError(file, null, n === 0 ? 'no samples' : 'only one sample; a recording needs many');
  const { timeMs, accXMs2: ax, accYMs2: ay, accZMs2: az } = recording;
  for (let i = 0; i < n; i++) {
    if (![timeMs[i], recording.rateAlphaDps[i], recording.rateBetaDps[i], recording.rateGammaDps[i], ax[i], ay[i], az[i]].every(Number.isFinite)) throw new MotionInputError(file, lineOf(i), 'non-finite value');
    if (i > 0 && !(timeMs[i] > timeMs[i - 1])) throw new MotionInputError(file, lineOf(i), 'time not strictly increasing');
  }
  const timing = motionTiming(timeMs);
  const warnings: string[] = [];
  // Device axes of the rotation rate: the current W3C text (alpha about x, beta about y, gamma about
  // z, as Chrome and Firefox on Android and Safari on iOS deliver it), unless the data clearly follow
  // the older alpha-about-z order (a file from an older tool): then that order, said loudly.
  const orderEvidence = rateAxisOrder(recording);
  const legacy = orderEvidence.order === 'legacy';
  if (legacy) {
    warnings.push(
      `the rotation-rate columns look like the older order (rate_alpha_dps about the phone's z axis, beta about x, gamma about y): read in today's order the acceleration along the knee axis would swing by ${round(orderEvidence.currentSpreadMs2, 1)} m/s² instead of ${round(orderEvidence.legacySpreadMs2, 1)} m/s²; analysed in the older order. Today's browsers deliver alpha about x, beta about y, gamma about z`,
    );
  }
  const gx = legacy ? recording.rateBetaDps : recording.rateAlphaDps;
  const gy = legacy ? recording.rateGammaDps : recording.rateBetaDps;
  const gz = legacy ? recording.rateAlphaDps : recording.rateGammaDps;
  if (timing.rateHz < LOW_RATE_HZ) {
    warnings.push(`the motion sensor delivered ${round(timing.rateHz, 1)} samples per second, under ${LOW_RATE_HZ}; the fast first swing may be under-sampled`);
  }
  if (timing.droppedSamples > 0) {
    warnings.push(
      `${timing.droppedSamples} sample${timing.droppedSamples === 1 ? ' was' : 's were'} dropped (longest gap ${round(timing.longestGapMs, 0)} ms); the angle is interpolated across gaps`,
    );
  }

  // 1. Still periods.
  const rateMag = new Float64Array(n);
  const accMag = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    rateMag[i] = Math.hypot(gx[i], gy[i], gz[i]);
    accMag[i] = Math.hypot(ax[i], ay[i], az[i]);
  }
  const still = quietMask(timeMs, rateMag, accMag, STANDARD_GRAVITY_MS2, STILL_RATE_DPS, GRAVITY_TOLERANCE_MS2, STILL_HALF_WINDOW_MS, new Uint8Array(n));
  const runs = maskRuns(still).filter(([a, b]) => timeMs[b - 1] - timeMs[a] >= MIN_HOLD_MS);
  if (runs.length === 0 || runs[0][0] > 0.5 * n) {
    throw new MotionInputError(file, null, 'no still hold before the leg moved: hold the leg still, straight, for a second before letting go');
  }
  const hold = runs[0];
  const last = runs[runs.length - 1];
  const rest = runs.length > 1 && last[0] > hold[1] ? last : null;

  // 2. Gyro bias vector from the held start (the leg truly still); its drift is found in step 5.
  const biasA = meanVector(gx, gy, gz, hold[0], hold[1]);
  const tA = 0.5 * (timeMs[hold[0]] + timeMs[hold[1] - 1]);
  const tB = rest ? 0.5 * (timeMs[rest[0]] + timeMs[rest[1] - 1]) : tA;
  const bx = new Float64Array(n);
  const by = new Float64Array(n);
  const bz = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    bx[i] = gx[i] - biasA[0];
    by[i] = gy[i] - biasA[1];
    bz[i] = gz[i] - biasA[2];
  }

  // 3. Knee axis from the second moment of the motion samples.
  const moment = new Float64Array(9);
  let largest = -1;
  let largestIndex = -1;
  let motionCount = 0;
  for (let i = 0; i < n; i++) {
    const m = Math.hypot(bx[i], by[i], bz[i]);
    if (m < MOTION_RATE_DPS) continue;
    motionCount++;
    if (m > largest) {
      largest = m;
      largestIndex = i;
    }
    moment[0] += bx[i] * bx[i];
    moment[1] += bx[i] * by[i];
    moment[2] += bx[i] * bz[i];
    moment[4] += by[i] * by[i];
    moment[5] += by[i] * bz[i];
    moment[8] += bz[i] * bz[i];
  }
  if (motionCount < 3) throw new MotionInputError(file, null, `no swing found: the rotation rate never exceeded ${MOTION_RATE_DPS} deg/s after removing the gyro bias`);
  moment[3] = moment[1];
  moment[6] = moment[2];
  moment[7] = moment[5];
  const principal = principalAxis(moment, Float64Array.of(bx[largestIndex], by[largestIndex], bz[largestIndex]));
  const axis = principal.axis;
  if (principal.share < 0.9) {
    warnings.push(
      `only ${round(100 * principal.share, 0)} % of the rotation was about one axis; the leg may have twisted or the phone slipped on its strap`,
    );
  }

  // Gravity at the hold (mean), for the plane basis and the mounting figures.
  const g0 = meanVector(ax, ay, az, hold[0], hold[1]);
  const g0Norm = Math.hypot(g0[0], g0[1], g0[2]);
  const axisTiltDeg = Math.asin(Math.min(1, Math.abs(dot(axis, g0) / g0Norm))) / DEG;
  const phoneTiltAtStartDeg = Math.asin(Math.max(-1, Math.min(1, g0[1] / g0Norm))) / DEG;
  if (axisTiltDeg > 30) {
    warnings.push(`the knee axis was ${round(axisTiltDeg, 0)}° from horizontal; seat the person with the thigh level so that gravity can correct the angle`);
  }

  // 4–6: projections, then fusion, oriented so that the hold-to-rest motion is positive.
  let sign = 1;
  let result = fuse(sign);
  const netGravity = result.gravityExcursion;
  const netGyro = result.gyroExcursion;
  if ((rest && netGravity < 0) || (!rest && netGyro < 0)) {
    sign = -1;
    result = fuse(sign);
  }
  if (rest && Math.abs(result.gravityExcursion - result.gyroExcursion) > 5) {
    warnings.push(
      `gyro and gravity disagree by ${round(Math.abs(result.gravityExcursion - result.gyroExcursion), 1)}° between start and rest; gravity was used to correct the angle`,
    );
  }
  if (!rest) warnings.push('no still rest at the end of the recording; the gyro bias was taken from the start alone');
  const oriented = Float64Array.of(sign * axis[0], sign * axis[1], sign * axis[2]);
  const timeS = new Float64Array(n);
  for (let i = 0; i < n; i++) timeS[i] = timeMs[i] / 1000;
  return {
    timeS,
    angleDeg: result.angle,
    gyroAngleDeg: result.gyroAngle,
    axis: oriented,
    axisShare: principal.share,
    biasStartDps: sign * dot(axis, biasA),
    biasEndDps: rest ? sign * dot(axis, biasA) + result.driftDps : Number.NaN,
    hold,
    rest,
    phoneTiltAtStartDeg,
    axisTiltDeg,
    gravityExcursionDeg: rest ? result.gravityExcursion : Number.NaN,
    gyroExcursionDeg: rest ? result.gyroExcursion : Number.NaN,
    gravityTrustedFraction: result.trustedFraction,
    timing,
    warnings,
  };

  function fuse(s: number) {
    const k0 = s * axis[0];
    const k1 = s * axis[1];
    const k2 = s * axis[2];
    // Plane basis u, w with u × w = k: u is the hold's gravity with its axis component removed.
    const along = k0 * g0[0] + k1 * g0[1] + k2 * g0[2];
    let u0 = g0[0] - along * k0;
    let u1 = g0[1] - along * k1;
    let u2 = g0[2] - along * k2;
    const un = Math.hypot(u0, u1, u2);
    u0 /= un;
    u1 /= un;
    u2 /= un;
    const w0 = k1 * u2 - k2 * u1;
    const w1 = k2 * u0 - k0 * u2;
    const w2 = k0 * u1 - k1 * u0;
    const rate = new Float64Array(n);
    const gravityAngle = new Float64Array(n);
    const planeMag = new Float64Array(n);
    const rateOff = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      rate[i] = k0 * bx[i] + k1 * by[i] + k2 * bz[i];
      const pu = u0 * ax[i] + u1 * ay[i] + u2 * az[i];
      const pw = w0 * ax[i] + w1 * ay[i] + w2 * az[i];
      // ψ = atan2(pw, pu), ψ0 = 0 by construction of u; the shank angle is −ψ.
      gravityAngle[i] = -Math.atan2(pw, pu) / DEG;
      planeMag[i] = Math.hypot(pu, pw);
      rateOff[i] = Math.hypot(bx[i], by[i], bz[i]);
    }
    const trusted = quietMask(timeMs, rateOff, accMag, STANDARD_GRAVITY_MS2, TRUST_RATE_DPS, GRAVITY_TOLERANCE_MS2, TRUST_HALF_WINDOW_MS, new Uint8Array(n));
    let trustedCount = 0;
    for (let i = 0; i < n; i++) {
      // Gravity in the plane must be substantial, or its angle is noise.
      if (planeMag[i] < 0.5 * STANDARD_GRAVITY_MS2) trusted[i] = 0;
      trustedCount += trusted[i];
    }
    // 5. Bias drift: a ramp β·f(t), f = 0 at the hold's centre rising linearly to 1 at the rest's
    // centre, chosen so that the gyro's hold-to-rest excursion equals gravity's. Comparing means over
    // both still runs (not a rest-period gyro mean) keeps the small last oscillations, which a
    // still-mask lets through, from passing for bias.
    const gyroAngle = new Float64Array(n);
    integrate(timeMs, rate, gyroAngle);
    let gravityExcursion = Number.NaN;
    let gyroExcursion: number;
    let driftDps = 0;
    if (rest) {
      gravityExcursion = unwrappedMean(gravityAngle, rest[0], rest[1], gyroAngle) - unwrappedMean(gravityAngle, hold[0], hold[1], gyroAngle);
      gyroExcursion = mean(gyroAngle, rest[0], rest[1]) - mean(gyroAngle, hold[0], hold[1]);
      const ramp = new Float64Array(n);
      const rampIntegral = new Float64Array(n);
      for (let i = 0; i < n; i++) ramp[i] = tB > tA ? Math.min(1, Math.max(0, (timeMs[i] - tA) / (tB - tA))) : 0;
      integrate(timeMs, ramp, rampIntegral);
      const lever = mean(rampIntegral, rest[0], rest[1]) - mean(rampIntegral, hold[0], hold[1]);
      if (lever > 0) {
        driftDps = (gyroExcursion - gravityExcursion) / lever;
        for (let i = 0; i < n; i++) {
          rate[i] -= driftDps * ramp[i];
          gyroAngle[i] -= driftDps * rampIntegral[i];
        }
      }
    } else {
      gyroExcursion = gyroAngle[n - 1] - mean(gyroAngle, hold[0], hold[1]);
    }
    const forward = new Float64Array(n);
    const ageForward = new Float64Array(n);
    const backward = new Float64Array(n);
    const ageBackward = new Float64Array(n);
    complementaryPass(timeMs, rate, gravityAngle, trusted, tau, 1, forward, ageForward);
    complementaryPass(timeMs, rate, gravityAngle, trusted, tau, -1, backward, ageBackward);
    const angle = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      const af = ageForward[i];
      const ab = ageBackward[i];
      const weightForward = af === 0 && ab === 0 ? 0.5 : !Number.isFinite(ab) ? 1 : !Number.isFinite(af) ? 0 : ab / (af + ab);
      angle[i] = startAngle + weightForward * forward[i] + (1 - weightForward) * backward[i];
      gyroAngle[i] += startAngle;
    }
    return { angle, gyroAngle, gravityExcursion, gyroExcursion, driftDps, trustedFraction: trustedCount / n };
  }
}

/**
 * One pass of the gated complementary filter, forward (direction 1) or backward (−1):
 * predict by trapezoidal integration of `rateDps`, then, where `trusted`, move towards the gravity
 * angle by κ = dt / (τ + dt) of the wrapped difference (so ±180° never jumps). `age` receives the
 * time (s) the pass has integrated without gravity, a proxy for its drift: it grows by dt on every
 * sample and decays by (1 − κ) on trusted ones (Infinity before the first). Writes `out`.
 */
export function complementaryPass(
  timeMs: Float64Array,
  rateDps: Float64Array,
  gravityAngleDeg: Float64Array,
  trusted: Uint8Array,
  tauS: number,
  direction: 1 | -1,
  out: Float64Array,
  age: Float64Array,
): void {
  const n = timeMs.length;
  if (n === 0) return;
  const first = direction === 1 ? 0 : n - 1;
  let estimate = trusted[first] ? gravityAngleDeg[first] : 0;
  let sinceTrusted = trusted[first] ? 0 : Number.POSITIVE_INFINITY;
  out[first] = estimate;
  age[first] = sinceTrusted;
  for (let step = 1; step < n; step++) {
    const i = direction === 1 ? step : n - 1 - step;
    const previous = i - direction;
    const dtS = Math.abs(timeMs[i] - timeMs[previous]) / 1000;
    estimate += direction * 0.5 * (rateDps[i] + rateDps[previous]) * dtS;
    sinceTrusted += dtS;
    if (trusted[i]) {
      if (!Number.isFinite(sinceTrusted)) {
        // First anchor of this pass: take gravity as it is (nothing better is known).
        estimate = gravityAngleDeg[i];
        sinceTrusted = 0;
      } else {
        const kappa = dtS / (tauS + dtS);
        estimate += kappa * wrap180(gravityAngleDeg[i] - estimate);
        // The drift carried in decays with the filter, so its "age" does too.
        sinceTrusted *= 1 - kappa;
      }
    }
    out[i] = estimate;
    age[i] = sinceTrusted;
  }
  // A backward pass that never met a trusted sample has no anchor of its own: mark it unusable.
  if (direction === -1 && !trusted.some((t) => t === 1)) age.fill(Number.POSITIVE_INFINITY);
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

/** Mean of angles over [from, to), each unwrapped near the matching `guide` value. */
function unwrappedMean(angles: Float64Array, from: number, to: number, guide: Float64Array): number {
  let sum = 0;
  for (let i = from; i < to; i++) sum += guide[i] + wrap180(angles[i] - guide[i]);
  return sum / (to - from);
}

function dot(a: Float64Array, b: Float64Array): number {
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
