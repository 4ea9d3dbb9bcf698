import type { PatientLanguage } from '$lib/programme';

/**
 * The words of the therapist's programme screens (hand-over, report import, exercise fields), in
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
};

export type TherapistMessages = typeof THERAPIST_MESSAGES;

/** Each patient language named in itself, as the phone's own switch names it. */
export const PATIENT_LANGUAGE_SELF_NAMES: Readonly<Record<PatientLanguage, string>> = { en: 'English', es: 'Español' };
