// Validation of the knee-angle reconstruction against a physical simulation: the simulated leg
// (test/reference/pendulum/simulator.ts, Winter anthropometry) seen by a simulated phone on the shank
// with realistic sensor errors, the sensor's offset from the knee (tangential and centripetal
// acceleration), any orientation on the shank. Acceptance (issue 9): RMS error < 2° over a swing.
// The measured figures are in the test names.
import { describe, expect, it } from 'vitest';
import { analyseMotionRecording, reconstructKneeAngle } from '../../../src/lib/sensors';
import { GRAVITY_M_S2, mulberry32, reflexForSeverity, simulatePendulum, type SimulatedTrace } from '../pendulum/simulator';
import {
  axisAngle,
  deviceMotionFromSwing,
  multiply,
  NO_ERRORS,
  randomRotation,
  rmsError,
  SHIN_SCREEN_OUT,
  typicalPhoneErrors,
  type Matrix3,
} from './device-motion-simulator';

interface Case {
  readonly name: string;
  readonly trace: SimulatedTrace;
  readonly mounting: (rng: () => number) => Matrix3;
  readonly rateHz: number;
  readonly offsetM: number;
}

const healthy = simulatePendulum({ holdS: 1.5, durationS: 10 });
const severe = simulatePendulum({ holdS: 1.5, durationS: 8, reflex: reflexForSeverity('extensor', 'severe') });
const flexor = simulatePendulum({ holdS: 1.5, durationS: 8, reflex: reflexForSeverity('flexor', 'moderate') });

const CASES: readonly Case[] = [
  { name: 'relaxed leg, phone screen out on the shin, 60 Hz', trace: healthy, mounting: () => SHIN_SCREEN_OUT, rateHz: 60, offsetM: 0.2 },
  { name: 'relaxed leg, phone rolled 20° and pitched 15° on the shin, 100 Hz', trace: healthy, mounting: () => multiply(SHIN_SCREEN_OUT, multiply(axisAngle(0, 1, 0, 20), axisAngle(1, 0, 0, 15))), rateHz: 100, offsetM: 0.25 },
  { name: 'relaxed leg, phone in a random orientation, 60 Hz, 0.3 m from the knee', trace: healthy, mounting: randomRotation, rateHz: 60, offsetM: 0.3 },
  { name: 'severe extensor catch, random orientation, 60 Hz', trace: severe, mounting: randomRotation, rateHz: 60, offsetM: 0.2 },
  { name: 'moderate flexor catch, random orientation, 50 Hz', trace: flexor, mounting: randomRotation, rateHz: 50, offsetM: 0.2 },
];

/** Window of the swing: from release to 6 s after (where almost all motion is). */
function swingWindow(timeMs: Float64Array, releaseS: number): [number, number] {
  let from = 0;
  while (from < timeMs.length && (timeMs[from] - timeMs[0]) / 1000 < releaseS) from++;
  let to = from;
  while (to < timeMs.length && (timeMs[to] - timeMs[from]) / 1000 < 6) to++;
  return [from, to];
}

const SEEDS = [11, 12, 13, 14, 15, 16];
const measured = CASES.map((c) => {
  const errors: number[] = [];
  const gyroOnly: number[] = [];
  const r2: number[] = [];
  for (const seed of SEEDS) {
    const rng = mulberry32(seed * 1000 + c.rateHz);
    const stream = deviceMotionFromSwing(c.trace, { mounting: c.mounting(rng), offsetM: c.offsetM, heightM: 0.05, rateHz: c.rateHz, errors: typicalPhoneErrors(rng), seed });
    const r = reconstructKneeAngle(stream.recording);
    const [from, to] = swingWindow(stream.recording.timeMs, c.trace.truth.releaseTimeS);
    errors.push(rmsError(r.angleDeg, stream.trueAngleDeg, from, to));
    gyroOnly.push(rmsError(r.gyroAngleDeg, stream.trueAngleDeg, from, to));
    r2.push(analyseMotionRecording(stream.recording).analysis.indices.relaxationIndex);
  }
  return { ...c, worst: Math.max(...errors), mean: errors.reduce((a, b) => a + b, 0) / errors.length, gyroWorst: Math.max(...gyroOnly), r2 };
});

describe('knee angle from a simulated phone on the shank (6 seeds each; acceptance: RMS < 2° over the swing)', () => {
  for (const m of measured) {
    it(`${m.name}: RMS error mean ${m.mean.toFixed(2)}°, worst ${m.worst.toFixed(2)}° (gyro alone worst ${m.gyroWorst.toFixed(2)}°)`, () => {
      expect(m.worst).toBeLessThan(2);
    });
    it(`${m.name}: relaxation index within 0.05 of the simulation's own ${m.trace.truth.relaxationIndex.toFixed(3)} (got ${m.r2.map((x) => x.toFixed(3)).join(', ')})`, () => {
      for (const x of m.r2) expect(Math.abs(x - m.trace.truth.relaxationIndex)).toBeLessThan(0.05);
    });
  }

  it('the accelerometer does see the swing: up to several m/s² of tangential and centripetal acceleration at 0.25 m', () => {
    // Without this the gravity gating would be untested. Textbook rigid-body kinematics: at the
    // bottom of the swing the point reads g + ω²·r along the shank (centripetal), checked here.
    const s = deviceMotionFromSwing(healthy, { mounting: SHIN_SCREEN_OUT, offsetM: 0.25, heightM: 0, rateHz: 1000, errors: NO_ERRORS, seed: 1 });
    const rec = s.recording;
    let bottom = -1;
    for (let i = 1; i < rec.timeMs.length; i++) {
      if (s.trueAngleDeg[i - 1] < 90 && s.trueAngleDeg[i] >= 90 && bottom < 0) bottom = i;
    }
    expect(bottom).toBeGreaterThan(0);
    const omegaRad = Math.hypot(rec.rateAlphaDps[bottom], rec.rateBetaDps[bottom], rec.rateGammaDps[bottom]) * (Math.PI / 180);
    const magnitude = Math.hypot(rec.accXMs2[bottom], rec.accYMs2[bottom], rec.accZMs2[bottom]);
    // Hanging vertical: gravity's reaction and the centripetal term both point from the phone to the knee.
    // (Tangential α·r is zero there only when the stiffness torque vanishes: the simulator's neutral is 90°.)
    expect(Math.abs(magnitude - (GRAVITY_M_S2 + omegaRad * omegaRad * 0.25)) / magnitude).toBeLessThan(0.01);
    expect(magnitude - GRAVITY_M_S2).toBeGreaterThan(2);
  });

  it('a perfect sensor gives the simulated angle to within 0.1° RMS (no method error hiding behind noise)', () => {
    const s = deviceMotionFromSwing(healthy, { mounting: randomRotation(mulberry32(3)), offsetM: 0.2, heightM: 0.05, rateHz: 200, errors: NO_ERRORS, seed: 1 });
    const r = reconstructKneeAngle(s.recording);
    expect(rmsError(r.angleDeg, s.trueAngleDeg)).toBeLessThan(0.1);
    expect(r.axisShare).toBeGreaterThan(0.9999);
  });
});
