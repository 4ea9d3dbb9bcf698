import { BUNDLE_FORMAT, BUNDLE_FORMAT_VERSION, LATEST_SCHEMA_VERSION, createBundle, importBackup, type KinnoteStore, type MergeReport } from '../store';
import { openHomeReport, type HomeReport } from './home-report';

/** What an import of a patient's report did. */
export interface HomeReportImport {
  readonly report: HomeReport;
  readonly merge: MergeReport;
  /** Adherence entries and self-reports newly added or replaced by newer copies. */
  readonly added: number;
  readonly replaced: number;
}

/**
 * Imports a patient's encrypted report on the therapist's device for `patient`: decrypts and
 * checks it (refusing another patient's, a tampered one, a wrong code: ProgrammeTransferError,
 * nothing written), then merges its records by id through the store's ordinary import (validated,
 * audited, all in one transaction). Importing the same report again changes nothing.
 */
export async function importHomeReport(store: KinnoteStore, text: string, code: string, patient: { id: string; code: string }): Promise<HomeReportImport> {
  const report = await openHomeReport(text, code, patient);
  const bundle = await createBundle(
    { devices: [report.device], adherenceEntries: [...report.adherenceEntries], selfReports: [...report.selfReports] },
    {
      format: BUNDLE_FORMAT,
      formatVersion: BUNDLE_FORMAT_VERSION,
      schemaVersion: LATEST_SCHEMA_VERSION,
      exportedAt: report.exportedAt,
      exportedBy: { deviceId: report.device.id, clinicianId: report.device.clinicianId },
      source: `home report from the phone of ${report.patient.code}`,
      scope: { kind: 'patient', patientId: patient.id },
      protectedContent: 'omitted',
    },
  );
  const merge = await importBackup(store, bundle);
  const added = merge.counts.adherenceEntries.inserted + merge.counts.selfReports.inserted;
  const replaced = merge.counts.adherenceEntries.replaced + merge.counts.selfReports.replaced;
  return { report, merge, added, replaced };
}
