// A second, independent simulator of a knee pendulum test recorded by a phone strapped to the shank,
// written for issue 13 without the first simulator's code or assumptions (its own random source, body
// model, reflex model, mounting geometry and sensor model). It makes the recordings messy the way real
// ones are: a hand-held start with tremor and sway, gyro bias and noise, accelerometer noise and
// bias, jittered time stamps, dropped runs of events (some during the fast first fall), the phone on
// the front or the outer side of either shin, upright, upside down or sideways, rolled and tilted.
//
// Physics. World frame: X forward (the way the seated person faces), Y to their left, Z up; the
// thigh lies level along X and the knee axis is Y for both legs. Knee flexion θ is a right-hand
// rotation of the shank about +Y: θ = 0 shank straight forward, θ = 90° hanging. The shank with the
// foot is one rigid compound pendulum (de Leva 1996 adjustment of Zatsiorsky–Seluyanov, male: shank
// 4.33 % of body mass, centre of mass 44.59 % of its length from the knee, length 24.93 % of height
// (REFERENCES.md §8c); sagittal radius of gyration about the shank's centre 25.5 % of its length and
// the foot (1.37 %) lumped at the ankle — both from memory):
//   I·θ'' = m·g·d·cos θ − K·(θ − θn) − B·θ' − C·tanh(θ'/0.2) + τreflex,
// with a velocity-dependent stretch reflex: activation follows (time constant 40 ms) a drive
// G·max(0, v(t − δ) − vth) of the delayed stretch velocity of the spastic muscle (quadriceps: v = θ'
// in flexion; hamstrings: v = −θ'), and resists that stretch. Severity raises G, K and moves θn.
// Integrated by classical RK4 at 1 kHz with the reflex drive held over each step.
//
// Phone. Device axes (x right, y top, z out of the screen) are a fixed rotation D of the shank frame
// (columns: device axes in shank coordinates at θ = 0). The gyro reads Dᵀ·(θ'·Y) — the knee axis
// never moves — and the accelerometer reads the specific force Dᵀ·R(θ)ᵀ·(a − g), a = α × p + ω × (ω × p)
// at the phone's point p. Rotation rate is delivered as the browsers do (current W3C text):
// alpha about x, beta about y, gamma about z.
import type { MotionRecording } from '../../../src/lib/sensors';

const DEG = Math.PI / 180;

/** SplitMix32-style seeded generator (own, not the project's); returns numbers in [0, 1). */
export function seededUniform(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x9e3779b9) >>> 0;
    let z = state;
    z = Math.imul(z ^ (z >>> 16), 0x85ebca6b) >>> 0;
    z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35) >>> 0;
    z = (z ^ (z >>> 16)) >>> 0;
    return z / 4294967296;
  };
}

function normal(rng: () => number): number {
  // Box–Muller.
  const u = Math.max(rng(), 1e-12);
  return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * rng());
}

export type SpasticityType = 'none' | 'extension' | 'flexion';
export type Severity = 'mild' | 'moderate' | 'severe';
export type Side = 'front' | 'outer';
export type Placement = 'upright' | 'upside-down' | 'sideways-left' | 'sideways-right';

export interface PhonePendulumCase {
  readonly name: string;
  readonly heightM: number;
  readonly massKg: number;
  readonly type: SpasticityType;
  readonly severity: Severity | null;
  readonly leg: 'left' | 'right';
  readonly side: Side;
  readonly placement: Placement;
  readonly rollDeg: number;
  /** Angle between the phone's long axis and the shank's line (deg). */
  readonly tiltDeg: number;
  readonly offsetM: number;
  readonly holdS: number;
  readonly startDeg: number;
  readonly swayDeg: number;
  readonly swayHz: number;
  readonly tremorDeg: number;
  readonly tremorHz: number;
  readonly rateHz: number;
  readonly gyroNoiseDps: number;
  readonly gyroBiasDps: readonly [number, number, number];
  readonly accNoiseMs2: number;
  /** Dropped runs: [first sample index, count]. */
  readonly drops: ReadonlyArray<readonly [number, number]>;
  readonly seed: number;
}

export interface PhonePendulumTruth {
  readonly startDeg: number;
  readonly restDeg: number;
  readonly a0Deg: number;
  readonly a1Deg: number;
  readonly r2: number;
  readonly peakCount: number;
  readonly releaseS: number;
}

export interface PhonePendulumRecording {
  readonly recording: MotionRecording;
  readonly truth: PhonePendulumTruth;
  /** True knee flexion at each kept sample (deg). */
  readonly angleDeg: Float64Array;
}

interface Muscles {
  readonly stiffness: number;
  readonly neutralDeg: number;
  readonly viscous: number;
  readonly friction: number;
  readonly gain: number;
  readonly delayS: number;
  readonly thresholdDps: number;
}

