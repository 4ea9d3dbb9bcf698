// The record pieces built from phone readings. Saving them (atomic, audited, all or nothing) is
// tested on the one path that saves readings: test/unit/ui/visit-readings.test.ts.
import { describe, expect, it } from 'vitest';
import { ObservationSchema } from '../../../src/lib/domain/observation';
import { analyseMotionRecording, motionTraceChannels, romObservation } from '../../../src/lib/sensors';
import { pendulumObservations } from '../../../src/lib/sensors/../pendulum';
import { phonePendulumCases, simulatePhonePendulum } from '../../reference/sensors/phone-pendulum-simulator';
import * as v from 'valibot';

describe('sensor records', () => {
  it('keeps the raw motion channels (copies, in the browser names) and the reconstructed angle last', () => {
    const stream = simulatePhonePendulum({ ...phonePendulumCases(1, 4)[0], rateHz: 60 });
    const { reconstruction } = analyseMotionRecording(stream.recording);
    const channels = motionTraceChannels(stream.recording, reconstruction.angleDeg);
    expect(channels.map((c) => c.name)).toEqual(['time_ms', 'rate_alpha_dps', 'rate_beta_dps', 'rate_gamma_dps', 'acc_x_ms2', 'acc_y_ms2', 'acc_z_ms2', 'knee_flexion_deg']);
    expect(Array.from(channels[4]?.samples ?? [])).toEqual(Array.from(stream.recording.accXMs2));
    expect(channels[4]?.samples).not.toBe(stream.recording.accXMs2);
  });

  it('builds a phone range-of-motion reading as measure rom, instrument phone-sensor, valid as a record', () => {
    const o = romObservation({ patientId: '0190a000-0000-7000-8000-000000000001', assessmentId: '0190a000-0000-7000-8000-000000000002', takenAt: '2025-04-02T11:00:00.000Z', traceId: null, side: 'left', siteCode: 'knee-flexion', mode: 'passive', angleDeg: 112.4 });
    expect(o).toMatchObject({ measureCode: 'rom', instrument: 'phone-sensor', siteCode: 'knee-flexion', mode: 'passive', value: { kind: 'angle', angleDeg: 112.4 } });
    const record = { ...o, id: '0190a000-0000-7000-8000-000000000003', createdAt: o.takenAt, updatedAt: o.takenAt, deviceId: '0190a000-0000-7000-8000-000000000004', clinicianId: '0190a000-0000-7000-8000-000000000005', deleted: false };
    const parsed = v.safeParse(ObservationSchema, record);
    expect(parsed.issues?.map((i) => i.message) ?? []).toEqual([]);
  });

  it('leaves out, and names, pendulum values outside the catalogue limits', () => {
    const indices = { relaxationIndex: Number.NaN, normalizedRelaxationIndex: Number.NaN, a1Deg: 150, restAngleDeg: 90, peakCount: 4 } as never;
    const { observations, skipped } = pendulumObservations(indices, { patientId: 'p', assessmentId: 'a', takenAt: 't', side: 'left', traceId: null });
    expect(observations.map((o) => o.measureCode)).toEqual(['pendulum-first-swing', 'pendulum-resting-angle', 'pendulum-swing-count']);
    expect(skipped).toHaveLength(2);
  });
});
