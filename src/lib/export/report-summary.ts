import type { ReportMeasure, ReportVerdict } from './referral-report';
import { plural } from './report-value-text';

/** Step 3 of referralReport: how many measures got each verdict, and the one summary sentence. */
export function reportSummary(measures: readonly ReportMeasure[]): { tally: Record<ReportVerdict, number>; summaryText: string } {
  const tally: Record<ReportVerdict, number> = { improved: 0, 'no-change': 0, worsened: 0, 'no-mdc': 0, 'not-compared': 0 };
  for (const m of measures) tally[m.verdict]++;
  const compared = measures.length - tally['not-compared'];
  const summaryText =
    measures.length === 0
      ? 'No measure was assessed in this period.'
      : compared === 0
        ? `${plural(measures.length, 'measure was', 'measures were')} assessed, none twice, so no change can be judged.`
        : `Of ${plural(compared, 'measure', 'measures')} compared with baseline, ${tally.improved} improved and ${tally.worsened} got worse beyond measurement error; ${tally['no-change']} did not change beyond it` +
          (tally['no-mdc'] > 0 ? `; for ${tally['no-mdc']} no MDC is known, so the change is shown but not judged` : '') +
          '.';
  return { tally, summaryText };
}