function muscles(type: SpasticityType, severity: Severity | null, rng: () => number): Muscles {
  const level = severity === 'mild' ? 1 : severity === 'moderate' ? 2 : severity === 'severe' ? 3 : 0;
  const passive = { stiffness: 1 + 2 * rng(), neutralDeg: 88 + 6 * rng(), viscous: 0.05 + 0.15 * rng(), friction: 0.2 + 0.3 * rng() };
  if (type === 'none') return { ...passive, gain: 0, delayS: 0.07, thresholdDps: 1e9 };
  const gains = [0, 0.6, 1.6, 4];
  return {
    stiffness: passive.stiffness * (1 + 0.6 * level),
    neutralDeg: passive.neutralDeg + (type === 'extension' ? -6 : 6) * level,
    viscous: passive.viscous * (1 + 0.5 * level),
    friction: passive.friction,
    gain: gains[level] * (0.8 + 0.4 * rng()),
    delayS: 0.05 + 0.04 * rng(),
    thresholdDps: 60 - 12 * level + 20 * rng(),
  };
}

/** Builds the list of cases: every type and severity, every mounting, three rates, both legs. */
export function phonePendulumCases(count: number, seed: number): PhonePendulumCase[] {
  const rng = seededUniform(seed);
  const u = (a: number, b: number) => a + (b - a) * rng();
  const kinds: Array<[SpasticityType, Severity | null]> = [
    ['none', null],
    ['extension', 'mild'],
    ['extension', 'moderate'],
    ['extension', 'severe'],
    ['flexion', 'mild'],
    ['flexion', 'moderate'],
    ['flexion', 'severe'],
  ];
  const placements: Placement[] = ['upright', 'upside-down', 'sideways-left', 'sideways-right'];
  const rates = [50, 60, 100] as const;
  const cases: PhonePendulumCase[] = [];
  for (let c = 0; c < count; c++) {
    const [type, severity] = kinds[c % kinds.length];
    const side: Side = Math.floor(c / 4) % 2 === 0 ? 'front' : 'outer';
    const placement = placements[c % 4];
    const rateHz = rates[c % 3];
    const heightM = u(1.5, 1.95);
    const holdS = u(0.6, 2);
    const total = Math.round((holdS + 15) * rateHz);
    const drops: Array<[number, number]> = [];
    const releaseIndex = Math.round(holdS * rateHz);
    // Every third case loses a run in the fast first fall; others lose runs elsewhere.
    if (c % 3 === 0) drops.push([releaseIndex + Math.round(u(0.05, 0.3) * rateHz), 2 + Math.floor(rng() * 4)]);
    const extra = 1 + Math.floor(rng() * 2);
    for (let k = 0; k < extra; k++) drops.push([Math.round(u(0.1, 0.95) * total), 2 + Math.floor(rng() * 4)]);
    const strongTremor = c % 5 === 0;
    cases.push({
      name: `${String(c + 1).padStart(2, '0')} ${type === 'none' ? 'unaffected' : `${severity} ${type}-type`} ${side}/${placement} ${rateHz} Hz`,
      heightM,
      massKg: u(19, 30) * heightM * heightM,
      type,
      severity,
      leg: c % 2 === 0 ? 'left' : 'right',
      side,
      placement,
      rollDeg: u(-35, 35),
      tiltDeg: u(1, 15),
      offsetM: u(0.14, 0.3),
      holdS,
      startDeg: u(5, 25),
      swayDeg: u(0.02, 0.3),
      swayHz: u(0.3, 1.5),
      tremorDeg: strongTremor ? u(0.02, 0.05) : u(0.005, 0.02),
      tremorHz: u(6, 12),
      rateHz,
      gyroNoiseDps: u(0.05, 1.4),
      gyroBiasDps: [u(-1.5, 1.5), u(-1.5, 1.5), u(-1.5, 1.5)],
      accNoiseMs2: u(0.01, 0.2),
      drops,
      seed: 1000 + c,
    });
  }
  return cases;
}

function rotationAbout(axis: readonly number[], deg: number, v: readonly number[]): number[] {
  // Rodrigues: v cos + (a × v) sin + a (a·v)(1 − cos).
  const c = Math.cos(deg * DEG);
  const s = Math.sin(deg * DEG);
  const [ax, ay, az] = axis;
  const d = ax * v[0] + ay * v[1] + az * v[2];
  return [
    v[0] * c + (ay * v[2] - az * v[1]) * s + ax * d * (1 - c),
    v[1] * c + (az * v[0] - ax * v[2]) * s + ay * d * (1 - c),
    v[2] * c + (ax * v[1] - ay * v[0]) * s + az * d * (1 - c),
  ];
}

