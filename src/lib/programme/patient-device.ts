import {
  BUNDLE_FORMAT,
  BUNDLE_FORMAT_VERSION,
  LATEST_SCHEMA_VERSION,
  StoreError,
  createBundle,
  importBackup,
  photosOfProgramme,
  type KinnoteStore,
  type MergeReport,
} from '../store';
import type { ExercisePhoto } from '../domain';
import type { Device } from '../domain';
import type { OpenedProgrammePackage } from './programme-package';
import { ProgrammeTransferError } from './programme-transfer-error';
import { readDeviceProfile, writeDeviceProfile, type DeviceProfile } from './device-profile';

/**
 * Saves an opened programme package on the patient's phone: the programme record (keeping its id,
 * so a re-sent or corrected programme merges by id) and, the first time, a Device record for the
 * phone. Writes go through the store's ordinary import (validated, merged, audited), photos in
 * the same transaction as the programme (all or nothing). The phone writes as itself under the
 * clinician who issued the programme. A package with photos replaces the programme's photos on the
 * phone; one without (sent as QR codes) keeps those whose exercise still has the same words at the
 * same place, so a photo never shows beside another exercise. Throws ProgrammeTransferError
 * ForeignPatient when the phone follows another patient, or holds any record of another patient.
 */
export async function acceptProgrammePackage(
  store: KinnoteStore,
  pkg: OpenedProgrammePackage,
  options: { now: () => number; platform: string | null; /** The phone's local calendar day now. */ today: string },
): Promise<{ merge: MergeReport; profile: DeviceProfile }> {
  const profile = await readDeviceProfile(store);
  if (profile?.mode !== 'patient') throw new StoreError('ValidationFailed', 'this device is not a patient\'s phone');
  if (profile.patientId !== null && profile.patientId !== pkg.patient.id) {
    throw new ProgrammeTransferError('ForeignPatient', `This programme is for ${pkg.patient.code}, and this phone follows another person's programme. It was refused; nothing was saved.`);
  }
  const others = [
    ...(await store.patients.list({ includeDeleted: true })).map((p) => p.id),
    ...(await store.homeProgrammes.list({ includeDeleted: true })).map((p) => p.patientId),
    ...(await store.adherenceEntries.list({ includeDeleted: true })).map((p) => p.patientId),
    ...(await store.selfReports.list({ includeDeleted: true })).map((p) => p.patientId),
  ].filter((id) => id !== pkg.patient.id);
  if (others.length > 0) {
    throw new ProgrammeTransferError('ForeignPatient', 'This phone holds records of another person, so it cannot take this programme. Nothing was saved.');
  }
  const before = await store.homeProgrammes.get(pkg.programme.id);
  const deviceId = profile.deviceId ?? store.context.newId();
  await store.setActor({ deviceId, clinicianId: pkg.programme.clinicianId });
  const at = new Date(options.now()).toISOString();
  const devices: Device[] = [];
  if (profile.deviceId === null) {
    devices.push({ id: deviceId, createdAt: at, updatedAt: at, deviceId, clinicianId: pkg.programme.clinicianId, deleted: false, name: `Home phone of ${pkg.patient.code}`, platform: options.platform });
  }
  const items = pkg.programme.items;
  let photos: readonly ExercisePhoto[] = pkg.photos;
  if (photos.length === 0) {
    photos = (await photosOfProgramme(store, pkg.programme.id))
      .filter((p) => before?.items[p.exercise]?.name === items[p.exercise]?.name)
      .map(({ id: _id, addedAtMs: _at, ...photo }) => photo);
  }
  const bundle = await createBundle(
    { devices, homeProgrammes: [pkg.programme] },
    {
      format: BUNDLE_FORMAT,
      formatVersion: BUNDLE_FORMAT_VERSION,
      schemaVersion: LATEST_SCHEMA_VERSION,
      exportedAt: pkg.issuedAt,
      exportedBy: { deviceId: pkg.programme.deviceId, clinicianId: pkg.programme.clinicianId },
      source: `home programme for ${pkg.patient.code}`,
      scope: { kind: 'patient', patientId: pkg.patient.id },
      protectedContent: 'omitted',
    },
    photos,
  );
  // The phone never holds the patient's record: the package vouches for the patient it names.
  const merge = await importBackup(store, bundle, { knownPatientIds: [pkg.patient.id], photos: 'replace' });
  const next: DeviceProfile = {
    mode: 'patient',
    patientId: pkg.patient.id,
    patientCode: pkg.patient.code,
    deviceId,
    currentProgrammeId: pkg.programme.id,
    receivedOn: profile.receivedOn ?? options.today,
  };
  await writeDeviceProfile(store, next);
  return { merge, profile: next };
}
