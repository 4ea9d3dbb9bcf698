// Device-motion streams from the knee pendulum simulation: what a phone strapped to the shank would
// report through the W3C devicemotion event.
//
// World frame: X forward (the way the person faces), Y to the person's left, Z up. The thigh lies
// along +X, the knee axis is +Y, and knee flexion θ is a right-hand rotation about +Y (θ = 0: shank
// straight forward, horizontal; θ = 90°: hanging down). The phone sits on the shin at `offsetM` from
// the knee along the shank and `heightM` in front of the bone; its orientation on the shank is any
// rotation `mounting` (device axes → shank axes at θ = 0).
//
// Rigid-body kinematics: angular velocity θ'·Y; the phone point p = R_Y(θ)·p0 has acceleration
// α × p + ω × (ω × p) (tangential and centripetal terms); the accelerometer reads that minus gravity,
// i.e. a − g with g = (0, 0, −9.81): "acceleration including gravity", +9.81 up at rest. Both are
// expressed on the device axes, then the rotation rate is named per the current W3C text (alpha about x,
// beta about y, gamma about z). Sensor errors: white noise, a constant bias per axis with a slow drift for the gyro,
// a bias per axis for the accelerometer, quantisation to the 0.1 °/s and 0.1 m/s² steps that browsers
// apply for privacy (W3C Device Orientation and Motion: precision is limited to resist
// fingerprinting; the 0.1 steps from memory), timing jitter.
import { GRAVITY_M_S2, gaussian, mulberry32, type SimulatedTrace } from '../pendulum/simulator';
import type { MotionRecording } from '../../../src/lib/sensors';
import { deepFreeze } from '../../support/deep-freeze';

const DEG = Math.PI / 180;

/** A 3×3 rotation matrix, row-major. */
export type Matrix3 = Float64Array;

export interface SensorErrors {
  /** Gyro white noise SD per sample (deg/s). */
  readonly gyroNoiseDps: number;
  /** Gyro bias per axis (deg/s), constant, plus drift per second. */
  readonly gyroBiasDps: readonly [number, number, number];
  readonly gyroDriftDpsPerS: number;
  /** Accelerometer white noise SD per sample (m/s²) and bias per axis (m/s²). */
  readonly accNoiseMs2: number;
  readonly accBiasMs2: readonly [number, number, number];
  /** Quantisation steps (0 = none). */
  readonly gyroStepDps: number;
  readonly accStepMs2: number;
  /** Timing jitter as a fraction of the interval (uniform ±). */
  readonly jitterFraction: number;
}

/**
 * Typical consumer-phone errors (orders of magnitude from memory of MEMS datasheets and of what
 * browsers deliver, not from a cited source): gyro noise 0.1 °/s per sample, bias up to ±1.5 °/s,
 * drift 0.02 °/s per s; accelerometer noise 0.05 m/s², bias up to ±0.05 m/s² per axis (after the
 * phone's own calibration); 0.1-step rounding; ±10 % timing jitter.
 */
export function typicalPhoneErrors(rng: () => number): SensorErrors {
  const u = (a: number) => (2 * rng() - 1) * a;
  return {
    gyroNoiseDps: 0.1,
    gyroBiasDps: [u(1.5), u(1.5), u(1.5)],
    gyroDriftDpsPerS: 0.02,
    accNoiseMs2: 0.05,
    accBiasMs2: [u(0.05), u(0.05), u(0.05)],
    gyroStepDps: 0.1,
    accStepMs2: 0.1,
    jitterFraction: 0.1,
  };
}

export const NO_ERRORS: SensorErrors = deepFreeze({
  gyroNoiseDps: 0,
  gyroBiasDps: [0, 0, 0],
  gyroDriftDpsPerS: 0,
  accNoiseMs2: 0,
  accBiasMs2: [0, 0, 0],
  gyroStepDps: 0,
  accStepMs2: 0,
  jitterFraction: 0,
});

/** Uniformly random rotation (Shoemake 1992, "Uniform random rotations", Graphics Gems III; from memory). */
export function randomRotation(rng: () => number): Matrix3 {
  const u1 = rng();
  const u2 = rng();
  const u3 = rng();
  const a = Math.sqrt(1 - u1);
  const b = Math.sqrt(u1);
  return quaternionToMatrix(a * Math.sin(2 * Math.PI * u2), a * Math.cos(2 * Math.PI * u2), b * Math.sin(2 * Math.PI * u3), b * Math.cos(2 * Math.PI * u3));
}

