import * as v from 'valibot';
import { AdherenceEntrySchema, DeviceSchema, IdSchema, IsoDateTimeSchema, SelfReportSchema, type AdherenceEntry, type Device, type SelfReport } from '../domain';
import { canonicalJson } from '../store';
import { ExerciseTickSchema, type ExerciseTick } from './home-log';
import { ProgrammeTransferError } from './programme-transfer-error';
import { openTransfer, sealTransfer, type SealOptions } from './sealed-transfer';

export const HOME_REPORT_FORMAT = 'kinnote-home-report' as const;
export const HOME_REPORT_VERSION = 1;

/**
 * What the patient's phone sends back: the phone (a Device record), weekly adherence entries,
 * self-reports, and the ticks behind the adherence (for the therapist to read skip reasons).
 * Everything is of one patient; records keep the ids they got on the phone, so importing merges
 * by id and a second import of the same report changes nothing.
 */
const ReportSchema = v.strictObject({
  format: v.literal(HOME_REPORT_FORMAT),
  formatVersion: v.literal(HOME_REPORT_VERSION),
  exportedAt: IsoDateTimeSchema,
  patient: v.strictObject({ id: IdSchema, code: v.pipe(v.string(), v.regex(/^[2-9A-HJKMNP-TV-Z]{4}-[2-9A-HJKMNP-TV-Z]{4}$/)) }),
  device: DeviceSchema,
  adherenceEntries: v.array(AdherenceEntrySchema),
  selfReports: v.array(SelfReportSchema),
  ticks: v.array(ExerciseTickSchema),
});

export interface HomeReport {
  readonly format: typeof HOME_REPORT_FORMAT;
  readonly formatVersion: number;
  readonly exportedAt: string;
  readonly patient: { readonly id: string; readonly code: string };
  readonly device: Device;
  readonly adherenceEntries: readonly AdherenceEntry[];
  readonly selfReports: readonly SelfReport[];
  readonly ticks: readonly ExerciseTick[];
}

/** Encrypts a report under `code` (checked first: one patient throughout). Throws ProgrammeTransferError Invalid or ForeignPatient. */
export async function createHomeReport(report: Omit<HomeReport, 'format' | 'formatVersion'>, code: string, options: SealOptions): Promise<string> {
  const body: HomeReport = { format: HOME_REPORT_FORMAT, formatVersion: HOME_REPORT_VERSION, ...report };
  checkReport(body);
  return sealTransfer(canonicalJson(body), code, options);
}

/**
 * Decrypts and checks a report for the patient `expected` (the page it is imported on). Throws
 * ProgrammeTransferError: ForeignPatient when the report is another patient's (or mixes
 * patients), WrongCode, Tampered, NotThisKind, Unsupported, Invalid. Writes nothing.
 */
export async function openHomeReport(text: string, code: string, expected: { id: string; code: string }): Promise<HomeReport> {
  const report = checkReport(await openTransfer(text, code, 'report'));
  if (report.patient.id !== expected.id) {
    throw new ProgrammeTransferError('ForeignPatient', `This report is from the phone of ${report.patient.code}, not ${expected.code}. It was refused; nothing was imported.`);
  }
  return report;
}

function checkReport(parsed: unknown): HomeReport {
  const format = (parsed as { format?: unknown } | null)?.format;
  if (format !== HOME_REPORT_FORMAT) {
    throw new ProgrammeTransferError('NotThisKind', format === 'kinnote-home-programme' ? 'This is a programme file, not a report from the patient\'s phone.' : 'This is not a Kinnote report from a patient\'s phone.');
  }
  const version = (parsed as { formatVersion?: unknown }).formatVersion;
  if (version !== HOME_REPORT_VERSION) {
    throw new ProgrammeTransferError('Unsupported', `This report is version ${JSON.stringify(version)}; this app reads version ${HOME_REPORT_VERSION}. Update the app.`);
  }
  const result = v.safeParse(ReportSchema, parsed);
  if (!result.success) {
    const issue = result.issues[0];
    throw new ProgrammeTransferError('Invalid', `This report breaks its format at ${v.getDotPath(issue) ?? 'the top'}: ${issue.message}. Nothing was imported.`);
  }
  const report = result.output as HomeReport;
  const id = report.patient.id;
  const foreign = report.adherenceEntries.some((e) => e.patientId !== id) || report.selfReports.some((s) => s.patientId !== id);
  if (foreign) {
    throw new ProgrammeTransferError('ForeignPatient', `This report mixes records of another person with those of ${report.patient.code}. It was refused whole; nothing was imported.`);
  }
  const programmeIds = new Set(report.adherenceEntries.map((e) => e.programmeId));
  if (report.ticks.some((t) => !programmeIds.has(t.programmeId))) {
    throw new ProgrammeTransferError('Invalid', 'This report has ticks of a programme it has no adherence for. Nothing was imported.');
  }
  return report;
}
