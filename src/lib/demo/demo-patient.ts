import { patientCode, type Side } from '../domain';
import { DAY_MS, type DemoContext } from './demo-context';
import { DEMO_FAMILY_NAMES, DEMO_FICTION_NOTICE, DEMO_GIVEN_NAMES } from './demo-people';
import { PROFILES, type Profile } from './demo-profiles';

/** One invented patient as the later steps need it. */
export interface DemoPatient {
  /** Place in the caseload (0-based). */
  readonly index: number;
  readonly patientId: string;
  readonly profile: Profile;
  readonly sides: readonly Side[];
  readonly clinicianId: string;
  readonly deviceId: string;
  /** First day of care (ms). */
  readonly startMs: number;
}

/** Enrols patient `p`: the patient record (pseudonymous code, birth year, condition) and its invented identity. */
export function enrolDemoPatient(ctx: DemoContext, p: number, patientCount: number, team: { deviceIds: string[]; clinicianIds: string[] }): DemoPatient {
  const { rng, tables, idAt, stamps } = ctx;
  const profile = PROFILES[p % PROFILES.length]!;
  const clinicianId = team.clinicianIds[p % team.clinicianIds.length]!;
  const deviceId = team.deviceIds[p % team.deviceIds.length]!;
  const months = rng.int(6, 12);
  const startMs = ctx.endMs - months * 30 * DAY_MS + rng.int(0, 10) * DAY_MS;
  const sides: Side[] = profile.bilateral ? ['left', 'right'] : [rng.pick(['left', 'right'] as const)];
  const birthYear = profile.condition === 'cerebral-palsy' ? rng.int(1995, 2007) : rng.int(1942, 1990);
  const patientId = idAt(startMs - 7 * DAY_MS);
  const enrolled = stamps(startMs - 7 * DAY_MS, deviceId, clinicianId);
  tables.patients.push({
    id: patientId, ...enrolled, code: patientCode((n) => rng.bytes(n)), birthYear, condition: profile.condition, affectedSides: sides,
    status: p === patientCount - 1 && patientCount > 3 ? 'discharged' : 'active',
  });
  tables.identities.push({
    id: idAt(startMs - 7 * DAY_MS + 1000), ...enrolled, patientId,
    givenName: DEMO_GIVEN_NAMES[(p * 7 + rng.int(0, 3)) % DEMO_GIVEN_NAMES.length]!,
    familyName: DEMO_FAMILY_NAMES[(p * 5 + rng.int(0, 2)) % DEMO_FAMILY_NAMES.length]!,
    dateOfBirth: `${birthYear}-${String(rng.int(1, 12)).padStart(2, '0')}-${String(rng.int(1, 28)).padStart(2, '0')}`,
    contact: DEMO_FICTION_NOTICE,
  });
  return { index: p, patientId, profile, sides, clinicianId, deviceId, startMs };
}
