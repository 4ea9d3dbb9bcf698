// Knee pendulum simulator for tests (and later for the sensors helper's tests).
//
// The shank and foot form one rigid compound pendulum hinged at the knee:
//   I·φ'' = −m·g·d·sin(φ − φhang) − K·(φ − φneutral) − B·φ' + τreflex
// with φ the knee flexion angle (0 = full extension), φhang the flexion angle at which the shank hangs
// vertically (90° when seated with the thigh horizontal), segment parameters from Winter's table
// ("foot and leg": mass 0.061·M, centre of mass 0.606·L from the knee, radius of gyration about the
// knee 0.735·L; L = 0.246·H from Drillis & Contini as drawn by Winter; ../shared/REFERENCES.md §8,
// VERIFIED), a linear passive stiffness K and viscous damping B, and a delayed velocity-dependent
// stretch reflex: u(t) = G·max(0, v(t − δ) − v_threshold), where v is the stretch velocity of the
// reflex muscle (knee flexion velocity for the extensors, extension velocity for the flexors),
// smoothed by first-order activation dynamics (time constant 40 ms, common practice for muscle
// activation) into a torque that resists the stretch. Integrated by classical fourth-order
// Runge–Kutta at a high rate (default 2 kHz); the delayed input is held constant over each step.
//
// The truth indices are computed from the simulator's own state (velocity sign changes, the analytic
// equilibrium), not by the engine under test.
import { mulberry32 } from '../../support/seeded-random';

export const GRAVITY_M_S2 = 9.81;
const DEG = Math.PI / 180;

/** Shank + foot as one segment about the knee. */
export interface LegSegment {
  readonly lengthM: number;
  readonly massKg: number;
  readonly comFromKneeM: number;
  readonly inertiaAboutKneeKgM2: number;
  /** m·g·d, the small-angle gravitational stiffness (N·m/rad). */
  readonly gravityTorqueNmPerRad: number;
}

/** Winter's "foot and leg" segment for a body of mass M (kg) and height H (m). */
export function winterFootAndLeg(bodyMassKg: number, heightM: number): LegSegment {
  const lengthM = 0.246 * heightM;
  const massKg = 0.061 * bodyMassKg;
  const comFromKneeM = 0.606 * lengthM;
  const radiusM = 0.735 * lengthM;
  return {
    lengthM,
    massKg,
    comFromKneeM,
    inertiaAboutKneeKgM2: massKg * radiusM * radiusM,
    gravityTorqueNmPerRad: massKg * GRAVITY_M_S2 * comFromKneeM,
  };
}

export type ReflexType = 'extensor' | 'flexor';
export type Severity = 'mild' | 'moderate' | 'severe';

export interface StretchReflex {
  readonly type: ReflexType;
  /** Torque per unit of stretch velocity above threshold (N·m·s/rad). */
  readonly gainNmsPerRad: number;
  readonly delayS: number;
  readonly velocityThresholdDps: number;
  /** First-order activation time constant (s); default 0.04. */
  readonly activationTimeConstantS?: number;
}

/**
 * Passive parameters of the simulated relaxed leg. K = 3 N·m/rad brings the period to about 1.1 s
 * (REFERENCES §7b, DERIVED); B = 0.55 N·m·s/rad is this project's calibration so that a release
 * from full extension gives R2 ≈ 1.66, inside the published healthy range (≈ 1.6, Bajd & Vodovnik
 * 1984, from memory; 1.678 ± 0.090, Kim et al. 1996, VERIFIED abstract). Linear viscosity is a
 * simplification: real knees also show nonlinear resistance.
 */
export const HEALTHY_STIFFNESS_NM_PER_RAD = 3;
export const HEALTHY_DAMPING_NMS_PER_RAD = 0.55;

/**
 * Reflex presets by severity (this project's calibration, not published values): delay 60 ms and
 * threshold 30 deg/s throughout (orders of magnitude typical of a spinal stretch reflex, from
 * memory); the gain grows with severity.
 */
