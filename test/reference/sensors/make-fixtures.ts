// Writes the small device-motion fixtures under test/fixtures/sensors (run: npx tsx test/reference/sensors/make-fixtures.ts).
// Every file is invented: a simulated leg (test/reference/pendulum/simulator.ts) seen by a simulated phone.
import { writeFileSync } from 'node:fs';
import { formatMotionCsv, type MotionRecording } from '../../../src/lib/sensors';
import { mulberry32, simulatePendulum } from '../pendulum/simulator';
import { deviceMotionFromSwing, randomRotation, staticDeviceMotion, typicalPhoneErrors, axisAngle } from './device-motion-simulator';
import { phonePendulumCases, simulatePhonePendulum } from './phone-pendulum-simulator';

const dir = new URL('../../fixtures/sensors/', import.meta.url).pathname;
const write = (name: string, text: string) => writeFileSync(`${dir}${name}`, text);

// Swinging legs from the independent phone simulator (hand-held start, browsers' axis order).
const cases = phonePendulumCases(14, 901);
const phoneA = simulatePhonePendulum({ ...cases[7], rateHz: 60 });
write('healthy-phone-60hz.csv', formatMotionCsv(phoneA.recording));
const phoneB = simulatePhonePendulum({ ...cases[3], rateHz: 30, drops: [] });
write('extensor-severe-phone-30hz.csv', formatMotionCsv(phoneB.recording));

// Still throughout: no swing.
write('bad-no-swing.csv', formatMotionCsv(staticDeviceMotion(axisAngle(1, 0, 0, 30), 3, { rateHz: 50, errors: typicalPhoneErrors(mulberry32(5)), seed: 6 })));
// Swinging from the first sample: no held start.
const noHold = simulatePendulum({ holdS: 0, startAngleDeg: 40, durationS: 6 });
const swinging = deviceMotionFromSwing(noHold, { mounting: randomRotation(mulberry32(7)), offsetM: 0.2, heightM: 0.05, rateHz: 60, errors: typicalPhoneErrors(mulberry32(8)), seed: 9 });
write('bad-no-hold.csv', formatMotionCsv(swinging.recording));

const head = (r: MotionRecording, rows: number) => formatMotionCsv(r).split('\r\n').slice(0, rows + 1).join('\r\n') + '\r\n';
const small = head(phoneA.recording, 4);
write('bad-unknown-column.csv', small.replace('acc_z_ms2', 'acc_w_ms2'));
write('bad-non-numeric.csv', small.split('\r\n').map((line, i) => (i === 3 ? line.replace(/,[^,]*$/, ',abc') : line)).join('\r\n'));
write('bad-time-not-increasing.csv', small.split('\r\n').map((line, i) => (i === 4 ? line.replace(/^[^,]*/, '1000') : line)).join('\r\n'));
write('bad-missing-field.csv', small.split('\r\n').map((line, i) => (i === 2 ? line.replace(/,[^,]*$/, '') : line)).join('\r\n'));
console.log('fixtures written to', dir);
