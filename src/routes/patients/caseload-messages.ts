/**
 * The words of the caseload (+page.svelte, CaseloadRow.svelte, caseload-loader.ts), English only for
 * now (see ../home-messages.ts). Named exports: the caseload is a first screen (first-load budget).
 * Messages with numbers are functions.
 */
const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;

export const pageTitle = 'Caseload · Kinnote';
export const heading = 'Caseload';
export const addPatient = 'Add a patient';
export const searchBy = (withNames: boolean) => `Search by code${withNames ? ' or first name' : ''}`;
export const show = 'Show';
export const showAll = 'Everyone';
export const showDue = 'Due within a week';
export const showChanged = 'Changed beyond MDC';
export const showWorsened = 'Worse beyond MDC';
export const status = 'Status';
export const statusActive = 'Active';
export const statusPaused = 'Paused';
export const statusDischarged = 'Discharged';
export const statusAny = 'Any';
export const reading = 'Reading the caseload…';
export const readingRest = 'Reading the rest of the caseload…';
export const shownOf = (shown: number, total: number) => `${shown} of ${total} patient${total === 1 ? '' : 's'}`;
export const listLabel = 'Patients';
export const noPatients = 'No patients yet.';
export const loadDemo = 'Load the demo caseload';
export const or = 'or';
export const addOne = 'add a patient';
export const changeHint = '▲/▼: a measure has changed beyond its minimal detectable change since the first assessment.';
// One row
export const neverAssessed = 'Never assessed';
export const lastSeen = (date: string) => `Last seen ${date}`;
export const better = (n: number) => `▲ ${n} better`;
export const worse = (n: number) => `▼ ${n} worse`;
// When the next visit is due
export const noAssessmentYet = 'No assessment yet';
export const overdueBy = (days: number) => `Overdue by ${plural(days, 'day', 'days')}`;
export const dueToday = 'Due today';
export const dueIn = (days: number) => `Due in ${plural(days, 'day', 'days')}`;