export function reflexForSeverity(type: ReflexType, severity: Severity): StretchReflex {
  const gain = { mild: 0.5, moderate: 1.5, severe: 4 }[severity];
  return { type, gainNmsPerRad: gain, delayS: 0.06, velocityThresholdDps: 30 };
}

export interface PendulumSimulationOptions {
  readonly bodyMassKg?: number;
  readonly heightM?: number;
  readonly stiffnessNmPerRad?: number;
  readonly dampingNmsPerRad?: number;
  /** Flexion angle at which the shank hangs vertically (deg); default 90. */
  readonly hangingAngleDeg?: number;
  /** Angle at which the passive stiffness exerts no torque (deg); default = hangingAngleDeg. */
  readonly neutralAngleDeg?: number;
  readonly startAngleDeg?: number;
  /** Time held at the start angle before release (s); default 1. */
  readonly holdS?: number;
  /** Total duration (s); default 12. */
  readonly durationS?: number;
  /** Integration and output rate (Hz); default 2000. */
  readonly rateHz?: number;
  readonly reflex?: StretchReflex | null;
  /** Added to every time stamp (the file's own time base); default 0. */
  readonly timeOffsetS?: number;
}

/** The simulator's own indices, from its state at the integration rate. */
export interface SimulatedIndices {
  readonly releaseTimeS: number;
  readonly startAngleDeg: number;
  readonly restAngleDeg: number;
  readonly firstPeakDeg: number;
  readonly firstPeakTimeS: number;
  readonly a0Deg: number;
  readonly a1Deg: number;
  readonly relaxationIndex: number;
  readonly peakCount: number;
  readonly firstPeriodS: number | null;
  readonly peakFlexionVelocityDps: number;
  readonly flexionAreaDegS: number;
  readonly extensionAreaDegS: number;
}

export interface SimulatedTrace {
  readonly timeS: Float64Array;
  readonly angleDeg: Float64Array;
  readonly velocityDps: Float64Array;
  /** Reflex torque magnitude (N·m), the muscle's activation, for synthetic EMG. */
  readonly reflexTorqueNm: Float64Array;
  readonly truth: SimulatedIndices;
  readonly segment: LegSegment;
  readonly rateHz: number;
}

