/**
 * The words of the therapist's report page around the report itself: its choices, print and PDF
 * actions (the report's own words, shared with its PDF, are in export/report-wording.ts). English
 * only for now, in the typed shape of the other catalogues; messages with values are functions.
 */
export const REPORT_MESSAGES = {
  pageTitle: (fileName: string | null) => `${fileName ?? 'Report'} · Kinnote`,
  crumb: 'Report',
  heading: 'Report for the referring clinician',
  // What the report covers
  reportOn: 'Report on',
  changeSince: (event: string, day: string) => `Change since ${event.toLowerCase()}, ${day}`,
  changeOverPeriod: 'Change over a period',
  from: 'From',
  through: 'Through',
  includeName: "Include the patient's name and date of birth",
  nameHint: 'The report shows the pseudonymous code unless you tick this. The name leaves this device only if you print, share or save the report.',
  noNameRecorded: 'No name is recorded for this patient: the report shows the pseudonymous code.',
  namesLocked: 'Names are locked: the report shows the pseudonymous code.',
  unlockNames: 'Unlock names',
  toIncludeName: 'to include the name.',
  // Print
  print: 'Print or save as PDF',
  printHintBefore: "Opens the browser's print dialogue: choose a printer, or",
  printHintChoice: 'Save as PDF',
  // Share the PDF
  sharePdf: 'Share as PDF',
  downloadPdf: 'Download PDF',
  pdfMadeHere: (sharing: boolean) =>
    `The PDF is made on this device${sharing ? ' and handed to the app you choose (mail, messages, files)' : ' and saved to your downloads'}. Nothing is sent from Kinnote itself.`,
  makingPdf: 'Making the PDF…',
  pdfFile: (fileName: string, pages: number, kilobytes: number) => `${fileName} (${pages} page${pages === 1 ? '' : 's'}, ${kilobytes} KB)`,
  handed: (what: string) => `Handed ${what} to the app you chose.`,
  shareCancelled: 'Sharing cancelled: nothing was sent.',
  shareRefused: (why: string, what: string) => `The share sheet did not take the file (${why}); ${what} was downloaded instead.`,
  downloaded: (what: string) => `Downloaded ${what}.`,
  simplified: (letters: string) => ` The PDF's standard font cannot write some letters; they were simplified (${letters}): check the name on the file.`,
  pdfFailed: (why: string) => `Could not make the PDF: ${why}. Nothing was sent; "Print or save as PDF" still works.`,
  // Inside the report on screen
  weeksLabel: 'Share of planned sessions done, per week',
  noteLink: (n: number) => `source, note ${n}`,
  courseOf: (title: string, assessments: number) => `Course of ${title}: ${assessments} assessments`,
};

export type ReportMessages = typeof REPORT_MESSAGES;
