import type { Assessment, Observation, ObservationValue } from '../domain';
import { DAY_MS, type DemoContext } from './demo-context';
import type { DemoCourse } from './demo-course';
import { DEMO_NOTES } from './demo-people';
import type { DemoPatient } from './demo-patient';
import { observeMas, observePendulum, observeRom, observeSpasms, observeTardieu, type DemoVisit } from './demo-observations';

/**
 * The patient's assessments every 3–6 weeks from the start of care to the end date, each with the
 * profile's measures (demo-observations). The first patient's first MAS grade gets a duplicate that
 * is deleted a few minutes later: a tombstone in the bundle.
 */
export function demoAssessments(ctx: DemoContext, patient: DemoPatient, course: DemoCourse, clinicianIds: readonly string[]): void {
  const { rng, tables, idAt, stamps, iso, endMs } = ctx;
  const { profile, startMs, patientId, deviceId, clinicianId } = patient;
  let assessmentCount = 0;
  const tombstone = { done: patient.index !== 0 };
  for (let t = startMs; t <= endMs; t += rng.int(21, 42) * DAY_MS) {
    const performedMs = t - (t % DAY_MS) + rng.int(8, 15) * 3_600_000 + rng.int(0, 3) * 900_000;
    const assessorId = rng.chance(0.8) ? clinicianId : rng.pick(clinicianIds);
    const setting: Assessment['setting'] = assessmentCount > 0 && rng.chance(0.15) ? 'home' : 'clinic';
    const assessmentId = idAt(performedMs);
    tables.assessments.push({
      id: assessmentId, ...stamps(performedMs, deviceId, assessorId), patientId, assessorId, performedAt: iso(performedMs), setting,
      conditions: {
        position: profile.pendulum ? 'sitting' : 'supine',
        minutesSinceMedication: profile.spasms ? rng.int(60, 300) : null,
        painNrs: rng.int(0, 4),
      },
      notes: rng.chance(0.3) ? rng.pick(DEMO_NOTES) : null,
    });
    assessmentCount++;
    let minute = 1;
    const observe = (measureCode: string, siteCode: string, side: Observation['side'], value: ObservationValue, extra: Partial<Observation> = {}) => {
      const ms = performedMs + minute++ * 60_000;
      const obs: Observation = {
        id: idAt(ms), ...stamps(ms, deviceId, assessorId), patientId, assessmentId, takenAt: iso(performedMs), measureCode, siteCode, side,
        mode: null, instrument: null, value, traceId: null, ...extra,
      };
      tables.observations.push(obs);
      return obs;
    };
    const visit: DemoVisit = { performedMs, assessorId, assessmentId, observe };
    observeMas(ctx, patient, course, visit, tombstone);
    observeTardieu(ctx, patient, course, visit);
    observeRom(ctx, patient, course, visit);
    if (profile.pendulum) observePendulum(ctx, patient, course, visit, assessmentCount === 1 || t + 42 * DAY_MS > endMs);
    if (profile.spasms) observeSpasms(ctx, patient, course, visit);
  }
}
