/**
 * The words of the new-patient form (+page.svelte), English only for now (see ../../home-messages.ts).
 * The status names repeat the caseload's (../caseload-messages.ts) on purpose: a catalogue imported by
 * this page too would become a chunk of its own, every caseload word in it, in the first screen's load.
 */
export const pageTitle = 'Add a patient · Kinnote';
export const breadcrumb = 'Breadcrumb';
export const heading = 'Add a patient';
export const code = 'Code';
export const drawAnother = 'Draw another';
export const codeHint = 'The code is random and says nothing about the person. It is what exports and charts show.';
export const birthYear = 'Birth year';
export const condition = 'Condition';
/** A condition's name as shown: its key with spaces for hyphens ("cerebral palsy"). */
export const conditionName = (key: string) => key.replace(/-/g, ' ');
export const caseload = 'Caseload';
export const status = 'Status';
export const statusActive = 'Active';
export const statusPaused = 'Paused';
export const statusDischarged = 'Discharged';
export const affectedSide = 'Affected side';
export const left = 'Left';
export const right = 'Right';
export const nameAndContact = 'Name and contact (encrypted on this device)';
export const unlockLink = 'Unlock';
export const unlockHintEnd = 'to add names; you can add them later.';
export const givenName = 'First name';
export const familyName = 'Family name';
export const dateOfBirth = 'Date of birth';
export const contact = 'Contact';
export const saving = 'Saving…';
export const addPatient = 'Add patient';
// Refusals
export const badBirthYear = 'Birth year: a four-digit year.';
export const namesLocked = 'Names are protected: unlock in Settings first, or leave the names empty for now.';
export const bothNames = 'Give both first and family name, or neither.';
