import { EMPTY_DOSE, type ExerciseDose } from '../domain';
import { clamp, DAY_MS, type DemoContext } from './demo-context';
import type { DemoCourse } from './demo-course';
import type { DemoPatient } from './demo-patient';

/** The demo home programme: calf stretch and sit-to-stand on 5 days a week, a resting splint each night (5 + 5 + 7). */
const DEMO_DOSE: ExerciseDose = EMPTY_DOSE;
const DEMO_SESSIONS_PER_WEEK = 17;

/** A home programme from two weeks into care, weekly adherence entries and, most weeks, a self-report. */
export function demoHomeProgramme(ctx: DemoContext, patient: DemoPatient, course: DemoCourse): void {
  const { rng, tables, idAt, stamps, day, endMs } = ctx;
  const { profile, sides, startMs, patientId, deviceId, clinicianId } = patient;
  const { toneAt } = course;
  // A few patients only (every other one).
  if (patient.index % 4 !== 2 && patient.index % 4 !== 0) return;
  const programmeMs = startMs + 14 * DAY_MS;
  const programmeId = idAt(programmeMs);
  tables.homeProgrammes.push({
    id: programmeId, ...stamps(programmeMs, deviceId, clinicianId), patientId, title: 'Daily stretching and positioning (demo)',
    items: [
      { name: 'Calf stretch against a wall', dosage: '', dose: { ...DEMO_DOSE, holdSeconds: 30, repetitions: 3, daysPerWeek: 5, note: 'each side' } },
      { name: 'Sit-to-stand practice', dosage: '', dose: { ...DEMO_DOSE, repetitions: 8, sets: 2, daysPerWeek: 5 } },
      { name: 'Resting splint', dosage: '', dose: { ...DEMO_DOSE, overnight: true, note: 'as tolerated' } },
    ],
    sessionsPerWeek: DEMO_SESSIONS_PER_WEEK, startsOn: day(programmeMs), endsOn: null,
  });
  const keenness = rng.uniform(0.5, 0.95);
  for (let w = programmeMs; w + 7 * DAY_MS <= endMs; w += 7 * DAY_MS) {
    const reportMs = w + 7 * DAY_MS - 3_600_000;
    let done = 0;
    for (let s = 0; s < 5; s++) if (rng.chance(keenness)) done++;
    // Five draws as before (the seeded scenario stays the same), scaled to the week's planned sessions.
    tables.adherenceEntries.push({
      id: idAt(reportMs), ...stamps(reportMs, deviceId, clinicianId), patientId, programmeId, periodStart: day(w), sessionsPlanned: DEMO_SESSIONS_PER_WEEK,
      sessionsDone: Math.round((done * DEMO_SESSIONS_PER_WEEK) / 5),
      reportedBy: rng.chance(0.7) ? 'patient' : 'carer',
    });
    if (rng.chance(0.6)) {
      const tone = toneAt(profile.mas[0]!, sides[0]!, reportMs);
      tables.selfReports.push({
        id: idAt(reportMs + 60_000), ...stamps(reportMs + 60_000, deviceId, clinicianId), patientId, reportedOn: day(reportMs),
        spasmFrequencyPenn: profile.spasms ? clamp(Math.round(0.3 + 0.9 * tone + rng.normal(0, 0.6)), 0, 4) : null,
        spasmSeverityNrs: profile.spasms ? clamp(Math.round(1 + 1.4 * tone + rng.normal(0, 1.2)), 0, 10) : null,
        stiffnessNrs: clamp(Math.round(1.5 * tone + rng.normal(0, 1.2)), 0, 10),
        painNrs: clamp(Math.round(rng.normal(2, 1.3)), 0, 10),
      });
    }
  }
}
