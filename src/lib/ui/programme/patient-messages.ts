// By their own paths: the first screen loads these messages, and the folder's door would bring the
// whole programme folder (and the store's import) into the first load.
import type { DoseField, DoseProblem } from '$lib/domain';
import { durationWords, type DosePart, PATIENT_LANGUAGES, isPatientLanguage, type PatientLanguage, type ProgrammeTransferErrorCode } from '$lib/programme';

/**
 * Every word a patient reads on their own phone, in each language the phone speaks. English is the
 * source; `PatientMessages` is its shape, so a message missing from another language (or taking
 * other arguments) is a type error at build time. Messages with numbers are functions, so each
 * language makes its own plurals and word order.
 *
 * Why a catalogue written here rather than Paraglide JS: see DEVELOPERS.md ("Patient languages").
 * Spanish (patient-messages-es.ts): written by a non-native speaker, to be reviewed by a native
 * speaker before release.
 */
export const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;

const en = {
  languageName: 'English',
  languageChoice: 'Language',
  // Menu and frame
  navToday: 'Today',
  navWeek: 'My week',
  navFeel: 'How I feel',
  navSend: 'Send report',
  navReminders: 'Reminders',
  skipToContent: 'Skip to content',
  leaveLink: 'Stop using this phone for my programme',
  therapistDevice: "These screens are for a patient's own phone. This device is set up for a therapist: hand a programme over from the patient's page instead.",
  caution: 'Stop an exercise that causes pain, and tell your therapist. If you feel unwell or have new weakness, numbness or severe spasms, get medical help. Kinnote keeps your log on this phone only; it gives no medical advice.',
  opening: 'Opening…',
  storeFailed: (why: string) => `The records on this phone could not be opened: ${why}`,
  // First screen
  welcome: 'Welcome to Kinnote',
  welcomeLede: 'Outcome records for therapists, and the home programme for their patients, on this device only.',
  patientChoiceTitle: 'I follow a home programme',
  patientChoiceText: 'Your therapist gives you a file or QR codes and a code. This phone then shows your exercises and keeps your log. It holds only your own programme.',
  receiveButton: 'Receive my programme',
  offlineReady: 'Kinnote is ready to work offline on this device.',
  openingProgramme: 'Opening your home programme…',
  // Receive
  receiveTitle: 'Get my programme',
  receiveLede: 'Your therapist sends you a file, or shows QR codes, and tells you a code of 10 letters and digits.',
  receiveStep1: '1. The programme',
  receiveOpenFile: 'Open the programme file',
  receiveOrQr: 'Or read QR codes',
  receiveQrNoPhotos: 'QR codes carry the text of your programme only, without photos. Ask for the file to see the photos.',
  receiveReady: (source: string) => `Ready: ${source}`,
  receiveQrSource: 'QR codes',
  receiveStep2: '2. The code',
  receiveCodeLabel: 'Code from your therapist',
  receiveOpenButton: 'Open my programme',
  receiveOpeningButton: 'Opening… (this takes a few seconds)',
  receiveNoFile: 'First open the programme file, or read its QR codes.',
  receiveNotPatientPhone: "This device is not set up as a patient's own phone.",
  receiveDone: (title: string) => `Your programme "${title}" is on this phone.`,
  receiveSame: (title: string) => `You already have this programme ("${title}"); nothing changed.`,
  receiveGoToday: "Go to today's exercises",
  // Today
  homeTitle: 'Your home programme',
  homeNothingYet: 'No programme on this phone yet. Your therapist gives you a file or QR codes, and a code.',
  todayTitle: 'Today',
  logDamaged: 'Your earlier ticks could not be read on this phone. New ticks are saved as usual.',
  dueReminder: (time: string, left: number) => `Reminder for ${time}: ${plural(left, 'exercise', 'exercises')} still to tick today.`,
  nothingToday: 'No exercises are planned for today.',
  thisWeekCount: (done: number, planned: number) => `This week: ${done} of ${planned} done`,
  timeOfToday: (slot: number, slots: number) => `Time ${slot} of ${slots} today`,
  todayLegend: 'Today',
  photoAlt: (position: number, count: number, exercise: string) => `Photo ${position} of ${count}: ${exercise}`,
  saved: 'Saved.',
  cleared: 'Cleared.',
  asWritten: 'As your therapist wrote it:',
  // Ticks
  tickDone: '✓ Done',
  tickPartly: '◐ Partly',
  tickSkipped: '✗ Skipped',
  whySkipped: 'Why? (it helps your therapist)',
  reasonPain: 'Pain',
  reasonTired: 'Too tired',
  reasonUnwell: 'Unwell',
  reasonNoTime: 'No time',
  reasonNoHelp: 'No help available',
  otherReason: 'Other reason',
  saveReason: 'Save reason',
  // How I feel (Penn Spasm Frequency Scale, Penn et al. 1989, in plain words)
  feelTitle: 'How are your spasms today?',
  feelHowOften: 'How often did you have spasms today?',
  penn0: '0 — No spasms',
  penn1: '1 — Only when something sets them off (touch, moving)',
  penn2: '2 — Now and then, less than once an hour',
  penn3: '3 — More than once an hour',
  penn4: '4 — More than ten times an hour',
  feelHowBad: 'How bad were they? 0 = none, 10 = worst you can imagine',
  feelSave: 'Save',
  feelChooseOne: 'Choose at least one answer.',
  feelSaved: 'Saved for today. You can change it again today.',
  // Send
  sendTitle: 'Send my report',
  sendLede: 'Your report holds your ticks and how your spasms felt. It is locked with a new code: tell your therapist the code yourself (say it or write it down), not in the same message as the file.',
  sendMaking: 'Making the report… (a few seconds)',
  sendMakeNew: 'Make a new report',
  sendMake: 'Make my report',
  sendYourCode: 'Your code:',
  sendShare: 'Share or save the report',
  sendHideQr: 'Hide QR codes',
  sendShowQr: 'Show QR codes for my therapist to scan',
  sendShareTitle: 'My home programme report',
  sendSent: 'Sent.',
  sendSavedAs: (file: string) => `Saved as ${file}. Send this file to your therapist.`,
  // Week
  weekTitle: 'My week',
  weekGetFirst: 'Get your programme first.',
  todaySuffix: ' (today)',
  notInProgramme: 'Not in your programme',
  beforeArrival: 'Before your programme came to this phone',
  nothingTicked: 'Nothing ticked',
  dayTicks: (done: number, partly: number, skipped: number) => `✓ ${done} done${partly ? ` · ◐ ${partly} partly` : ''}${skipped ? ` · ✗ ${skipped} skipped` : ''}`,
  weekByWeek: 'Week by week',
  weekLine: (week: string, done: number, planned: number) => `Week of ${week}: ${planned > 0 ? `${done} of ${planned} done (${Math.round((100 * done) / planned)} %)` : 'nothing to count this week'}`,
  notStarted: 'Your programme has not started yet.',
  olderWeeks: (n: number) => `Older weeks (${n})`,
  // Reminders
  remindersTitle: 'Reminders',
  willDoLabel: 'What this phone will do:',
  willDo: 'while Kinnote is open on the screen, it shows a notification at each time below (if you allow notifications), and the Today screen shows what is still to tick after a reminder time has passed.',
  willNotLabel: 'What it will not do:',
  willNot: "remind you when Kinnote is closed, when the phone is asleep, or reliably when another app is in front. A web app cannot wake itself, and Kinnote uses no server that could send reminders. For a reminder you can count on, set an alarm in your phone's clock app.",
  notificationsUnsupported: 'This browser cannot show reminders. Set an alarm on your phone for your exercise times instead.',
  notificationsDenied: "Reminders are blocked for Kinnote in this browser's settings. Allow notifications there, or set an alarm on your phone.",
  notificationsAsk: 'Kinnote needs your permission to show reminders.',
  notificationsAllowed: 'Reminders are allowed.',
  remindCheckbox: 'Remind me at these times while Kinnote is open',
  reminderTime: (i: number) => `Time ${i}`,
  addTime: 'Add a time',
  removeLastTime: 'Remove the last time',
  saveReminders: 'Save reminders',
  testReminder: 'Send a test reminder',
  testReminderText: 'This is how a reminder looks.',
  testReminderSent: 'A test reminder was sent.',
  remindersSaved: (withNotification: boolean) =>
    `Saved. Kinnote will remind you at these times only while it is open on your screen${withNotification ? ' (with a notification)' : ' (on the Today screen; notifications are not allowed)'}.`,
  remindersOff: 'Reminders are off.',
  reminderNotice: 'Time for your home exercises.',
  // Leave
  leaveTitle: 'Stop using this phone for my programme',
  leaveRemoves: 'This removes from this phone, for good:',
  leaveProgrammes: (n: number) => `your programme${n > 1 ? 's' : ''}:`,
  leavePhotos: (n: number) => `the exercise photos: ${n}`,
  leaveTicks: (ticks: number, days: number) => `your ticks: ${ticks} (${plural(days, 'day', 'days')} with exercises done)`,
  leaveRatings: (n: number) => `your spasm ratings: ${n}`,
  leaveReminders: 'your reminder times',
  leaveTherapistKeeps: 'Your therapist keeps only what you already sent.',
  leaveSendFirst: 'Send a report first',
  leaveSendFirstAfter: 'if you have not sent your latest ticks.',
  leaveConfirm: 'I understand: remove all of this from this phone',
  leaveButton: 'Remove and leave patient mode',
  leaveRemoving: 'Removing…',
  leaveReading: 'Reading what is on this phone…',
  leaveKeep: 'Keep my programme and go back',
  // A programme file refused for another reason (ProgrammeTransferError's code), in the patient's words
  receiveRefused: (code: ProgrammeTransferErrorCode): string => {
    switch (code) {
      case 'WrongCode':
        return 'This code does not open the programme file (or the file was altered). A code has 10 letters and digits, like 7KQ2M-XD4PH: check it and type it again. Nothing was saved.';
      case 'Tampered':
        return 'This programme file was altered or is incomplete, so it was refused. Nothing was saved. Ask your therapist to send it again.';
      case 'NotThisKind':
        return 'This is not a programme file from your therapist. Nothing was saved.';
      case 'Unsupported':
        return 'This programme was made by a newer version of Kinnote. Update the app, then open it again. Nothing was saved.';
      case 'Invalid':
        return 'This programme file cannot be read. Nothing was saved. Ask your therapist to send it again.';
      case 'ForeignPatient':
        return "This programme is for another person, or this phone follows another person's programme. It was refused; nothing was saved.";
      case 'Incomplete':
        return 'The scanned codes do not fit together (a code was misread). Scan them all again.';
    }
  },
  // A programme file refused for a dose the therapist must correct (domain/exercise-dose.ts)
  receiveDoseRefused: (exercise: number, field: string | null, problem: string) =>
    `This programme cannot be used: exercise ${exercise}${field ? `, ${field}` : ''}: ${problem}. Nothing was saved. Ask your therapist for a corrected programme.`,
  doseField: (field: DoseField): string => {
    switch (field) {
      case 'repetitions':
        return 'repetitions';
      case 'sets':
        return 'sets';
      case 'holdSeconds':
        return 'hold';
      case 'durationMinutes':
        return 'minutes each time';
      case 'overnight':
        return 'overnight';
      case 'timesPerDay':
        return 'times a day';
      case 'daysPerWeek':
        return 'days a week';
      case 'note':
        return 'note';
    }
  },
  doseProblem: (p: DoseProblem): string => {
    switch (p.code) {
      case 'wholeNumber':
        return 'must be a whole number';
      case 'atLeast':
        return `must be at least ${p.min}`;
      case 'atMost':
        return `must be at most ${p.max}`;
      case 'noteTooLong':
        return `must be at most ${p.max} characters`;
      case 'overnightOnceADay':
        return 'overnight is once a day: times a day must be empty or 1';
      case 'nothingPrescribed':
        return 'the dosage says nothing (no value and no note)';
    }
  },
  // Dose words
  dosePart: (part: DosePart): string => {
    switch (part.kind) {
      case 'hold':
        return `hold ${part.seconds} s`;
      case 'repetitions':
        return plural(part.count, 'repetition', 'repetitions');
      case 'sets':
        return plural(part.count, 'set', 'sets');
      case 'duration':
        return `${durationWords(part.minutes)} each time`;
      case 'overnight':
        return 'overnight';
      case 'times-per-day':
        return `${plural(part.count, 'time', 'times')} a day`;
      case 'days-per-week':
        return `on ${plural(part.count, 'day', 'days')} a week`;
      case 'every-day':
        return 'every day';
    }
  },
};

/** The shape every language fills: the same keys, strings where English has strings, the same functions. */
export type PatientMessages = { readonly [K in keyof typeof en]: (typeof en)[K] extends string ? string : (typeof en)[K] };

export { PATIENT_LANGUAGES, isPatientLanguage, type PatientLanguage };

/** English, the source language: always loaded. */
export const ENGLISH_MESSAGES: PatientMessages = en;

/** Each language named in itself, for the language switch (no catalogue needs to load for it). */
export const PATIENT_LANGUAGE_NAMES: Readonly<Record<PatientLanguage, string>> = { en: 'English', es: 'Español' };

/**
 * The catalogue of a language. Other languages than English are separate modules, loaded when a
 * phone first shows them, so the first screen's JavaScript stays within its budget (the service
 * worker precaches them, so this works offline).
 */
export async function loadPatientMessages(language: PatientLanguage): Promise<PatientMessages> {
  if (language === 'en') return en;
  return (await import('./patient-messages-es')).SPANISH_MESSAGES;
}
