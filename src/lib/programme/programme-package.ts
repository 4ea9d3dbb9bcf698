import * as v from 'valibot';
import { HomeProgrammeSchema, IdSchema, IsoDateTimeSchema, MAX_PHOTO_BYTES, PHOTO_TYPES, exercisePhotoProblem, type ExercisePhoto, type HomeProgramme } from '../domain';
import { base64ToBytes, bytesToBase64, canonicalJson } from '../store';
import type { ExercisePlan } from './exercise-plan';
import { checkExercisePlan, exerciseDoseIssue } from './exercise-plan';
import { programmeToPlan } from './programme-record';
import { ProgrammeTransferError } from './programme-transfer-error';
import { PATIENT_LANGUAGES, type PatientLanguage } from './patient-language';
import { openTransfer, sealTransfer, type SealOptions } from './sealed-transfer';

export const PROGRAMME_PACKAGE_FORMAT = 'kinnote-home-programme' as const;
export const PROGRAMME_PACKAGE_VERSION = 4;
/**
 * Version 1 (before structured doses) is still read: its items have no dose and keep their text.
 * Version 2 had no photos; version 3 may carry photos (none when sent as QR codes); version 4 may
 * name the language the patient's screens open in (an app that reads only 3 says "update the app"
 * rather than refusing an unknown field).
 */
const READABLE_VERSIONS: readonly number[] = [1, 2, 3, 4];
const VersionSchema = v.union([v.literal(1), v.literal(2), v.literal(3), v.literal(4)]);

/** A photo as it travels: its bytes in base64 (RFC 4648). Limits are checked again after decoding. */
const PackagePhotoSchema = v.strictObject({
  exercise: v.pipe(v.number(), v.integer()),
  position: v.pipe(v.number(), v.integer()),
  type: v.picklist(PHOTO_TYPES),
  widthPx: v.pipe(v.number(), v.integer()),
  heightPx: v.pipe(v.number(), v.integer()),
  data: v.pipe(v.string(), v.maxLength(Math.ceil(MAX_PHOTO_BYTES / 3) * 4, 'is larger than a photo may be')),
});

const PatientCodeSchema = v.pipe(v.string(), v.regex(/^[2-9A-HJKMNP-TV-Z]{4}-[2-9A-HJKMNP-TV-Z]{4}$/, 'must be a pseudonymous code like K7QM-3XHD'));

/**
 * What the therapist hands to the patient's phone: one programme of one patient, under the
 * pseudonymous code. No name, birth year, condition or note of anyone: the patient knows who they
 * are, and a file that travels through share sheets and chat apps should say as little as it can.
 * Strict: any other field (another record, another patient) makes the whole package invalid.
 */
const PackageSchema = v.strictObject({
  format: v.literal(PROGRAMME_PACKAGE_FORMAT),
  formatVersion: VersionSchema,
  issuedAt: IsoDateTimeSchema,
  patient: v.strictObject({ id: IdSchema, code: PatientCodeSchema }),
  programme: HomeProgrammeSchema,
  photos: v.optional(v.array(PackagePhotoSchema), []),
  /** The language the therapist chose for the patient's screens; absent: the phone keeps its own. */
  language: v.optional(v.picklist(PATIENT_LANGUAGES)),
});

export interface ProgrammePackage {
  readonly format: typeof PROGRAMME_PACKAGE_FORMAT;
  readonly formatVersion: number;
  readonly issuedAt: string;
  readonly patient: { readonly id: string; readonly code: string };
  readonly programme: HomeProgramme;
  readonly photos?: readonly PackagePhoto[];
  readonly language?: PatientLanguage;
}

type PackagePhoto = v.InferOutput<typeof PackagePhotoSchema>;

/** A package that passed every check, with its programme read as a plan and its photos decoded. */
export interface OpenedProgrammePackage extends Omit<ProgrammePackage, 'photos'> {
  readonly plan: ExercisePlan;
  readonly photos: readonly ExercisePhoto[];
}

/**
 * Builds and encrypts a programme package under `code`, with the exercises' photos when given (a
 * file; QR codes carry none: pass no photos). Throws ProgrammeTransferError Invalid when the
 * programme is not this patient's or not a valid record, or a photo breaks a rule. Free-text
 * dosages travel as written.
 */