/** Runs the simulation and returns the clean trace with its truth indices. */
export function simulatePendulum(options: PendulumSimulationOptions = {}): SimulatedTrace {
  const segment = winterFootAndLeg(options.bodyMassKg ?? 70, options.heightM ?? 1.75);
  const K = options.stiffnessNmPerRad ?? HEALTHY_STIFFNESS_NM_PER_RAD;
  const B = options.dampingNmsPerRad ?? HEALTHY_DAMPING_NMS_PER_RAD;
  const hang = (options.hangingAngleDeg ?? 90) * DEG;
  const neutral = (options.neutralAngleDeg ?? options.hangingAngleDeg ?? 90) * DEG;
  const start = (options.startAngleDeg ?? 0) * DEG;
  const holdS = options.holdS ?? 1;
  const durationS = options.durationS ?? 12;
  const rateHz = options.rateHz ?? 2000;
  const reflex = options.reflex ?? null;
  const offset = options.timeOffsetS ?? 0;
  const I = segment.inertiaAboutKneeKgM2;
  const mgd = segment.gravityTorqueNmPerRad;
  const h = 1 / rateHz;
  const n = Math.floor(durationS * rateHz) + 1;
  const timeS = new Float64Array(n);
  const angle = new Float64Array(n);
  const velocity = new Float64Array(n);
  const torque = new Float64Array(n);
  const releaseStep = Math.round(holdS * rateHz);
  const delaySteps = reflex ? Math.round(reflex.delayS * rateHz) : 0;
  const tauAct = reflex?.activationTimeConstantS ?? 0.04;
  const threshold = reflex ? reflex.velocityThresholdDps * DEG : 0;
  const sign = reflex?.type === 'flexor' ? 1 : -1;

  const acceleration = (phi: number, omega: number, activation: number): number =>
    (-mgd * Math.sin(phi - hang) - K * (phi - neutral) - B * omega + sign * activation) / I;

  let phi = start;
  let omega = 0;
  let act = 0;
  for (let k = 0; k < n; k++) {
    timeS[k] = offset + k * h;
    angle[k] = phi / DEG;
    velocity[k] = omega / DEG;
    torque[k] = act;
    if (k === n - 1) break;
    if (k < releaseStep) continue;
    let u = 0;
    if (reflex) {
      const past = k - delaySteps >= 0 ? velocity[k - delaySteps] * DEG : 0;
      const stretch = reflex.type === 'extensor' ? past : -past;
      u = reflex.gainNmsPerRad * Math.max(0, stretch - threshold);
    }
    const da = (a: number): number => (reflex ? (u - a) / tauAct : 0);
    const k1p = omega;
    const k1w = acceleration(phi, omega, act);
    const k1a = da(act);
    const k2p = omega + 0.5 * h * k1w;
    const k2w = acceleration(phi + 0.5 * h * k1p, omega + 0.5 * h * k1w, act + 0.5 * h * k1a);
    const k2a = da(act + 0.5 * h * k1a);
    const k3p = omega + 0.5 * h * k2w;
    const k3w = acceleration(phi + 0.5 * h * k2p, omega + 0.5 * h * k2w, act + 0.5 * h * k2a);
    const k3a = da(act + 0.5 * h * k2a);
    const k4p = omega + h * k3w;
    const k4w = acceleration(phi + h * k3p, omega + h * k3w, act + h * k3a);
    const k4a = da(act + h * k3a);
    phi += (h / 6) * (k1p + 2 * k2p + 2 * k3p + k4p);
    omega += (h / 6) * (k1w + 2 * k2w + 2 * k3w + k4w);
    act += (h / 6) * (k1a + 2 * k2a + 2 * k3a + k4a);
  }

  // Equilibrium: −mgd·sin(φ − hang) − K(φ − neutral) = 0, by Newton from the hanging angle.
  let rest = hang;
  for (let it = 0; it < 50; it++) {
    const f = -mgd * Math.sin(rest - hang) - K * (rest - neutral);
    const df = -mgd * Math.cos(rest - hang) - K;
    rest -= f / df;
  }
  const truth = truthIndices(timeS, angle, velocity, releaseStep, rest / DEG, offset + holdS);
  return { timeS, angleDeg: angle, velocityDps: velocity, reflexTorqueNm: torque, truth, segment, rateHz };
}

/** Extrema of the clean trace: velocity sign changes, kept when the swing from the previous one exceeds 0.5°. */
function truthIndices(
  timeS: Float64Array,
  angle: Float64Array,
  velocity: Float64Array,
  releaseStep: number,
  restDeg: number,
  releaseTimeS: number,
): SimulatedIndices {
  const n = angle.length;
  const startDeg = angle[releaseStep];
  const maxima: number[] = [];
  const minima: number[] = [];
  let last = angle[releaseStep];
  let lookingForMax = true;
  for (let k = releaseStep + 1; k < n - 1; k++) {
    if (lookingForMax && velocity[k] > 0 && velocity[k + 1] <= 0) {
      if (angle[k] - last > 0.5 || maxima.length === 0) {
        maxima.push(k);
        last = angle[k];
        lookingForMax = false;
      }
    } else if (!lookingForMax && velocity[k] < 0 && velocity[k + 1] >= 0) {
      if (last - angle[k] > 0.5) {
        minima.push(k);
        last = angle[k];
        lookingForMax = true;
      }
    }
  }
  let peakVelocityIndex = releaseStep;
  const firstMax = maxima.length > 0 ? maxima[0] : n - 1;
  for (let k = releaseStep; k <= firstMax; k++) if (velocity[k] > velocity[peakVelocityIndex]) peakVelocityIndex = k;
  let firstPeak = maxima.length > 0 ? maxima[0] : -1;
  if (firstPeak < 0) {
    // Never turned back: the stall, where the downswing velocity has its first local minimum.
    let k = peakVelocityIndex;
    const stall = 0.1 * velocity[peakVelocityIndex];
    while (k < n - 1 && !(velocity[k] <= stall && velocity[k] <= velocity[k + 1])) k++;
    firstPeak = k;
  }
  let flexion = 0;
  let extension = 0;
  const h = timeS[1] - timeS[0];
  for (let k = releaseStep; k < n - 1; k++) {
    const a = angle[k] - restDeg;
    const b = angle[k + 1] - restDeg;
    if (a >= 0 && b >= 0) flexion += 0.5 * (a + b) * h;
    else if (a <= 0 && b <= 0) extension -= 0.5 * (a + b) * h;
    else {
      const c = (Math.abs(a) / (Math.abs(a) + Math.abs(b))) * h;
      const first = 0.5 * Math.abs(a) * c;
      const second = 0.5 * Math.abs(b) * (h - c);
      if (a > 0) {
        flexion += first;
        extension += second;
      } else {
        extension += first;
        flexion += second;
      }
    }
  }
  const peakCount = maxima.filter((k) => angle[k] - restDeg > 1).length;
  const a0 = restDeg - startDeg;
  const a1 = angle[firstPeak] - startDeg;
  return {
    releaseTimeS,
    startAngleDeg: startDeg,
    restAngleDeg: restDeg,
    firstPeakDeg: angle[firstPeak],
    firstPeakTimeS: timeS[firstPeak] - releaseTimeS,
    a0Deg: a0,
    a1Deg: a1,
    relaxationIndex: a1 / a0,
    peakCount,
    // Period between the first two flexion peaks that pass rest by > 1° (issue 13: whichever they are).
    firstPeriodS: ((above) => (above.length >= 2 ? timeS[above[1]] - timeS[above[0]] : null))(maxima.filter((k) => angle[k] - restDeg > 1)),
    peakFlexionVelocityDps: velocity[peakVelocityIndex],
    flexionAreaDegS: flexion,
    extensionAreaDegS: extension,
  };
}