/** Rotation matrix of a unit quaternion (w, x, y, z). */
export function quaternionToMatrix(w: number, x: number, y: number, z: number): Matrix3 {
  return Float64Array.of(
    1 - 2 * (y * y + z * z), 2 * (x * y - w * z), 2 * (x * z + w * y),
    2 * (x * y + w * z), 1 - 2 * (x * x + z * z), 2 * (y * z - w * x),
    2 * (x * z - w * y), 2 * (y * z + w * x), 1 - 2 * (x * x + y * y),
  );
}

/** Rotation by `deg` about a unit axis (Rodrigues). */
export function axisAngle(ax: number, ay: number, az: number, deg: number): Matrix3 {
  const h = 0.5 * deg * DEG;
  const s = Math.sin(h);
  return quaternionToMatrix(Math.cos(h), ax * s, ay * s, az * s);
}

export function multiply(a: Matrix3, b: Matrix3): Matrix3 {
  const out = new Float64Array(9);
  for (let r = 0; r < 3; r++) for (let c = 0; c < 3; c++) out[3 * r + c] = a[3 * r] * b[c] + a[3 * r + 1] * b[3 + c] + a[3 * r + 2] * b[6 + c];
  return out;
}

/**
 * Phone "strapped to the front of the shin, screen facing out, top towards the knee": device z (out
 * of the screen) along the shin's front (+Z of the shank at extension), device y (top) towards the
 * knee (−X), and so device x = y × z = (−X) × Z = +Y. Columns = device axes in shank coordinates.
 */
export const SHIN_SCREEN_OUT: Matrix3 = Float64Array.of(
  0, -1, 0,
  1, 0, 0,
  0, 0, 1,
);

export interface DeviceMotionOptions {
  /** Phone orientation on the shank: device axes → shank axes (at θ = 0). */
  readonly mounting: Matrix3;
  /** Distance from the knee along the shank (m) and in front of it (m). */
  readonly offsetM: number;
  readonly heightM: number;
  /** Event rate (Hz). */
  readonly rateHz: number;
  readonly errors: SensorErrors;
  readonly seed: number;
  /** Event time of the first sample (ms); default 1000. */
  readonly startMs?: number;
}

export interface DeviceMotionStream {
  readonly recording: MotionRecording;
  /** True knee flexion at each sample time (deg). */
  readonly trueAngleDeg: Float64Array;
}

/**
 * Samples the simulated swing as devicemotion events. The trace's angle, velocity and (by central
 * differences of the velocity at the simulator's 2 kHz) acceleration are interpolated linearly at
 * each event time; at 2 kHz that adds far less than the sensor noise.
 */
