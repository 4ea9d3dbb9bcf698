import { readDeviceProfile, loadFollowedPlans, loadHomeLog, localDayOf, planRunsOn, type FollowedPlan, type HomeLog } from '$lib/programme';
import { photosOfProgramme, type ExercisePhotoRow, type KinnoteStore } from '$lib/store';

/** What every patient-mode screen reads: the binding, the plans followed and the tick log. */
export interface PatientHome {
  readonly store: KinnoteStore;
  readonly patientId: string | null;
  readonly patientCode: string | null;
  readonly deviceId: string | null;
  readonly isPatientDevice: boolean;
  readonly plans: FollowedPlan[];
  readonly log: HomeLog;
  readonly logDamaged: boolean;
  readonly today: string;
  /** The day this phone received its first programme (null: none yet, or received before this was kept). */
  readonly receivedOn: string | null;
  /** The exercises' photos, by programme id. */
  readonly photos: ReadonlyMap<string, readonly ExercisePhotoRow[]>;
}

/** Today on this phone, as a calendar date in its own time zone. */
export function localToday(): string {
  const now = Date.now();
  return localDayOf(now, new Date(now).getTimezoneOffset());
}

export async function loadPatientHome(store: KinnoteStore): Promise<PatientHome> {
  const profile = await readDeviceProfile(store);
  const patient = profile?.mode === 'patient' ? profile : null;
  const plans = patient?.patientId ? await loadFollowedPlans(store, patient.patientId) : [];
  const { log, damaged } = await loadHomeLog(store);
  const photos = new Map<string, ExercisePhotoRow[]>();
  for (const p of plans) photos.set(p.programmeId, await photosOfProgramme(store, p.programmeId));
  return {
    store,
    patientId: patient?.patientId ?? null,
    patientCode: patient?.patientCode ?? null,
    deviceId: patient?.deviceId ?? null,
    isPatientDevice: patient !== null,
    plans,
    log,
    logDamaged: damaged,
    today: localToday(),
    receivedOn: patient?.receivedOn ?? null,
    photos,
  };
}

/** The plans that run on `day` (normally one). */
export function plansOn(plans: readonly FollowedPlan[], day: string): FollowedPlan[] {
  return plans.filter((p) => planRunsOn(p.plan, day));
}

/**
 * Leaves patient mode: deletes this device's whole database (programme, ticks, ratings, reminder
 * times, device profile) and reloads on the first screen. A patient's phone holds nothing else.
 */
export async function removeEverythingFromThisPhone(store: KinnoteStore): Promise<void> {
  await store.db.delete();
  location.replace('/');
}
