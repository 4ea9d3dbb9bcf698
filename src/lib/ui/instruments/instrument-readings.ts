import { formatFixed, type Side } from '$lib/domain';
import { PENDULUM_FILE_CHANNEL_NAMES as CHANNEL, pendulumObservations, type PendulumIndices } from '$lib/pendulum';
import { motionTraceChannels, romObservation, type KneeAngleReconstruction, type MotionRecording, type SteadyReading } from '$lib/sensors';
import type { PendulumResult } from '$lib/workers';
import { INSTRUMENT_MESSAGES as m } from '../messages/instrument-messages';
import { plainChannels, type VisitReading } from '../visit-readings';

/** One line naming a pendulum result: side and the relaxation index. */
function pendulumTitle(label: string, side: Side, indices: PendulumIndices): string {
  return m.pendulumTitle(label, side, formatFixed(indices.relaxationIndex, 2), formatFixed(indices.restAngleDeg, 1));
}

function pendulumParts(indices: PendulumIndices, side: Side) {
  const built = pendulumObservations(indices, { side });
  return { observations: built.observations, skipped: built.skipped };
}

/** A pendulum test analysed from a file: the five catalogue measures and the file's own columns as the trace. */
export function pendulumFileReading(result: PendulumResult, side: Side, key: string, startedAt: string): VisitReading {
  const raw = result.raw;
  const channels = [{ name: 'time', unit: 's', samples: raw.timeS }];
  if (raw.angleDeg) channels.push({ name: CHANNEL.angleDeg, unit: 'deg', samples: raw.angleDeg });
  if (raw.gyroDps) channels.push({ name: CHANNEL.gyroDps, unit: 'deg/s', samples: raw.gyroDps });
  if (raw.emgUv) channels.push({ name: CHANNEL.emgUv, unit: 'uV', samples: raw.emgUv });
  const indices = result.analysis.indices;
  return {
    key,
    instrument: 'pendulum-file',
    title: pendulumTitle(m.pendulumFromFile, side, indices),
    ...pendulumParts(indices, side),
    trace: { kind: 'pendulum-knee-angle', startedAt, sampleRateHz: indices.sampleRateHz, channels: plainChannels(channels) },
  };
}

/** A pendulum test recorded with the phone: the raw motion channels and the reconstructed knee angle as the trace. */
export function pendulumPhoneReading(indices: PendulumIndices, recording: MotionRecording, reconstruction: KneeAngleReconstruction, side: Side, key: string, startedAt: string): VisitReading {
  return {
    key,
    instrument: 'pendulum-phone',
    title: pendulumTitle(m.pendulumWithPhone, side, indices),
    ...pendulumParts(indices, side),
    trace: { kind: 'pendulum-knee-angle', startedAt, sampleRateHz: reconstruction.timing.rateHz, channels: plainChannels(motionTraceChannels(recording, reconstruction.angleDeg)) },
  };
}

/**
 * A phone inclinometer reading as range of motion (instrument "phone sensor"), angle to 0.1°; the trace
 * holds the two averaged gravity readings (zero, end) and the angle between them.
 */
export function inclinometerReading(
  zero: SteadyReading,
  end: SteadyReading,
  jointDeg: number,
  choice: { siteCode: string; siteLabel: string; side: Side; mode: 'active' | 'passive' },
  key: string,
  startedAt: string,
): VisitReading {
  const angle = Math.round(jointDeg * 10) / 10;
  const { patientId: _p, assessmentId: _a, takenAt: _t, traceId: _r, ...observation } = romObservation({ patientId: '', assessmentId: '', takenAt: startedAt, traceId: null, side: choice.side, siteCode: choice.siteCode, mode: choice.mode, angleDeg: angle });
  return {
    key,
    instrument: 'inclinometer',
    title: m.inclinometerTitle(choice.side, choice.siteLabel, choice.mode, formatFixed(angle, 1)),
    skipped: [],
    observations: [observation],
    trace: {
      kind: 'inclinometer-angle',
      startedAt,
      sampleRateHz: 1,
      channels: plainChannels([
        { name: 'acc_x_ms2', unit: 'm/s2', samples: Float64Array.of(zero.meanX, end.meanX) },
        { name: 'acc_y_ms2', unit: 'm/s2', samples: Float64Array.of(zero.meanY, end.meanY) },
        { name: 'acc_z_ms2', unit: 'm/s2', samples: Float64Array.of(zero.meanZ, end.meanZ) },
        { name: 'joint_angle_deg', unit: 'deg', samples: Float64Array.of(0, angle) },
      ]),
    },
  };
}
