/**
 * The words of the therapist's side of the first screen (+page.svelte), in English only for now like
 * the programme page's (lib/ui/programme/therapist-messages.ts): a second language is one more module
 * of this shape. Named exports, not one object, so the first screen's bundle keeps only what it uses
 * (first-load budget). Messages with numbers are functions. The patient's side of this screen speaks
 * the patient's language from the patient catalogue.
 */
export const pageTitle = 'Kinnote';
export const welcome = 'Welcome to Kinnote';
export const lede =
  'Record muscle tone, pendulum tests and joint range on visits, with or without signal, and see whether a patient has changed by more than the measurement error.';
export const storeFailed = (failure: string | null) => `The record store could not be opened: ${failure}`;
export const therapistTitle = 'I am a therapist';
export const openingSetUp = 'Opening the set-up form…';
export const setUpText = 'Set this device up for your caseload, with a passphrase that protects names and notes.';
export const setUpButton = 'Set up for a therapist';
export const getStarted = 'Get started';
export const tryDemo = 'Try Kinnote with an invented caseload, or start with an empty one on this device.';
export const demoNeedsUnlock = 'The demo carries invented names:';
export const unlockLink = 'unlock';
export const demoNeedsUnlockEnd = 'first to load it.';
export const loading = 'Loading…';
export const loadDemo = 'Load the demo caseload';
export const startEmpty = 'Start an empty caseload';
export const yourCaseload = 'Your caseload';
export const patientsHere = (n: number | null) => `${n ?? ''} patient${n === 1 ? '' : 's'} on this device.`;
export const openCaseload = 'Open the caseload';
export const addPatient = 'Add a patient';
export const demoLoaded = (records: number) => `Loaded the demo caseload (${records} records).`;
export const demoAlreadyHere = 'The demo caseload was already here; nothing changed.';
export const opening = 'Opening the records on this device…';
export const offlineReady = 'Kinnote is ready to work offline on this device.';
export const cautionsTitle = 'Cautions';
export const cautions =
  'Kinnote is not a diagnostic device. Clinical decisions rest with licensed clinicians. Follow your local protocols and the data-protection law that applies to health data.';
