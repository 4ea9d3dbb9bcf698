/**
 * The words of the shared therapist components at the top of lib/ui (UnlockPanel, SetupDevice,
 * ChoiceButtons, ReanalysisNotice), English only for now like therapist-messages.ts: a second
 * language is one more module of this shape. Messages with numbers are functions. Named exports, so
 * a bundle keeps only the messages its components use. These components load on demand; a module
 * shared by chunks becomes a chunk of its own holding every message any of them uses, so the update
 * banner, which is in every first screen, has its own small module (update-messages.ts), and the
 * drafts list has draft-messages.ts.
 */
// UnlockPanel: the dialog that unlocks names and notes over the current page
export const unlockTitle = 'Unlock names and notes';
export const unlockHint = 'You stay on this page. Names and notes show once unlocked, until you lock or the device locks itself.';
export const passphrase = 'Passphrase';
export const unlocking = 'Unlocking…';
export const unlock = 'Unlock';
export const cancel = 'Cancel';

// SetupDevice: the first run on a therapist's device
export const setupTitle = 'Set up this device';
export const setupLede =
  "Records stay on this device. Names and notes are encrypted with a passphrase that only you know: if it is lost, they cannot be recovered (the clinical values stay readable under each patient's code).";
export const yourName = 'Your name';
export const profession = 'Profession';
/** A profession's name as shown: its key with spaces for hyphens ("occupational therapist"). */
export const professionName = (key: string) => key.replace(/-/g, ' ');
export const deviceName = 'Name of this device';
export const deviceNameExample = 'e.g. Community team tablet 2';
export const passphraseFor = 'Passphrase for names and notes';
export const passphraseHint = 'At least 10 characters; a few unrelated words work well.';
export const passphraseAgain = 'Passphrase again';
export const setUpWithDemo = 'Set up and load the demo caseload';
export const setUpEmpty = 'Set up with an empty caseload';
export const settingUp = 'Setting up… deriving the key from the passphrase takes a moment.';
export const needNames = 'Please give your name and a name for this device.';
export const passphraseRule = 'The passphrase needs at least 10 characters, typed the same twice.';

// ChoiceButtons: a row of choices (grades, ratings)
export const needsAttention = ' (needs attention)';
export const hideMeanings = 'Hide what the grades mean';
export const showMeanings = 'What the grades mean';

// ReanalysisNotice: the one-time notice of the re-analysed phone pendulum recordings
export const notSaved = 'not saved';
export const reanalysisTitle = 'Saved phone pendulum results were checked again';
export const reanalysisWhy =
  "This version reads the phone's rotation sensors in the axis order browsers deliver and no longer assumes the leg started straight.";
export const reanalysisCounts = (recordings: number, changed: number, unconfirmed: number) =>
  `${recordings} saved phone recording${recordings === 1 ? ' was' : 's were'} analysed again from their raw samples: values changed in ${changed}${unconfirmed > 0 ? `, and ${unconfirmed} could not be confirmed` : ''}.`;
export const reanalysisHistory = "Each change is in the record's history with the old and the new value.";
export const changedValues = (n: number) => `Changed values (${n})`;
export const patientLink = (code: string) => `Patient ${code}`;
export const testOf = (day: string) => `, test of ${day}:`;
export const doubtfulTitle = 'Kept as saved, but doubtful: repeat these tests';
export const doubtfulDetail = (measures: string, reasons: string) => `${measures}. Why: ${reasons}.`;
export const reanalysisCaution = 'Kinnote is not a diagnostic device; decisions rest with licensed clinicians.';
export const haveRead = 'I have read this';
export const reanalysisFailed = (failure: string) =>
  `Saved phone pendulum results could not be checked again yet (${failure}). Kinnote tries again the next time it opens; until then those values come from the older analysis.`;
