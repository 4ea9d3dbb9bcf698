import { demoAssessments } from './demo-assessments';
import { demoContext, demoTeam, type DemoTables } from './demo-context';
import { demoCourse } from './demo-course';
import { demoHomeProgramme } from './demo-home-programme';
import { enrolDemoPatient } from './demo-patient';
import { demoReliabilityStudy } from './demo-reliability-study';

export type { DemoTables } from './demo-context';

export interface DemoOptions {
  readonly seed: number;
  /** Last day of the scenario, `YYYY-MM-DD`; the app passes today, the CLI a fixed default. */
  readonly endDate?: string;
  readonly patientCount?: number;
}

export interface DemoScenario {
  readonly seed: number;
  readonly endAt: string;
  readonly tables: DemoTables;
}

/** Fixed default end date, so `kinnote demo --seed N` gives the same file on every run. */
export const DEMO_DEFAULT_END_DATE = '2025-06-30';

/**
 * Generates the invented demo caseload: an invented three-clinician community team with two
 * tablets, about 12 invented patients (pseudonymous codes, invented identities), 6–12 months of
 * assessments every 3–6 weeks with MAS, Modified Tardieu, ROM, pendulum indices (with a few raw
 * traces) and spasm scales, interventions with plausible responses (toxin: tone falls over ~2
 * weeks, holds 6–12 weeks, drifts back; serial casting gains ankle dorsiflexion; medication
 * changes lower tone and spasms), home programmes with adherence and self-reports for some, one
 * tombstoned duplicate and a small reliability study. Values come from a simple invented model
 * with noise, not from any publication. Pure and deterministic: same options → identical records.
 * Throws RangeError for a bad end date or patient count.
 *
 * Steps, one file each, in the order of the seeded draws: the team (demo-context), then per patient
 * the enrolment (demo-patient), the latent course and interventions (demo-course, demo-interventions),
 * the assessments (demo-assessments, demo-observations) and the home programme (demo-home-programme);
 * last the reliability study (demo-reliability-study).
 *
 * @example
 * const { tables } = generateDemoScenario({ seed: 7, endDate: '2025-06-30' });
 * tables.patients.length; // 12; the same seed and end date always give the same records
 */
export function generateDemoScenario(options: DemoOptions): DemoScenario {
  const endDate = options.endDate ?? DEMO_DEFAULT_END_DATE;
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(endDate);
  if (!m) throw new RangeError(`endDate must be YYYY-MM-DD, not ${endDate}`);
  const patientCount = options.patientCount ?? 12;
  if (!Number.isInteger(patientCount) || patientCount < 1 || patientCount > 500) throw new RangeError('patientCount must be 1..500');
  const endMs = Date.UTC(+m[1]!, +m[2]! - 1, +m[3]!, 17, 0, 0);
  const ctx = demoContext(options.seed, endMs);
  const team = demoTeam(ctx);
  for (let p = 0; p < patientCount; p++) {
    const patient = enrolDemoPatient(ctx, p, patientCount, team);
    const course = demoCourse(ctx, patient);
    demoAssessments(ctx, patient, course, team.clinicianIds);
    demoHomeProgramme(ctx, patient, course);
  }
  demoReliabilityStudy(ctx, team);
  return { seed: options.seed, endAt: ctx.iso(endMs), tables: ctx.tables };
}