function cross(a: readonly number[], b: readonly number[]): number[] {
  return [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]];
}

/** Device axes (x, y, z) in shank coordinates (s = X along the shank, k = Y, n = Z front of the shin). */
function deviceAxes(c: PhonePendulumCase, rng: () => number): number[][] {
  const s = [1, 0, 0];
  const zDevice = c.side === 'front' ? [0, 0, 1] : c.leg === 'left' ? [0, 1, 0] : [0, -1, 0];
  let x: number[];
  let y: number[];
  if (c.placement === 'upright' || c.placement === 'upside-down') {
    y = c.placement === 'upright' ? [-1, 0, 0] : s;
    x = cross(y, zDevice);
  } else {
    x = c.placement === 'sideways-left' ? s : [-1, 0, 0];
    y = cross(zDevice, x);
  }
  let axes = [x, y, zDevice];
  // Roll about the shank's line, then tilt the long axis off that line about a random perpendicular.
  axes = axes.map((v) => rotationAbout(s, c.rollDeg, v));
  const beta = 2 * Math.PI * rng();
  const perpendicular = [0, Math.cos(beta), Math.sin(beta)];
  return axes.map((v) => rotationAbout(perpendicular, c.tiltDeg, v));
}

/** Simulates one case. */
export function simulatePhonePendulum(c: PhonePendulumCase): PhonePendulumRecording {
  const rng = seededUniform(c.seed);
  const g = 9.78 + 0.05 * rng();
  const shankLength = 0.2493 * c.heightM;
  const shankMass = 0.0433 * c.massKg;
  const footMass = 0.0137 * c.massKg;
  const com = 0.4459 * shankLength;
  const inertia = shankMass * ((0.255 * shankLength) ** 2 + com ** 2) + footMass * shankLength ** 2;
  const gravityTorque = g * (shankMass * com + footMass * shankLength);
  const m = muscles(c.type, c.severity, rng);
  const swayPhase = 2 * Math.PI * rng();
  const tremorPhase = 2 * Math.PI * rng();

  // Truth at 1 kHz: held (sway + tremor), then the free pendulum from the release state.
  const h = 0.001;
  const durationS = c.holdS + 15;
  const steps = Math.ceil(durationS / h) + 2;
  const theta = new Float64Array(steps);
  const omega = new Float64Array(steps);
  const alpha = new Float64Array(steps);
  const held = (t: number): [number, number, number] => {
    const ws = 2 * Math.PI * c.swayHz;
    const wt = 2 * Math.PI * c.tremorHz;
    const angle = c.startDeg + c.swayDeg * Math.sin(ws * t + swayPhase) + c.tremorDeg * Math.sin(wt * t + tremorPhase);
    const rate = c.swayDeg * ws * Math.cos(ws * t + swayPhase) + c.tremorDeg * wt * Math.cos(wt * t + tremorPhase);
    const acc = -c.swayDeg * ws * ws * Math.sin(ws * t + swayPhase) - c.tremorDeg * wt * wt * Math.sin(wt * t + tremorPhase);
    return [angle * DEG, rate * DEG, acc * DEG];
  };
  const releaseStep = Math.round(c.holdS / h);
  for (let i = 0; i <= releaseStep; i++) [theta[i], omega[i], alpha[i]] = held(i * h);
  let activation = 0;
  const delaySteps = Math.round(m.delayS / h);
  const stretchSign = c.type === 'flexion' ? -1 : 1;
  const accel = (th: number, om: number, reflex: number): number =>
    (gravityTorque * Math.cos(th) - m.stiffness * (th - m.neutralDeg * DEG) - m.viscous * om - m.friction * Math.tanh(om / 0.2) - stretchSign * reflex) / inertia;
  for (let i = releaseStep; i < steps - 1; i++) {
    const delayed = i - delaySteps >= releaseStep ? omega[i - delaySteps] / DEG : 0;
    const drive = m.gain * Math.max(0, (stretchSign * delayed - m.thresholdDps) * DEG);
    activation += (h / 0.04) * (drive - activation);
    const th = theta[i];
    const om = omega[i];
    const k1t = om;
    const k1o = accel(th, om, activation);
    const k2t = om + 0.5 * h * k1o;
    const k2o = accel(th + 0.5 * h * k1t, k2t, activation);
    const k3t = om + 0.5 * h * k2o;
    const k3o = accel(th + 0.5 * h * k2t, k3t, activation);
    const k4t = om + h * k3o;
    const k4o = accel(th + h * k3t, k4t, activation);
    theta[i + 1] = th + (h / 6) * (k1t + 2 * k2t + 2 * k3t + k4t);
    omega[i + 1] = om + (h / 6) * (k1o + 2 * k2o + 2 * k3o + k4o);
    alpha[i + 1] = accel(theta[i + 1], omega[i + 1], activation);
  }
  alpha[releaseStep] = accel(theta[releaseStep], omega[releaseStep], 0);

  // Truth indices straight from the 1 kHz trajectory.
  const startDeg = theta[releaseStep] / DEG;
  let restSum = 0;
  const restFrom = steps - 1 - Math.round(1 / h);
  for (let i = restFrom; i < steps - 1; i++) restSum += theta[i];
  const restDeg = restSum / (steps - 1 - restFrom) / DEG;
  let firstPeak = Number.NaN;
  let peakCount = 0;
  for (let i = releaseStep + 2; i < steps - 1; i++) {
    if (theta[i] >= theta[i - 1] && theta[i] > theta[i + 1] && omega[i - 1] > 0) {
      const value = theta[i] / DEG;
      if (Number.isNaN(firstPeak)) firstPeak = value;
      if (value - restDeg > 1) peakCount++;
    }
  }
  const a0Deg = restDeg - startDeg;
  const a1Deg = firstPeak - startDeg;

  // Phone frame and point.
  const axes = deviceAxes(c, rng);
  const lift = c.side === 'front' ? 0.02 + 0.03 * rng() : 0.005 * rng();
  const point = [c.offsetM, 0, lift];
  const accBias = [0, 1, 2].map(() => 0.05 * (2 * rng() - 1));
  const accScale = [0, 1, 2].map(() => 1 + 0.01 * (2 * rng() - 1));
  const drift = 0.005 * (2 * rng() - 1);

  const total = Math.floor(durationS * c.rateHz);
  const dropped = new Uint8Array(total);
  for (const [from, count] of c.drops) for (let k = from; k < Math.min(total, from + count); k++) dropped[k] = 1;
  const kept = total - dropped.reduce((a, b) => a + b, 0);
  const cols = Array.from({ length: 7 }, () => new Float64Array(kept));
  const angleDeg = new Float64Array(kept);
  const epochMs = 2500 + 1000 * rng();
  let j = 0;
  for (let i = 0; i < total; i++) {
    if (dropped[i]) continue;
    const t = i / c.rateHz;
    const step = Math.min(steps - 2, Math.floor(t / h));
    const f = t / h - step;
    const th = theta[step] + (theta[step + 1] - theta[step]) * f;
    const om = omega[step] + (omega[step + 1] - omega[step]) * f;
    const al = alpha[step] + (alpha[step + 1] - alpha[step]) * f;
    angleDeg[j] = th / DEG;
    const ct = Math.cos(th);
    const st = Math.sin(th);
    // World position of the point: R_Y(θ)·p, R_Y = [[c,0,s],[0,1,0],[−s,0,c]].
    const px = ct * point[0] + st * point[2];
    const pz = -st * point[0] + ct * point[2];
    // a = α·Y × p + ω·Y × (ω·Y × p); Y × (px, py, pz) = (pz, 0, −px).
    const ax = al * pz - om * om * px;
    const az = -al * px - om * om * pz;
    // Specific force a − g (g = (0, 0, −g)), then into shank coordinates with R_Y(θ)ᵀ.
    const fx = ax;
    const fz = az + g;
    const shank = [ct * fx - st * fz, 0, st * fx + ct * fz];
    const rateShank = [0, om / DEG, 0];
    for (let k = 0; k < 3; k++) {
      const axis = axes[k];
      const specific = axis[0] * shank[0] + axis[1] * shank[1] + axis[2] * shank[2];
      const rate = axis[0] * rateShank[0] + axis[1] * rateShank[1] + axis[2] * rateShank[2];
      cols[1 + k][j] = round4(rate + c.gyroBiasDps[k] + drift * t + c.gyroNoiseDps * normal(rng));
      cols[4 + k][j] = round4(accScale[k] * specific + accBias[k] + c.accNoiseMs2 * normal(rng));
    }
    cols[0][j] = round4(epochMs + 1000 * t + 3 * (2 * rng() - 1));
    j++;
  }
  const [timeMs, rateAlphaDps, rateBetaDps, rateGammaDps, accXMs2, accYMs2, accZMs2] = cols;
  return {
    recording: { timeMs, rateAlphaDps, rateBetaDps, rateGammaDps, accXMs2, accYMs2, accZMs2 },
    truth: { startDeg, restDeg, a0Deg, a1Deg, r2: a1Deg / a0Deg, peakCount, releaseS: c.holdS },
    angleDeg,
  };
}

function round4(x: number): number {
  return Math.round(x * 1e4) / 1e4;
}
