// A version-6 database as the older app left it after phone pendulum recordings (issue 13), for the
// schema-7 migration test in Node and the notice's browser test. Raw device-motion channels are in the
// browsers' order (rate_alpha_dps = rate about the phone's x axis, as every browser delivers it);
// observations hold what the older analysis made of them (it read alpha as the z axis and assumed the
// leg started straight). The recordings come from the independent simulator.
import Dexie from 'dexie';
import type { ObservationValue } from '../../../src/lib/domain';
import { motionTraceChannels, type MotionRecording } from '../../../src/lib/sensors';
import { declareSchema } from '../../../src/lib/store/schema';
import { phonePendulumCases, simulatePhonePendulum } from '../../reference/sensors/phone-pendulum-simulator';

export const ids = (n: number) => `0190a0b0-0000-7000-8000-${String(n).padStart(12, '0')}`;
export const stamps = { createdAt: '2025-01-01T10:00:00.000Z', updatedAt: '2025-01-01T10:00:00.000Z', deviceId: ids(900), clinicianId: ids(901), deleted: false };
export const actor = { deviceId: ids(900), clinicianId: ids(901) };

/**
 * The values the older analysis saved for these simulated recordings: the phone pendulum page's
 * `pendulumObservations(analyseMotionRecording(recording).analysis.indices)` at commit b3deb96 (before
 * issue 13), run with `npx tsx` on `phonePendulumCases(14, 31)` of the simulator. Inputs of the test,
 * not expected results.
 */
export type Name = 'extension' | 'unaffected' | 'stuckAccelerometer';
export const OLD_VALUES: Record<Name, Array<[string, ObservationValue]>> = {
  // Case 10, moderate extension-type: every value saved, A1 silently wrong (16.6° for a true 85.5°).
  extension: [
    ['pendulum-ri', { kind: 'index', value: 1.1223303608895712 }],
    ['pendulum-ri-normalised', { kind: 'index', value: 0.7014564755559819 }],
    ['pendulum-first-swing', { kind: 'angle', angleDeg: 16.59805658161676 }],
    ['pendulum-resting-angle', { kind: 'angle', angleDeg: 86.28523813625348 }],
    ['pendulum-swing-count', { kind: 'count', value: 1 }],
  ],
  // Case 01, unaffected: R2 came out at 4.19 (out of range, not saved); resting angle 28° for a true 90°.
  unaffected: [
    ['pendulum-first-swing', { kind: 'angle', angleDeg: 135.27496405939237 }],
    ['pendulum-resting-angle', { kind: 'angle', angleDeg: 28.010140321115603 }],
    ['pendulum-swing-count', { kind: 'count', value: 10 }],
  ],
  // Case 12 with an accelerometer stuck at one reading: the older analysis (gyro only) saved values;
  // the corrected one sees gyro and gravity disagree and refuses.
  stuckAccelerometer: [
    ['pendulum-first-swing', { kind: 'angle', angleDeg: 137.36064411443112 }],
    ['pendulum-resting-angle', { kind: 'angle', angleDeg: 2.0467404598653425 }],
    ['pendulum-swing-count', { kind: 'count', value: 4 }],
  ],
};

export function recordings() {
  const cases = phonePendulumCases(14, 31);
  const extension = simulatePhonePendulum(cases[9]!);
  const unaffected = simulatePhonePendulum(cases[0]!);
  const stuckSource = simulatePhonePendulum(cases[11]!);
  const r = stuckSource.recording;
  const stuck: MotionRecording = { ...r, accXMs2: r.accXMs2.map(() => 0.1), accYMs2: r.accYMs2.map(() => 0.2), accZMs2: r.accZMs2.map(() => 9.8) };
  return {
    extension: { ...extension, case: cases[9]! },
    unaffected: { ...unaffected, case: cases[0]! },
    stuckAccelerometer: { recording: stuck, truth: stuckSource.truth, angleDeg: stuckSource.angleDeg, case: cases[11]! },
  };
}

/** A version-6 database with one patient, one visit per recording, its trace and the old observations. */
export async function buildV6(dexieOptions: { indexedDB?: IDBFactory; IDBKeyRange?: typeof IDBKeyRange } = {}) {
  const sims = recordings();
  const old = new Dexie('kinnote', dexieOptions);
  declareSchema(old, 6);
  await old.open();
  if (old.verno !== 6) throw new Error(`built version ${old.verno}, not 6`);
  await old.table('patients').add({ id: ids(1), ...stamps, code: 'K7QM-3XHD', birthYear: 1960, condition: 'stroke', affectedSides: ['left', 'right'], status: 'active' });
  const names = Object.keys(OLD_VALUES) as Name[];
  const observationIds: Record<Name, string[]> = { extension: [], unaffected: [], stuckAccelerometer: [] };
  for (const [k, name] of names.entries()) {
    const sim = sims[name];
    const performedAt = `2025-01-0${k + 2}T09:00:00.000Z`;
    const assessmentId = ids(10 + k);
    const traceId = ids(20 + k);
    await old.table('assessments').add({ id: assessmentId, ...stamps, patientId: ids(1), assessorId: ids(901), performedAt, setting: 'clinic', conditions: { position: 'sitting', minutesSinceMedication: null, painNrs: null }, notesSealed: null });
    // The older page saved its own reconstruction as knee_flexion_deg; zeros stand in for it (never read).
    const channels = motionTraceChannels(sim.recording, new Float64Array(sim.recording.timeMs.length));
    await old.table('traces').add({ id: traceId, ...stamps, patientId: ids(1), assessmentId, kind: 'pendulum-knee-angle', startedAt: performedAt, sampleRateHz: sim.case.rateHz, channels });
    for (const [j, [measureCode, value]] of OLD_VALUES[name]!.entries()) {
      const id = ids(100 + 10 * k + j);
      observationIds[name].push(id);
      await old.table('observations').add({ id, ...stamps, patientId: ids(1), assessmentId, takenAt: performedAt, measureCode, siteCode: 'knee', side: sim.case.leg, mode: null, instrument: null, value, traceId });
    }
  }
  // A pendulum trace imported from a file (an angle only) is no phone recording: left alone.
  await old.table('traces').add({ id: ids(30), ...stamps, patientId: ids(1), assessmentId: ids(10), kind: 'pendulum-knee-angle', startedAt: stamps.createdAt, sampleRateHz: 100, channels: [{ name: 'angle_deg', unit: 'deg', samples: new Float64Array([0, 1, 2]) }] });
  await old.table('devices').add({ id: actor.deviceId, ...stamps, name: 'Ward tablet', platform: null });
  await old.table('clinicians').add({ id: actor.clinicianId, ...stamps, displayName: 'Invented Clinician', profession: 'physiotherapist', registration: null });
  await old.table('meta').put({ key: 'actor', value: actor });
  old.close();
  return { sims, observationIds };
}
