// Static inclinometer readings from a simulated phone held still in random orientations, with the
// same sensor errors as the swing tests (accelerometer noise 0.05 m/s², bias up to ±0.05 m/s² per
// axis, 0.1 m/s² rounding) and hand tremor. Acceptance (issue 9): RMS error < 1° for static readings.
// Truth comes from the rotation matrices, not from the code under test.
import { describe, expect, it } from 'vitest';
import { angleBetweenDeg, axisAngleToVerticalDeg, steadyReading } from '../../../src/lib/sensors';
import { mulberry32 } from '../pendulum/simulator';
import { axisAngle, multiply, randomRotation, staticDeviceMotion, typicalPhoneErrors } from './device-motion-simulator';

const TRIALS = 200;
const DEG = 180 / Math.PI;

function segmentAngleTrials(): { rms: number; worst: number; steady: number } {
  const rng = mulberry32(2024);
  let sum = 0;
  let worst = 0;
  let steady = 0;
  for (let t = 0; t < TRIALS; t++) {
    const orientation = randomRotation(rng);
    // Truth: the device y axis in world coordinates is column 1; its angle to up (0, 0, 1).
    const truth = Math.acos(Math.max(-1, Math.min(1, orientation[7]))) * DEG;
    const rec = staticDeviceMotion(orientation, 1.5, { rateHz: 60, errors: typicalPhoneErrors(rng), seed: t + 1, tremorDps: 0.5 });
    const reading = steadyReading(rec, rec.timeMs.length);
    if (reading.steady) steady++;
    const err = axisAngleToVerticalDeg(reading.meanX, reading.meanY, reading.meanZ, 'y') - truth;
    sum += err * err;
    worst = Math.max(worst, Math.abs(err));
  }
  return { rms: Math.sqrt(sum / TRIALS), worst, steady };
}

function twoPositionTrials(): { rms: number; worst: number } {
  const rng = mulberry32(77);
  let sum = 0;
  let worst = 0;
  for (let t = 0; t < TRIALS; t++) {
    // A segment rotating about a horizontal axis by a true joint angle; the phone anywhere on it.
    const mountingOnSegment = randomRotation(rng);
    const heading = 360 * rng();
    const horizontalAxis = [Math.cos(heading / DEG), Math.sin(heading / DEG), 0] as const;
    const startTilt = -60 + 120 * rng();
    const jointDeg = 150 * rng();
    const errors = typicalPhoneErrors(rng);
    const first = multiply(axisAngle(...horizontalAxis, startTilt), mountingOnSegment);
    const second = multiply(axisAngle(...horizontalAxis, startTilt + jointDeg), mountingOnSegment);
    const a = steadyReading(staticDeviceMotion(first, 1.2, { rateHz: 60, errors, seed: 2 * t + 1 }), 72);
    const b = steadyReading(staticDeviceMotion(second, 1.2, { rateHz: 60, errors, seed: 2 * t + 2 }), 72);
    const err = angleBetweenDeg(a.meanX, a.meanY, a.meanZ, b.meanX, b.meanY, b.meanZ) - jointDeg;
    sum += err * err;
    worst = Math.max(worst, Math.abs(err));
  }
  return { rms: Math.sqrt(sum / TRIALS), worst };
}

const segment = segmentAngleTrials();
const twoPosition = twoPositionTrials();

describe(`static inclinometer readings (${TRIALS} random orientations each; acceptance: RMS < 1°)`, () => {
  it(`segment angle to the vertical, 1 s average: RMS error ${segment.rms.toFixed(2)}°, worst ${segment.worst.toFixed(2)}°`, () => {
    expect(segment.rms).toBeLessThan(1);
    expect(segment.steady).toBe(TRIALS);
  });
  it(`joint angle by the two-position method: RMS error ${twoPosition.rms.toFixed(2)}°, worst ${twoPosition.worst.toFixed(2)}°`, () => {
    expect(twoPosition.rms).toBeLessThan(1);
  });
  it('a single unaveraged sample is worse than the 1 s average (the averaging does work)', () => {
    const rng = mulberry32(5);
    let single = 0;
    let averaged = 0;
    for (let t = 0; t < 50; t++) {
      const o = randomRotation(rng);
      const truth = Math.acos(o[7]) * DEG;
      const errors = { ...typicalPhoneErrors(rng), accBiasMs2: [0, 0, 0] as const, accNoiseMs2: 0.2 };
      const rec = staticDeviceMotion(o, 1.5, { rateHz: 60, errors, seed: t + 100 });
      single += (axisAngleToVerticalDeg(rec.accXMs2[0], rec.accYMs2[0], rec.accZMs2[0]) - truth) ** 2;
      const r = steadyReading(rec, rec.timeMs.length, { maxSpreadDeg: 10 });
      averaged += (axisAngleToVerticalDeg(r.meanX, r.meanY, r.meanZ) - truth) ** 2;
    }
    expect(Math.sqrt(averaged / 50)).toBeLessThan(0.5 * Math.sqrt(single / 50));
  });
});
