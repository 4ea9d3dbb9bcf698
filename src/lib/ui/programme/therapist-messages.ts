import { doseProblemText, type DoseProblem } from '$lib/domain';
import type { PatientLanguage } from '$lib/programme';

/**
 * The words of the therapist's programme screens (the programme editor, its exercise fields and
 * photos, the hand-over, the report import, the adherence bars), in
 * one typed catalogue like the patient's (patient-messages.ts). English only for now: therapist
 * screens are not translated yet, but their strings live here so a second language is one more
 * object of this shape. Messages with numbers are functions (plurals and word order per language).
 */
const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;

export const THERAPIST_MESSAGES = {
  // Hand-over
  handoverTitle: "Hand over to the patient's phone",
  handoverLede: (code: string) =>
    `The programme goes as one encrypted file, with no server. It carries only this programme and the code ${code}: no name and no other patient. Tell the patient the hand-over code separately (show it or read it out); the file cannot be opened without it.`,
  saveFirst: 'Save the programme first.',
  languageLegend: "The patient's language",
  languageHint: 'The phone opens its screens in this language; the patient can still switch. What you wrote (title, exercises, notes) is shown as you wrote it.',
  encrypting: 'Encrypting…',
  makeNew: 'Make a new file and code',
  prepare: 'Prepare the hand-over',
  handoverCode: 'Hand-over code:',
  opensIn: 'The phone will open in',
  shareFile: 'Share or save the file',
  hideQr: 'Hide QR codes',
  showQr: 'Show as QR codes',
  shareTitle: 'Home programme',
  shared: 'Shared.',
  savedAs: (file: string) => `Saved as ${file}. Send it to the patient's phone (e.g. by message or e-mail).`,
  filePhotos: (n: number, kilobytes: number) => `The file carries ${plural(n, 'photo', 'photos')} (${kilobytes} KB).`,
  qrTextOnly: "QR codes carry the programme's text only, never photos.",
  qrShareForPhotos: ' To give the patient the photos, share the file.',
  qrLabel: 'programme file',
  // Report import
  importTitle: "Import a report from the patient's phone",
  importLede: "The patient's phone makes an encrypted report with its own code. Records merge by id: importing the same report again changes nothing; a report of another patient, or an altered one, is refused whole.",
  chooseReport: 'Choose the report file',
  orReadQr: 'Or read its QR codes',
  qrSource: 'QR codes',
  reportReady: (source: string) => `Report ready: ${source}`,
  reportCode: 'Report code',
  importing: 'Importing…',
  importButton: 'Import the report',
  chooseFirst: 'Choose the report file (or read its QR codes) first.',
  reportSummary: (madeOn: string, daysTicked: number, ratings: number, skipped: number, range: string | null) =>
    `Report from ${madeOn}: ${plural(daysTicked, 'day', 'days')} ticked, ${plural(ratings, 'spasm rating', 'spasm ratings')}${skipped > 0 ? `, ${plural(skipped, 'session', 'sessions')} skipped` : ''}${range ? ` (${range})` : ''}.`,
  dateRange: (from: string, to: string) => `${from} to ${to}`,
  alreadyImported: 'This report was already imported: nothing changed.',
  skippedTitle: "Skipped, with the patient's reasons",
  noReason: 'no reason given',
  exerciseNumber: (n: number) => `Exercise ${n}`,
  // One exercise of the programme form
  whatToDo: 'What to do, in your words',
  earlierDosage: 'Dosage as written before:',
  earlierReplaced: ' — will be replaced by the fields below when you save.',
  earlierKept: ' — kept as it is until you fill in the fields below.',
  repetitions: 'Repetitions',
  sets: 'Sets',
  holdSeconds: 'Hold (seconds)',
  minutesEachTime: 'Minutes each time',
  overnight: 'Overnight',
  timesPerDay: 'Times a day',
  daysPerWeek: 'Days a week',
  noteOptional: 'Note (optional)',
  notePlaceholder: 'e.g. each side; stop if the knee hurts',
  doseHint: 'Fill in only what you prescribe. Empty times a day and days a week: the patient can tick it, but it is not counted as planned. "2 hours a day": 120 minutes, 1 time a day.',
  saveForPhotos: 'Save the programme to add photos of this exercise.',
  removeExercise: (n: number) => `Remove exercise ${n}`,
  // The programme page
  pageTitle: (code: string | null) => `Home programme · ${code ?? 'Patient'} · Kinnote`,
  breadcrumb: 'Breadcrumb',
  caseload: 'Caseload',
  homeProgramme: 'Home programme',
  readingRecord: 'Reading the record…',
  noSuchPatient: 'No patient with this code on this device.',
  programmeFor: 'Home programme for',
  pageCaution:
    'Home programmes are written by the treating therapist. Kinnote only carries and logs them; it gives no clinical advice. Follow local protocols and data-protection law when files leave this device.',
  // The programme editor: its draft
  draftKeptHint: 'The form is kept on this device as you type until you save it.',
  draftNotKept: (why: string) => `The draft could not be kept on this device: ${why}`,
  draftsUnreadable: (why: string) => `Drafts could not be read: ${why}`,
  draftRestored: (time: string) => `Draft restored from ${time}.`,
  draftSubject: 'of this programme',
  draftFormHolds: 'the saved programme',
  exerciseCount: (n: number) => plural(n, 'exercise', 'exercises'),
  confirmDiscard: 'Discard the changes not saved yet? The form then shows the saved programme.',
  discardChanges: 'Discard changes',
  staleNotice: 'This programme was changed in another tab or on another device.',
  reloadProgramme: 'Reload the programme',
  reloadDrops: '(the form then shows the saved version; what you typed here is dropped).',
  // The programme editor: its fields and save
  defaultTitle: 'Home stretching programme',
  editTitle: 'The programme',
  writeTitle: 'Write a programme',
  freeTextDosage: (exercises: readonly number[]) =>
    `Exercise ${exercises.join(', ')} still ${exercises.length === 1 ? 'has its' : 'have their'} dosage as free text, shown below as written. It is handed over and shown to the patient as it is, but not counted in adherence until you fill in the dosage fields (the text is then replaced).`,
  title: 'Title',
  startsOn: 'Starts on',
  endsOnOptional: 'Ends on (optional)',
  addExercise: 'Add an exercise',
  weeklySessions: (n: number, most: number) => `${n} planned exercise sessions in a full week (at most ${most}).`,
  saveProgramme: 'Save the programme',
  programmeSaved: "Programme saved. Hand it over to the patient's phone below.",
  savedWhilePressed: 'Programme saved as it was when you pressed Save. What you typed while it was saving is still in the form, kept as a draft: save again to keep it.',
  /** A problem the plan check found, placed in the form's words ("Exercise 2, hold: …"). */
  planIssue: (where: string, problem: string) => `${where}: ${problem}`,
  fieldOfExercise: (n: number, field: string) => `Exercise ${n}, ${field}`,
  /** A dose problem the check found, after the field's name: in English, the check's own words (domain/exercise-dose.ts). */
  doseProblem: (p: DoseProblem): string => doseProblemText(p),
  /** The form's names of the plan's fields, for the plan check's issues. */
  planFields: {
    title: 'Title',
    startsOn: 'Start date',
    endsOn: 'End date',
    exercises: 'Exercises',
    programme: 'Programme',
    name: 'what to do',
    dose: 'dosage',
    holdSeconds: 'hold',
    repetitions: 'repetitions',
    sets: 'sets',
    durationMinutes: 'minutes each time',
    timesPerDay: 'times a day',
    daysPerWeek: 'days a week',
    note: 'note',
  } as Readonly<Record<string, string>>,
  // Photos of one exercise
  photosCount: (n: number, most: number) => `Photos (${n} of ${most})`,
  photoAlt: (position: number, exercise: number) => `Photo ${position} of exercise ${exercise}`,
  removePhoto: (position: number) => `Remove photo ${position}`,
  takePhoto: 'Take a photo',
  choosePhoto: 'Choose a photo',
  shrinkingPhoto: 'Making the photo smaller…',
  photoKept: (widthPx: number, heightPx: number, kilobytes: number) => `Photo kept: ${widthPx} × ${heightPx} px, ${kilobytes} KB.`,
  tooManyPhotos: (free: number, most: number) => `Only ${plural(free, 'more photo', 'more photos')} fit this exercise (at most ${most}).`,
  // A picked photo that cannot be kept (the file is named)
  unnamedPicture: 'the picture',
  noCanvas: 'This browser cannot draw pictures (no canvas), so photos cannot be added here.',
  notAPicture: (name: string, type: string) => `${name} is not a picture (it is ${type}). Choose a photo.`,
  emptyPicture: (name: string) => `${name} is empty. Choose another photo.`,
  pictureFileTooLarge: (name: string, megabytes: number, most: number) => `${name} is too large (${megabytes} MB; at most ${most} MB). Choose a smaller photo.`,
  pictureUnreadable: (name: string, type: string | null) =>
    `${name} could not be read as a picture: its type (${type ?? 'unknown'}) is not supported by this browser, or the file is damaged. Choose a JPEG, PNG or WebP photo.`,
  pictureTooManyPixels: (name: string, widthPx: number, heightPx: number) => `${name} is too large to open on this device (${widthPx} × ${heightPx} pixels). Choose a smaller photo.`,
  pictureNotSmallEnough: (name: string, mostKilobytes: number) => `${name} could not be made small enough (at most ${mostKilobytes} KB) on this device. Try a simpler photo.`,
  // Adherence per week (the patient page and the programme page)
  adherenceTitle: 'Home programme adherence per week',
  noAdherence: 'No adherence recorded yet.',
  writeOrHandOver: 'Write or hand over a home programme',
  adherenceNote: 'Share of planned exercise sessions done in full, week starting Monday; newest first.',
  doneOfPlanned: (done: number, planned: number) => `(${done} of ${planned})`,
};

export type TherapistMessages = typeof THERAPIST_MESSAGES;

/** Each patient language named in itself, as the phone's own switch names it. */
export const PATIENT_LANGUAGE_SELF_NAMES: Readonly<Record<PatientLanguage, string>> = { en: 'English', es: 'Español' };
