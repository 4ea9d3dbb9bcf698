/**
 * The words of the visit form (routes/patients/[id]/assess), in one typed catalogue like the
 * programme screens' (programme/therapist-messages.ts). English only for now. The words of each
 * measure (its card's heading, its rows' site noun, "Add a muscle group") live in its catalogue entry
 * (domain/measure-catalogue.ts), so that a new measure is one entry; these are the form's own.
 * Messages with numbers are functions (plurals and word order per language).
 */
const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;
const sideWord = (side: 'left' | 'right') => (side === 'left' ? 'Left' : 'Right');

export const VISIT_MESSAGES = {
  // The page
  titleNew: 'New assessment',
  titleAmend: 'Amend a visit',
  breadcrumb: 'Breadcrumb',
  caseload: 'Caseload',
  patient: 'Patient',
  autosave: 'Saved as you type on this device.',
  draftRestored: (time: string) => `Draft restored from ${time}.`,
  draftNotKept: (error: string) => `The draft could not be kept on this device: ${error}`,
  lastVisitUnreadable: (error: string) => `The last visit could not be read: ${error}`,
  draftsUnreadable: (error: string) => `Drafts could not be read: ${error}`,
  localMdcUnreadable: (error: string) => `The team's adopted MDCs could not be read (the review uses published figures): ${error}`,
  discardConfirm: 'Discard this draft? The values typed so far will be lost.',
  otherDraftsSubject: 'for this patient',
  otherDraftsEmpty: 'no values yet',
  visitNotHere: 'that visit is not on this device (deleted, or another patient)',
  notSetUp: 'This device is not set up yet (Settings).',
  // Session
  session: 'Session',
  date: 'Date',
  time: 'Time',
  position: 'Position',
  notRecorded: 'Not recorded',
  minutesSinceMedication: 'Minutes since medication',
  painNow: 'Pain now (0–10)',
  setting: 'Setting',
  // Amendment
  amendment: 'Amendment',
  amendmentHint:
    'The saved values are changed, never overwritten silently: each change is kept in the audit with its old and new value, who and when, and this reason. Notes can be amended while names are unlocked; the audit keeps that they changed, never their text. Pendulum recordings are not changed here.',
  amendReason: 'Reason for the amendment',
  amendedBefore: 'Amended before:',
  amendReasonNeeded: 'say why the visit is amended (kept in the audit)',
  // Rows of the tests
  side: 'Side',
  left: 'Left',
  right: 'Right',
  sideWord,
  notTestedToday: 'Not tested today',
  remove: 'Remove',
  removeRow: (name: string, n: number) => `Remove ${name} row ${n} from this visit and the next`,
  gradeLegend: (site: string, side: string) => `Grade, ${site} ${side}`,
  r1: 'R1, fast (°)',
  r2: 'R2, slow (°)',
  spasticityAngle: 'R2 − R1:',
  quality: 'Quality of muscle reaction',
  movement: 'Movement',
  passive: 'Passive',
  active: 'Active',
  instrument: 'Instrument',
  instruments: { 'universal-goniometer': 'Universal goniometer', inclinometer: 'Inclinometer', 'phone-sensor': 'Phone sensor' },
  angle: 'Angle (°)',
  lastTime: (value: string, date: string) => `Last time ${value} (${date})`,
  firstVisitNothing: 'First visit: nothing earlier',
  noEarlierValue: 'No earlier value',
  ratingsGroup: 'Ratings',
  // Notes
  notes: 'Notes',
  notesPrivate: 'Notes are encrypted on this device and never leave it in de-identified exports.',
  notesLocked: 'Notes are protected:',
  unlock: 'unlock',
  notesLockedRest: 'to write them. Everything else saves as usual.',
  // First visit
  firstVisitTitle: 'First visit: what to test',
  templatesLede: (sides: string) => `No tests carried from an earlier visit on this device. Lay out the tests from a template (${sides}), then add, remove or mark rows "Not tested today" as usual; or start empty.`,
  bothSides: 'both sides (no affected side recorded)',
  affectedSides: (sides: readonly string[]) => `the affected side${sides.length > 1 ? 's' : ''}: ${sides.join(' and ')}`,
  templatePosition: (position: string) => ` · position: ${position}`,
  startEmpty: 'Start empty',
  laidOutFrom: (template: string) => `Laid out from the template “${template}”. Tests not done today: press “Not tested today” on their row.`,
  // Instruments
  instrumentsTitle: 'Instruments',
  dueTitle: 'To take today, as last visit',
  duePendulum: (side: 'left' | 'right') => `${sideWord(side)} knee · Pendulum test`,
  dueInclinometer: (side: 'left' | 'right', motion: string, mode: string) => `${sideWord(side)} ${motion}, ${mode} · Phone inclinometer`,
  dueRelaxationIndex: (lastTime: string) => `Relaxation index (R2): ${lastTime}`,
  takenToday: (title: string) => `Taken today: ${title}`,
  fromFile: 'From a file',
  withPhone: 'With this phone',
  measureWithPhone: 'Measure with this phone',
  removeDue: (title: string) => `Remove ${title} from this visit and the next`,
  pendulumFromFile: 'Pendulum from a file',
  pendulumWithPhone: 'Pendulum with this phone',
  phoneInclinometer: 'Phone inclinometer',
  addToVisit: 'Add to this visit',
  addedToVisit: (title: string) => `Added to this visit: ${title}. It is saved with the visit.`,
  removeReadingConfirm: (title: string) => `Remove this reading from the visit? ${title}`,
  removeReading: (title: string) => `Remove from this visit: ${title}`,
  notRecordedParts: (parts: readonly string[]) => ` (not recorded: ${parts.join('; ')})`,
  readingsHint: 'A pendulum test or a phone inclinometer reading taken here is saved with this visit.',
  unreadableReadings: (n: number) =>
    n === 1
      ? 'A reading in the restored draft could not be read, so it is not in this visit and will not be saved with it. Take it again:'
      : `${n} readings in the restored draft could not be read, so they are not in this visit and will not be saved with it. Take them again:`,
  // Issues
  fieldNames: {
    painNrs: 'Pain now',
    minutesSinceMedication: 'Minutes since medication',
    performedAtLocal: 'Date and time',
    amendReason: 'Reason for the amendment',
  } as Record<string, string>,
  instrumentReading: 'Instrument reading',
  instrumentReadingDue: 'Instrument reading to take today',
  checkFields: (n: number) => `Please check ${plural(n, 'field', 'fields')} marked below.`,
  nothingMeasured: 'Nothing measured yet: add at least one grade, angle, rating or instrument reading.',
  // Saving and the review
  saveAssessment: 'Save assessment',
  saveAmendment: 'Save the amendment',
  saveVisit: 'Save visit',
  saveAmendedVisit: 'Save the amended visit',
  discardDraft: 'Discard draft',
  changedWhileSaving: 'Assessment saved with the values as they were when you pressed Save (',
  seeOnPatientPage: "see it on the patient's page",
  changedWhileSavingRest:
    '). You changed the form while it was saving: those changes are not in the saved assessment. They are still in the form, kept as a draft: save again to record them as another assessment, or discard the draft.',
  reviewTitle: 'Check before saving',
  reviewCount: (tests: number, readings: number) =>
    `${plural(tests, 'test', 'tests')}${readings > 0 ? `, ${readings} of them by instrument (its main value shown; every index is saved)` : ''}.`,
  nothingToCompare: 'Nothing earlier to compare with.',
  noChangeBeyondMdc: 'No change beyond the MDC since last time.',
  changesBeyondMdc: (n: number) => `${plural(n, 'change', 'changes')} beyond the MDC since last time, marked below.`,
  today: 'today',
  beyondMdc: (improved: boolean) => `Beyond the MDC: ${improved ? 'improved' : 'worsened'}`,
  caution: 'Not a diagnostic device; decisions rest with licensed clinicians.',
  saving: 'Saving…',
  backToForm: 'Back to the form',
  firstVisitCompare: 'First visit: nothing earlier to compare with',
  firstValueCompare: 'First value of this test: nothing to compare yet',
  notCompared: (reason: string) => `Not compared: ${reason}`,
  notJudged: 'Change not judged for this measure (no direction of improvement)',
  firstVisitShort: 'first visit',
  newTest: 'new test',
};
