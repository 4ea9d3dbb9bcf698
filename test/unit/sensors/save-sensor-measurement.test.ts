// Saving through the real store (Dexie on fake-indexeddb), so the records pass the domain's own
// validation and the measure catalogue.
import { describe, expect, it } from 'vitest';
import { analyseMotionRecording, motionTraceChannels, pendulumObservations, romObservation, saveSensorMeasurement, type SensorSaveStore } from '../../../src/lib/sensors';
import { phonePendulumCases, simulatePhonePendulum } from '../../reference/sensors/phone-pendulum-simulator';
import { saveAssessment, type KinnoteStore } from '../../../src/lib/store';
import { freshStore } from '../store/store-helpers';

const atomic = (store: KinnoteStore): SensorSaveStore => ({ actor: store.actor, saveAll: (a, o, t) => saveAssessment(store, a, o, t) });

async function storeWithPatient() {
  const store = await freshStore({ passphrase: null });
  const patient = await store.patients.create({ code: 'K7QM-3XHD', birthYear: 1970, condition: 'stroke', affectedSides: ['right'], status: 'active' });
  return { store, patient };
}

describe('saveSensorMeasurement', () => {
  it('saves a phone pendulum test: assessment, raw trace with the angle, five pendulum observations linked to it', async () => {
    const { store, patient } = await storeWithPatient();
    const stream = simulatePhonePendulum({ ...phonePendulumCases(1, 4)[0], rateHz: 60 });
    const { reconstruction, analysis } = analyseMotionRecording(stream.recording);
    const performedAt = '2025-04-02T10:00:00.000Z';
    let skipped: string[] = [];
    const saved = await saveSensorMeasurement(atomic(store), {
      patientId: patient.id,
      performedAt,
      setting: 'home',
      position: 'sitting',
      trace: { kind: 'pendulum-knee-angle', startedAt: performedAt, sampleRateHz: reconstruction.timing.rateHz, channels: motionTraceChannels(stream.recording, reconstruction.angleDeg) },
      observations: ({ assessmentId, traceId }) => {
        const built = pendulumObservations(analysis.indices, { patientId: patient.id, assessmentId, takenAt: performedAt, side: 'right', traceId });
        skipped = built.skipped;
        return built.observations;
      },
    });
    expect(skipped).toEqual([]);
    const observations = await store.observations.byPatient(patient.id);
    expect(observations.map((o) => o.measureCode).sort()).toEqual(['pendulum-first-swing', 'pendulum-resting-angle', 'pendulum-ri', 'pendulum-ri-normalised', 'pendulum-swing-count']);
    expect(new Set(observations.map((o) => o.traceId))).toEqual(new Set([saved.traceId]));
    const ri = observations.find((o) => o.measureCode === 'pendulum-ri');
    expect(ri?.value).toEqual({ kind: 'index', value: analysis.indices.relaxationIndex });
    const trace = await store.traces.get(saved.traceId);
    expect(trace?.channels.map((c) => c.name)).toEqual(['time_ms', 'rate_alpha_dps', 'rate_beta_dps', 'rate_gamma_dps', 'acc_x_ms2', 'acc_y_ms2', 'acc_z_ms2', 'knee_flexion_deg']);
    expect(Array.from(trace?.channels[4]?.samples ?? [])).toEqual(Array.from(stream.recording.accXMs2));
  });

  it('saves a phone range-of-motion reading as measure rom, instrument phone-sensor', async () => {
    const { store, patient } = await storeWithPatient();
    const at = '2025-04-02T11:00:00.000Z';
    await saveSensorMeasurement(atomic(store), {
      patientId: patient.id,
      performedAt: at,
      setting: 'clinic',
      position: null,
      trace: { kind: 'inclinometer-angle', startedAt: at, sampleRateHz: 60, channels: [{ name: 'angle_deg', unit: 'deg', samples: Float64Array.of(0, 112.4) }] },
      observations: (ids) => [romObservation({ ...ids, patientId: patient.id, takenAt: at, side: 'left', siteCode: 'knee-flexion', mode: 'passive', angleDeg: 112.4 })],
    });
    const [o] = await store.observations.byPatient(patient.id);
    expect(o).toMatchObject({ measureCode: 'rom', instrument: 'phone-sensor', siteCode: 'knee-flexion', value: { kind: 'angle', angleDeg: 112.4 } });
  });

  it('writes nothing at all (no assessment, no trace) when the observations are refused', async () => {
    const { store, patient } = await storeWithPatient();
    const at = '2025-04-02T11:00:00.000Z';
    await expect(
      saveSensorMeasurement(atomic(store), {
        patientId: patient.id,
        performedAt: at,
        setting: 'clinic',
        position: null,
        trace: { kind: 'inclinometer-angle', startedAt: at, sampleRateHz: 60, channels: [{ name: 'angle_deg', unit: 'deg', samples: Float64Array.of(1) }] },
        // 400° is beyond every ROM site's limit: the store refuses it.
        observations: (ids) => [romObservation({ ...ids, patientId: patient.id, takenAt: at, side: 'left', siteCode: 'knee-flexion', mode: 'passive', angleDeg: 400 })],
      }),
    ).rejects.toThrow();
    expect(await store.assessments.byPatient(patient.id, { includeDeleted: true })).toEqual([]);
    expect(await store.traces.byPatient(patient.id, { includeDeleted: true })).toEqual([]);
  });

  it('leaves out, and names, pendulum values outside the catalogue limits', () => {
    const indices = { relaxationIndex: Number.NaN, normalizedRelaxationIndex: Number.NaN, a1Deg: 150, restAngleDeg: 90, peakCount: 4 } as never;
    const { observations, skipped } = pendulumObservations(indices, { patientId: 'p', assessmentId: 'a', takenAt: 't', side: 'left', traceId: null });
    expect(observations.map((o) => o.measureCode)).toEqual(['pendulum-first-swing', 'pendulum-resting-angle', 'pendulum-swing-count']);
    expect(skipped).toHaveLength(2);
  });
});
