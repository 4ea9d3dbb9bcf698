/**
 * The words of the cohort audit (+page.svelte, FiltersForm, CohortChange, CohortExport, cohort-text),
 * English only for now (see ../home-messages.ts). Figures are formatted by cohort-text.ts and passed
 * in; statistical names (MDC, IQR, SRM, Wilcoxon, Wilson) are the trade's. Messages with numbers are
 * functions.
 */
const plural = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`;

export const pageTitle = 'Cohort audit · Kinnote';
export const heading = 'Cohort audit';
export const lede =
  'Choose a group of patients and a measure; see how many changed beyond measurement error; export the data without names (de-identified by default).';

// Who and what (the filters)
export const filtersTitle = 'Who and what';
export const from = 'From';
export const to = 'To';
export const measure = 'Measure';
export const site = 'Site';
export const everySite = 'Every site';
export const side = 'Side';
export const bothSides = 'Both';
export const left = 'Left';
export const right = 'Right';
export const clinician = 'Clinician';
export const anyone = 'Anyone';
export const aroundEvent = 'Around an event';
export const event = 'Event';
export const noEvent = 'No event: first and last in the dates';
/** An event kind's or a condition's name as shown: its key with spaces for hyphens. */
export const keyName = (key: string) => key.replace(/-/g, ' ');
export const followUpFromWeek = 'Follow-up from week';
export const toWeek = 'to week';
export const windowHint = (fromWeek: number | null, toWeek: number | null) =>
  `Baseline: the last assessment before the event. Follow-up: the first assessment ${fromWeek ?? ''}–${toWeek ?? ''} weeks after it.`;
export const condition = 'Condition';
export const setting = 'Setting';
export const patients = (n: number) => plural(n, 'patient');
export const pairs = (n: number) => plural(n, 'baseline–follow-up pair');
export const observations = (n: number) => plural(n, 'observation');
export const cannotCombine = (reason: string) => `These filters cannot be combined: ${reason}`;
export const readingRecords = 'Reading records…';

// Change in this cohort
export const changeTitle = 'Change in this cohort';
export const pairsHint =
  'n counts pairs (patient × side): a patient measured on both sides counts twice, and the two sides are not independent. Grades change in whole steps; medians of grade changes are changes, never grades.';
export const signLead = 'Sign:';
export const signText =
  'change is follow-up minus baseline, so for spasticity grades, Tardieu angles and spasm scales a negative change is better; for ranges of motion and pendulum indices a positive one is.';
export const srmText =
  "(standardised response mean) is the mean change divided by the spread of changes: about 0.2 small, 0.5 moderate, 0.8 large (Cohen's rule of thumb, from memory).";
export const tableScrolls = 'Table, scrolls sideways';
export const measureAndSite = 'Measure and site';
export const nPatients = 'n (patients)';
export const medianChange = 'Median change [IQR]';
export const improvedColumn = 'Improved beyond MDC [Wilson 95 %]';
export const wilcoxonColumn = 'Wilcoxon p';
export const mdcUsed = 'MDC used';
export const noMdc = 'no MDC';
export const none = 'none';
export const fewPatients = ' (few patients*)';
export const few = ' (few*)';
export const smallSample = (n: number) =>
  `* Fewer than ${n} patients: the Wilcoxon p and the SRM are unstable at this size; read them as a description, not as evidence of change.`;
export const mdcSources = 'Where each MDC comes from';
export const chartCaption = (group: string) => `${group}: change (follow-up − baseline)`;
export const improvedLabel = (share: string, low: string, high: string) => `Improved beyond the MDC: ${share}, 95 % interval ${low} to ${high}`;
export const improvedHint = (share: string, low: string, high: string) => `Improved beyond the MDC: ${share} (bar), Wilson 95 % interval ${low}–${high} (bracket).`;
export const noPairs = 'No baseline–follow-up pairs match these filters.';
export const gradeStep = ' grade step';
export const gradeSteps = ' grade steps';
export const publishedFigure = (citation: string) => `Published figure: ${citation}`;

// Export
export const exportTitle = 'Export';
export const identityAndDates = 'Identity and dates';
export const daysFromBaseline = 'De-identified, dates as days from each patient’s baseline';
export const shiftedDates = 'De-identified, dates shifted by a random amount per patient';
export const identified = (unlocked: boolean) => `Identified (names, real dates)${unlocked ? '' : ' — unlock the vault first'}`;
export const allowedToExport = 'I am allowed to export identifiable health data for this purpose; this export is logged.';
export const deidentifiedHint =
  'De-identified files replace codes with keyed hashes under a key made for this export and then forgotten, give birth years in 5-year bands, and carry no names, notes or free text.';
export const filesTitle = 'Files';
export const longCsv = 'Long CSV (one row per observation)';
export const wideCsv = 'Wide CSV (baseline, follow-up, change, verdict)';
export const summaryCsv = 'Summary CSV';
export const fhirBundle = 'HL7 FHIR R4 Bundle (JSON)';
export const exporting = (file: string) => `Exporting ${file}…`;
export const cancel = 'Cancel';
export const exportButton = 'Export';
export const saveFile = (name: string) => `Save ${name}`;
export const rows = (n: number) => `(${plural(n, 'row')})`;
export const exportCaution = 'Not a diagnostic device. Follow your local governance and data-protection law before sharing any export.';
export const identifiedNeedsConfirm = 'An identified export needs the vault unlocked and your confirmation.';
export const exportCancelled = 'Export cancelled; nothing was saved.';
/** The audit trail's entry for an identified export (read in the audit export). */
export const identifiedExportAudit = (files: string, filters: string) => `identified cohort export (${files}); filters ${filters}`;
