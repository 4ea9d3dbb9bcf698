/**
 * The words of the therapist's menu and the page frame (+layout.svelte), English only for now (see
 * home-messages.ts). Named exports: the layout is in every first screen (first-load budget). The
 * patient's menu speaks the patient's language from the patient catalogue.
 */
export const navHome = 'Home';
export const navCaseload = 'Caseload';
export const navReliability = 'Reliability';
export const navCohort = 'Cohort audit';
export const navSettings = 'Settings';
export const skipToContent = 'Skip to content';
export const mainMenu = 'Main';
export const lockTitle = 'Hide names and notes now';
export const lock = 'Lock';
export const lockedUnlock = 'Locked · unlock';