// ---------------------------------------------------------------------------------------------
// Turning a clean trace into a recording: sampling, noise, drift, quantisation, spikes, gyro.

/** Seeded uniform generator in [0, 1): test/support's mulberry32, re-exported for the simulator's users. */
export { mulberry32 };

/** Standard normal deviate by Box–Muller from a uniform generator. */
export function gaussian(rng: () => number): number {
  const u = Math.max(rng(), 1e-300);
  return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * rng());
}

/** A sampled recording: the columns a CSV file would hold. */
export interface SampledTrace {
  timeS: Float64Array;
  angleDeg: Float64Array | null;
  gyroDps: Float64Array | null;
  emgUv: Float64Array | null;
  /** Reflex activation at each sample (N·m), kept for synthetic EMG. */
  reflexTorqueNm: Float64Array;
}

/**
 * Samples the clean trace at `rateHz` (optionally with timing jitter of ±jitterFraction of an
 * interval), using cubic Hermite interpolation of angle with the exact velocity, so sampling adds
 * no interpolation error of its own.
 */
export function sampleTrace(trace: SimulatedTrace, rateHz: number, jitterFraction = 0, rng: () => number = mulberry32(1)): SampledTrace {
  const t0 = trace.timeS[0];
  const duration = trace.timeS[trace.timeS.length - 1] - t0;
  const n = Math.floor(duration * rateHz + 1e-9);
  const timeS = new Float64Array(n);
  const angleDeg = new Float64Array(n);
  const gyroDps = new Float64Array(n);
  const torque = new Float64Array(n);
  const h = 1 / trace.rateHz;
  for (let i = 0; i < n; i++) {
    const jitter = jitterFraction > 0 && i > 0 && i < n - 1 ? (rng() * 2 - 1) * jitterFraction : 0;
    const t = (i + jitter) / rateHz;
    timeS[i] = t0 + t;
    const k = Math.min(Math.floor(t / h), trace.timeS.length - 2);
    const s = (t - k * h) / h;
    const p0 = trace.angleDeg[k];
    const p1 = trace.angleDeg[k + 1];
    const m0 = trace.velocityDps[k] * h;
    const m1 = trace.velocityDps[k + 1] * h;
    const s2 = s * s;
    const s3 = s2 * s;
    angleDeg[i] = (2 * s3 - 3 * s2 + 1) * p0 + (s3 - 2 * s2 + s) * m0 + (-2 * s3 + 3 * s2) * p1 + (s3 - s2) * m1;
    gyroDps[i] = trace.velocityDps[k] + (trace.velocityDps[k + 1] - trace.velocityDps[k]) * s;
    torque[i] = trace.reflexTorqueNm[k] + (trace.reflexTorqueNm[k + 1] - trace.reflexTorqueNm[k]) * s;
  }
  return { timeS, angleDeg, gyroDps, emgUv: null, reflexTorqueNm: torque };
}

