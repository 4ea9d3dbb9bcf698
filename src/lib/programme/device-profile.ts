import * as v from 'valibot';
import { readLocalState, writeLocalState, type KinnoteStore, StoreError } from '../store';

// What this device is for, read by the first screen: kept apart from receiving programmes
// (patient-device.ts), which pulls in the store's import, so the first load stays small.

const PROFILE_KEY = 'local:device-profile';

/**
 * What this device is for. 'therapist': the ordinary app. 'patient': the patient's own phone,
 * bound to one patient by the first programme it accepts (until then patientId is null).
 */
export type DeviceProfile =
  | { readonly mode: 'therapist' }
  | {
      readonly mode: 'patient';
      readonly patientId: string | null;
      readonly patientCode: string | null;
      readonly deviceId: string | null;
      readonly currentProgrammeId: string | null;
      /** The phone's own calendar day when it accepted its first programme; weeks before it are not counted. */
      readonly receivedOn: string | null;
    };

const ProfileSchema = v.variant('mode', [
  v.strictObject({ mode: v.literal('therapist') }),
  v.strictObject({
    mode: v.literal('patient'),
    patientId: v.nullable(v.string()),
    patientCode: v.nullable(v.string()),
    deviceId: v.nullable(v.string()),
    currentProgrammeId: v.nullable(v.string()),
    // Absent in profiles saved before it existed.
    receivedOn: v.optional(v.nullable(v.string()), null),
  }),
]);

/** The saved profile, or null on a device never set up (or with a damaged profile). */
export async function readDeviceProfile(store: KinnoteStore): Promise<DeviceProfile | null> {
  const result = v.safeParse(ProfileSchema, await readLocalState(store, PROFILE_KEY));
  return result.success ? result.output : null;
}

export async function writeDeviceProfile(store: KinnoteStore, profile: DeviceProfile): Promise<void> {
  await writeLocalState(store, PROFILE_KEY, profile);
}

/**
 * Turns a device into a patient's own phone (first run). Refused (StoreError ValidationFailed)
 * when the device already has a user or any patient record: a therapist's caseload and a
 * patient's phone never share a database.
 */
export async function choosePatientMode(store: KinnoteStore): Promise<DeviceProfile> {
  if (store.actor !== null || (await store.patients.list({ includeDeleted: true })).length > 0) {
    throw new StoreError('ValidationFailed', 'this device is already set up for a therapist; a patient\'s phone needs a device of its own');
  }
  const profile: DeviceProfile = { mode: 'patient', patientId: null, patientCode: null, deviceId: null, currentProgrammeId: null, receivedOn: null };
  await writeDeviceProfile(store, profile);
  return profile;
}

