import { REPORT_TITLE, type ReferralReport } from '$lib/export';
import { shareOrDownloadFile, type ShareOutcome } from '$lib/ui';

export interface SharedReport {
  readonly outcome: ShareOutcome;
  readonly fileName: string;
  readonly pageCount: number;
  readonly sizeBytes: number;
  /** Letters the PDF's standard font could not write, as "Ł→L". */
  readonly simplified: readonly string[];
}

/**
 * Makes the report's PDF on the device and hands it to the share sheet, else downloads it. The PDF
 * module (and pdf-lib with it) is fetched only here, on the tap: never in the page's first load; the
 * service worker precaches it, so this works offline. Throws when the PDF cannot be made.
 */
export async function shareReportPdf(report: ReferralReport): Promise<SharedReport> {
  const { referralReportPdf } = await import('$lib/export/referral-report-pdf');
  // locale undefined: the browser's, as the page's own dates.
  const pdf = await referralReportPdf(report, { createdAtMs: Date.now() });
  const file = new File([pdf.bytes as Uint8Array<ArrayBuffer>], pdf.fileName, { type: 'application/pdf' });
  const outcome = await shareOrDownloadFile(file, `${REPORT_TITLE} ${report.patientCode}`);
  return { outcome, fileName: pdf.fileName, pageCount: pdf.pageCount, sizeBytes: pdf.bytes.length, simplified: pdf.simplified };
}