/** Returns a copy of `values` with white Gaussian noise of the given SD. */
export function addNoise(values: Float64Array, sd: number, rng: () => number): Float64Array {
  const out = new Float64Array(values.length);
  for (let i = 0; i < values.length; i++) out[i] = values[i] + sd * gaussian(rng);
  return out;
}

/** Returns a copy with a linear drift of `perS` units per second from the first sample. */
export function addDrift(values: Float64Array, timeS: Float64Array, perS: number): Float64Array {
  const out = new Float64Array(values.length);
  for (let i = 0; i < values.length; i++) out[i] = values[i] + perS * (timeS[i] - timeS[0]);
  return out;
}

/** Returns a copy rounded to multiples of `step` (an encoder or ADC resolution). */
export function quantise(values: Float64Array, step: number): Float64Array {
  const out = new Float64Array(values.length);
  for (let i = 0; i < values.length; i++) out[i] = Math.round(values[i] / step) * step;
  return out;
}

/** Returns a copy with `count` single-sample spikes of ±size at random places. */
export function addSpikes(values: Float64Array, count: number, size: number, rng: () => number): Float64Array {
  const out = values.slice();
  for (let s = 0; s < count; s++) {
    const i = Math.floor(rng() * values.length);
    out[i] += (rng() < 0.5 ? -1 : 1) * size;
  }
  return out;
}

/** Gyro-only recording: drops the angle, adds gyro bias (with linear drift) and white noise. */
export function toGyroOnly(
  sampled: SampledTrace,
  options: { biasDps: number; biasDriftDpsPerS: number; noiseDps: number },
  rng: () => number,
): SampledTrace {
  const gyro = sampled.gyroDps as Float64Array;
  const out = new Float64Array(gyro.length);
  const t0 = sampled.timeS[0];
  for (let i = 0; i < gyro.length; i++) {
    out[i] = gyro[i] + options.biasDps + options.biasDriftDpsPerS * (sampled.timeS[i] - t0) + options.noiseDps * gaussian(rng);
  }
  return { ...sampled, angleDeg: null, gyroDps: out };
}

/**
 * Synthetic surface EMG: white Gaussian noise whose SD is baselineUv at rest and grows by uvPerNm for
 * each N·m of reflex torque (a crude but monotone stand-in for motor-unit recruitment).
 */
export function withEmg(sampled: SampledTrace, baselineUv: number, uvPerNm: number, rng: () => number): SampledTrace {
  const emg = new Float64Array(sampled.timeS.length);
  for (let i = 0; i < emg.length; i++) emg[i] = (baselineUv + uvPerNm * sampled.reflexTorqueNm[i]) * gaussian(rng);
  return { ...sampled, emgUv: emg };
}

/**
 * Writes a CSV file body (header + rows) from named columns with `digits` decimals (time columns
 * get at least 4, so that sample times stay distinct up to 10 kHz and strictly increasing).
 */
export function toCsv(columns: Readonly<Record<string, Float64Array | null>>, digits = 4): string {
  const entries = Object.entries(columns).filter((e): e is [string, Float64Array] => e[1] !== null);
  const n = entries[0][1].length;
  const places = entries.map(([name]) => (name === 'time_s' ? Math.max(digits, 4) : name === 'time_ms' ? Math.max(digits, 1) : digits));
  const lines = [entries.map(([name]) => name).join(',')];
  for (let i = 0; i < n; i++) lines.push(entries.map(([, values], c) => values[i].toFixed(places[c])).join(','));
  return `${lines.join('\n')}\n`;
}
