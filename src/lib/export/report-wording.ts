import { dateWriter } from '../domain';
import type { ReferralReport, ReportIntervention } from './referral-report';

/**
 * The fixed words and the composed lines of the referral report, in one place for both of its forms:
 * the page (src/routes/patients/[id]/report) and the PDF (referral-report-pdf.ts). The figures and
 * verdicts come from referralReport; this module only says them.
 */

/** A run of text, bold when `strong` (the page renders <strong>, the PDF the bold face). */
export interface TextPart {
  readonly text: string;
  readonly strong?: boolean;
}

export const REPORT_TITLE = 'Outcome report';

export const REPORT_HEADINGS = {
  interventions: 'Interventions',
  measures: 'Measures',
  adherence: 'Home programme',
  visits: 'Assessments in this period',
  notes: 'Where each MDC comes from',
  cautions: 'Cautions',
} as const;

export const REPORT_COLUMNS = { measure: 'Measure', baseline: 'Baseline', latest: 'Latest', change: 'Change', mdc: 'MDC', course: 'Course' } as const;

export const REPORT_CHART_LEGEND = 'Chart: hollow dot = baseline; shaded band = baseline ± MDC (change inside it may be measurement error); dashed line = intervention.';

export const NO_INTERVENTIONS_TEXT = 'None recorded in this period.';
export const NO_VISITS_TEXT = 'None.';

/** Formats calendar days (YYYY-MM-DD) for the report, e.g. "3 Dec 2026": the app's one day format (domain/date-writer.ts). */
export function reportDayFormatter(locale?: string): (day: string) => string {
  return dateWriter(locale === undefined ? {} : { locale }).day;
}

/** Formats the Monday of an adherence week without its year, e.g. "27 Apr" (domain/date-writer.ts). */
export function reportWeekFormatter(locale?: string): (weekStart: string) => string {
  return dateWriter(locale === undefined ? {} : { locale }).dayInYear;
}

/** "Patient K7QM-3XHD", and " · Name, born 3 Dec 1961" only when the report carries the identity. */
export function reportWhoParts(r: ReferralReport, day: (d: string) => string): TextPart[] {
  const parts: TextPart[] = [{ text: 'Patient ' }, { text: r.patientCode, strong: true }];
  if (r.identity) {
    parts.push({ text: ' · ' }, { text: r.identity.name, strong: true });
    if (r.identity.dateOfBirth) parts.push({ text: `, born ${day(r.identity.dateOfBirth)}` });
  }
  return parts;
}

/** "Prepared 3 Dec 2026" and, when known, "by Ada Fenwick (physiotherapist)". */
export function reportPreparedLines(r: ReferralReport, day: (d: string) => string): string[] {
  return r.preparedBy ? [`Prepared ${day(r.preparedOn)}`, `by ${r.preparedBy}`] : [`Prepared ${day(r.preparedOn)}`];
}

/** What is compared with what, with the event and days in bold. */
export function reportScopeParts(r: ReferralReport, day: (d: string) => string): TextPart[] {
  if (r.anchor) {
    return [
      { text: 'Change since the ' },
      { text: r.anchor.label.toLowerCase(), strong: true },
      { text: ' on ' },
      { text: day(r.anchor.day), strong: true },
      { text: `, through ${day(r.throughDay)}: each measure's last assessment before that day against its latest.` },
    ];
  }
  return [
    { text: 'Change from ' },
    { text: day(r.fromDay), strong: true },
    { text: ' to ' },
    { text: day(r.throughDay), strong: true },
    { text: ": each measure's first assessment in the period against its latest." },
  ];
}

/** An intervention after its day: "Botulinum toxin injection (left) · biceps · 200 units · ultrasound guided". */
export function interventionDetails(i: ReportIntervention): string {
  return `${i.label}${i.side ? ` (${i.side})` : ''}${i.muscles ? ` · ${i.muscles}` : ''}${i.dose ? ` · ${i.dose}` : ''}${i.summary ? ` · ${i.summary}` : ''}`;
}

export function notRemeasuredText(r: ReferralReport): string | null {
  return r.notRemeasured.length > 0 ? `Not assessed again since the baseline: ${r.notRemeasured.join('; ')}.` : null;
}

/** A week's share of planned sessions done, "80 %", or "–" when nothing was planned. */
export function weekShareText(share: number): string {
  return Number.isNaN(share) ? '–' : `${Math.round(share * 100)} %`;
}

/** The visits of the period, "3 Mar 2026 · 30 Mar 2026 (home)", and who assessed; null lines when none. */
export function reportVisitLines(r: ReferralReport, day: (d: string) => string): { visits: string; assessors: string } | null {
  if (r.visits.length === 0) return null;
  return {
    visits: r.visits.map((v) => (v.setting === 'clinic' ? day(v.day) : `${day(v.day)} (${v.setting})`)).join(' · '),
    assessors: `Assessed by ${r.assessors.join(', ')}.`,
  };
}

export function reportFooterText(r: ReferralReport, day: (d: string) => string): string {
  return `Kinnote outcome report · ${r.patientCode} · ${day(r.fromDay)} to ${day(r.throughDay)}`;
}

/** The file name of the report's PDF: code and day, never the name ("kinnote-report-K7QM-3XHD-2026-04-30.pdf"). */
export function reportPdfFileName(r: ReferralReport): string {
  return `${r.fileName}.pdf`;
}