export async function createProgrammePackage(
  input: { patient: { id: string; code: string }; programme: HomeProgramme; issuedAt: string; photos?: readonly ExercisePhoto[]; language?: PatientLanguage },
  code: string,
  options: SealOptions,
): Promise<string> {
  const photos = (input.photos ?? []).map((p) => {
    if (p.programmeId !== input.programme.id) throw new ProgrammeTransferError('Invalid', `A photo of exercise ${p.exercise + 1} belongs to another programme.`);
    return { exercise: p.exercise, position: p.position, type: p.type, widthPx: p.widthPx, heightPx: p.heightPx, data: bytesToBase64(p.bytes) };
  });
  const body: ProgrammePackage = {
    format: PROGRAMME_PACKAGE_FORMAT,
    formatVersion: PROGRAMME_PACKAGE_VERSION,
    issuedAt: input.issuedAt,
    patient: { id: input.patient.id, code: input.patient.code },
    programme: input.programme,
    ...(photos.length > 0 ? { photos } : {}),
    ...(input.language ? { language: input.language } : {}),
  };
  checkPackage(body);
  return sealTransfer(canonicalJson(body), code, options);
}

/**
 * Decrypts and checks a programme package. With `boundPatientId` (the phone already follows a
 * programme of that patient) a package of anyone else is refused: ForeignPatient. Also throws
 * WrongCode, Tampered, NotThisKind, Unsupported or Invalid (see ProgrammeTransferError). Writes nothing.
 */
export async function openProgrammePackage(text: string, code: string, boundPatientId: string | null = null): Promise<OpenedProgrammePackage> {
  const parsed = await openTransfer(text, code, 'programme file');
  const opened = checkPackage(parsed);
  if (boundPatientId !== null && opened.patient.id !== boundPatientId) {
    throw new ProgrammeTransferError('ForeignPatient', `This programme is for ${opened.patient.code}, and this phone follows another person's programme. It was refused; nothing was saved.`);
  }
  return opened;
}

function checkPackage(parsed: unknown): OpenedProgrammePackage {
  const format = (parsed as { format?: unknown } | null)?.format;
  if (format !== PROGRAMME_PACKAGE_FORMAT) {
    throw new ProgrammeTransferError('NotThisKind', format === 'kinnote-home-report' ? 'This is a report from a patient\'s phone, not a programme. Import it on the patient\'s page instead.' : 'This is not a Kinnote programme file.');
  }
  const version = (parsed as { formatVersion?: unknown }).formatVersion;
  if (typeof version !== 'number' || !READABLE_VERSIONS.includes(version)) {
    throw new ProgrammeTransferError('Unsupported', `This programme file is version ${JSON.stringify(version)}; this app reads version ${PROGRAMME_PACKAGE_VERSION}. Update the app.`);
  }
  const result = v.safeParse(PackageSchema, parsed);
  if (!result.success) {
    const issue = result.issues[0];
    throw new ProgrammeTransferError('Invalid', `This programme file breaks its format at ${v.getDotPath(issue) ?? 'the top'}: ${issue.message}. Nothing was saved.`, { dose: exerciseDoseIssue(issue) });
  }
  const pkg = result.output as ProgrammePackage;
  if (pkg.programme.patientId !== pkg.patient.id) {
    throw new ProgrammeTransferError('ForeignPatient', 'This programme file mixes two people (its programme is not for the patient it names). It was refused; nothing was saved.');
  }
  const checked = checkExercisePlan(programmeToPlan(pkg.programme));
  if (!checked.ok) {
    const first = checked.issues[0]!;
    throw new ProgrammeTransferError('Invalid', `The programme breaks a rule at ${first.path}: ${first.message}.`, { dose: first.dose });
  }
  const photos = (pkg.photos ?? []).map((p, i) => readPhoto(p, i, pkg.programme));
  const places = new Set(photos.map((p) => `${p.exercise}:${p.position}`));
  if (places.size !== photos.length) throw new ProgrammeTransferError('Invalid', 'This programme file has two photos in one place (same exercise and position). Nothing was saved.');
  const { photos: _travelling, ...rest } = pkg;
  return { ...rest, plan: checked.plan, photos };
}

function readPhoto(p: PackagePhoto, index: number, programme: HomeProgramme): ExercisePhoto {
  let bytes: Uint8Array;
  try {
    bytes = base64ToBytes(p.data);
  } catch (cause) {
    throw new ProgrammeTransferError('Invalid', `Photo ${index + 1} of this programme file is damaged (its data is not base64). Nothing was saved.`, { cause });
  }
  const photo: ExercisePhoto = { programmeId: programme.id, patientId: programme.patientId, exercise: p.exercise, position: p.position, type: p.type, widthPx: p.widthPx, heightPx: p.heightPx, bytes };
  const problem = exercisePhotoProblem(photo, programme.items.length);
  if (problem !== null) throw new ProgrammeTransferError('Invalid', `Photo ${index + 1} of this programme file is refused: ${problem}. Nothing was saved.`);
  return photo;
}
