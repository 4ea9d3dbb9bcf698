/**
 * The words of the reliability page (+page.svelte, StudyCard.svelte, NewStudyForm.svelte), English
 * only for now (see ../home-messages.ts). Figures are formatted by reliability-text.ts and passed in;
 * statistical names (ICC forms, SEM, MDC95) are the trade's and stay as they are. Messages with
 * numbers are functions.
 */
export const pageTitle = 'Reliability studies · Kinnote';
export const heading = 'Reliability studies';
export const lede =
  'Measure the same people more than once, with your own instruments and raters, to learn your team’s own measurement error. An MDC you adopt here replaces the published reference in that measure’s verdicts; every verdict says which one it used.';
// Which ICC form fits which design: each item is a bold lead and its text
export const iccHelpTitle = 'Which ICC form fits which design?';
export const iccIntraLead = 'Same rater, measured twice (intra-rater) or a test and a retest:';
export const iccIntraText = 'the question is whether one measurement agrees with the next, so use a';
export const iccIntraForm = 'single-measure, absolute-agreement';
export const iccIntraEnd = 'form: ICC(2,1), which McGraw & Wong call ICC(A,1).';
export const iccInterLead = 'Several raters, once each (inter-rater):';
export const iccInterText = 'raters are a sample of the people who might measure, so again ICC(2,1) / ICC(A,1) when any rater may measure next time.';
export const iccConsistencyText = '(consistency) ignores a rater who always reads higher; it flatters agreement when raters differ systematically.';
export const iccOneWayText = 'fits when each subject has different raters; the';
export const iccMeanForms = '“,k” forms';
export const iccMeanText = 'describe the mean of k measurements, not the single measurement a clinic takes.';
export const semNote = 'The SEM is √(MS error) of the two-way ANOVA (Weir 2005); MDC95 = 1.96·√2·SEM, MDC90 = 1.645·√2·SEM. Kinnote adopts MDC95.';
export const studiesTitle = 'Studies on this device';
export const noStudies = 'No studies yet.';
export const newStudy = 'New study';
export const studySaved = 'Study saved.';
export const adopted = (site: string, mdc: string) => `Adopted: verdicts for ${site} now use the MDC of ${mdc} from this study.`;
export const withdrawn = 'Withdrawn: verdicts use the catalogue’s reference again.';

// One study
export const studySize = (subjects: number, columns: number) => `${subjects} subjects × ${columns} columns`;
export const iccCaption = 'Intraclass correlations with 95 % confidence intervals';
export const formColumn = 'Form';
export const mcGrawWongColumn = 'McGraw & Wong';
export const interval = (low: string, high: string) => `${low} to ${high}`;
export const inUseSince = (day: string, mdc: string) => `In use for verdicts since ${day} (MDC95 ${mdc}).`;
export const stopUsing = 'Stop using it';
export const useThisMdc = 'Use this MDC for verdicts';

// A new study
export const title = 'Title';
export const titleExample = 'e.g. Knee flexion, two sessions a week apart';
export const measure = 'Measure';
export const site = 'Site';
export const design = 'Design';
export const columns = 'Columns (trials or raters)';
export const readCsv = 'Or read a CSV (subject column first, then one column per trial or rater)';
export const tableScrolls = 'Table, scrolls sideways';
export const subject = 'Subject';
export const raterColumn = (n: number) => `Rater ${n}`;
export const trialColumn = (n: number) => `Trial ${n}`;
export const whoWasRater = (n: number) => `Who was rater ${n}`;
export const subjectLabel = (n: number) => `Subject ${n} label`;
export const subjectCell = (n: number, interRater: boolean, column: number) => `Subject ${n}, ${interRater ? 'rater' : 'trial'} ${column}`;
export const addSubject = 'Add a subject';
export const liveFigures = (icc: string, low: string, high: string, sem: string, mdc95: string) =>
  `ICC(2,1) ${icc} (95 % CI ${low} to ${high}) · SEM ${sem} · MDC95 ${mdc95}`;
export const saveStudy = 'Save study';
export const csvRead = (subjects: number, columns: number, names: string, file: string) =>
  `Read ${subjects} subjects × ${columns} columns (${names}) from ${file}.`;
export const needTitle = 'Give the study a title.';