export function deviceMotionFromSwing(trace: SimulatedTrace, options: DeviceMotionOptions): DeviceMotionStream {
  const rng = mulberry32(options.seed);
  const { mounting, errors } = options;
  const h = 1 / trace.rateHz;
  const m = trace.timeS.length;
  const accel = new Float64Array(m);
  for (let k = 0; k < m; k++) {
    const a = trace.velocityDps[Math.max(0, k - 1)];
    const b = trace.velocityDps[Math.min(m - 1, k + 1)];
    accel[k] = ((b - a) / ((Math.min(m - 1, k + 1) - Math.max(0, k - 1)) * h)) * DEG;
  }
  const durationS = trace.timeS[m - 1] - trace.timeS[0];
  const n = Math.floor(durationS * options.rateHz);
  const startMs = options.startMs ?? 1000;
  const cols = Array.from({ length: 7 }, () => new Float64Array(n));
  const truth = new Float64Array(n);
  const p0 = [options.offsetM, 0, options.heightM];
  for (let i = 0; i < n; i++) {
    const jitter = i > 0 && i < n - 1 ? (2 * rng() - 1) * errors.jitterFraction : 0;
    const t = (i + jitter) / options.rateHz;
    const k = Math.min(Math.floor(t / h), m - 2);
    const s = (t - k * h) / h;
    const theta = (trace.angleDeg[k] + (trace.angleDeg[k + 1] - trace.angleDeg[k]) * s) * DEG;
    const omega = (trace.velocityDps[k] + (trace.velocityDps[k + 1] - trace.velocityDps[k]) * s) * DEG;
    const alpha = accel[k] + (accel[k + 1] - accel[k]) * s;
    truth[i] = theta / DEG;
    // Phone position in the world: R_Y(θ)·p0, with R_Y(θ) = [[c,0,s],[0,1,0],[−s,0,c]].
    const c = Math.cos(theta);
    const sn = Math.sin(theta);
    const px = c * p0[0] + sn * p0[2];
    const pz = -sn * p0[0] + c * p0[2];
    // a = α × p + ω × (ω × p) with ω = (0, ω, 0): α×p = α(pz, 0, −px); ω×(ω×p) = −ω²(px, 0, pz).
    const wx = alpha * pz - omega * omega * px;
    const wz = -alpha * px - omega * omega * pz;
    // Specific force in the world: a − g = a + (0, 0, 9.81).
    const fx = wx;
    const fz = wz + GRAVITY_M_S2;
    // World → shank: R_Y(θ)ᵀ; shank → device: mountingᵀ.
    const sx = c * fx - sn * fz;
    const sz = sn * fx + c * fz;
    const shankF = [sx, 0, sz];
    const shankW = [0, omega / DEG, 0];
    const elapsed = t;
    for (let axis = 0; axis < 3; axis++) {
      // Device component = column `axis` of the mounting matrix · shank vector.
      const f = mounting[axis] * shankF[0] + mounting[3 + axis] * shankF[1] + mounting[6 + axis] * shankF[2];
      const w = mounting[axis] * shankW[0] + mounting[3 + axis] * shankW[1] + mounting[6 + axis] * shankW[2];
      const gyro = w + errors.gyroBiasDps[axis] + errors.gyroDriftDpsPerS * elapsed + errors.gyroNoiseDps * gaussian(rng);
      const acc = f + errors.accBiasMs2[axis] + errors.accNoiseMs2 * gaussian(rng);
      // Device axis order x, y, z → rotation rate alpha, beta, gamma (current W3C text).
      const rateColumn = 1 + axis;
      cols[rateColumn][i] = quantiseTo(gyro, errors.gyroStepDps);
      cols[4 + axis][i] = quantiseTo(acc, errors.accStepMs2);
    }
    cols[0][i] = startMs + t * 1000;
  }
  const [timeMs, rateAlphaDps, rateBetaDps, rateGammaDps, accXMs2, accYMs2, accZMs2] = cols;
  return { recording: { timeMs, rateAlphaDps, rateBetaDps, rateGammaDps, accXMs2, accYMs2, accZMs2 }, trueAngleDeg: truth };
}

/**
 * A phone held still in a given orientation (device axes → world), for inclinometer checks: gravity
 * only, with sensor errors and a little hand tremor (rotation-rate noise of `tremorDps`).
 */
export function staticDeviceMotion(orientation: Matrix3, durationS: number, options: { rateHz: number; errors: SensorErrors; seed: number; tremorDps?: number }): MotionRecording {
  const rng = mulberry32(options.seed);
  const n = Math.floor(durationS * options.rateHz);
  const cols = Array.from({ length: 7 }, () => new Float64Array(n));
  const e = options.errors;
  for (let i = 0; i < n; i++) {
    cols[0][i] = 500 + (i * 1000) / options.rateHz;
    for (let axis = 0; axis < 3; axis++) {
      // World specific force at rest is (0, 0, +g); device component = column `axis` · (0,0,g).
      const f = orientation[6 + axis] * GRAVITY_M_S2;
      cols[4 + axis][i] = quantiseTo(f + e.accBiasMs2[axis] + e.accNoiseMs2 * gaussian(rng), e.accStepMs2);
      const rateColumn = 1 + axis;
      cols[rateColumn][i] = quantiseTo(e.gyroBiasDps[axis] + (e.gyroNoiseDps + (options.tremorDps ?? 0)) * gaussian(rng), e.gyroStepDps);
    }
  }
  const [timeMs, rateAlphaDps, rateBetaDps, rateGammaDps, accXMs2, accYMs2, accZMs2] = cols;
  return { timeMs, rateAlphaDps, rateBetaDps, rateGammaDps, accXMs2, accYMs2, accZMs2 };
}

function quantiseTo(x: number, step: number): number {
  return step > 0 ? Math.round(x / step) * step : x;
}

/** Root-mean-square difference over [from, to). */
export function rmsError(a: Float64Array, b: Float64Array, from = 0, to = a.length): number {
  let sum = 0;
  for (let i = from; i < to; i++) sum += (a[i] - b[i]) ** 2;
  return Math.sqrt(sum / (to - from));
}
