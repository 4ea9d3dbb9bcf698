import type { ExerciseTick } from './home-log';

/** What a report from the patient's phone says, counted the way a therapist reads it. */
export interface ReportSummary {
  /** Calendar day the report was made (UTC date of exportedAt). */
  readonly madeOn: string;
  /** Days with at least one exercise done or partly done. */
  readonly daysTicked: number;
  /** Self-reports (days) with a spasm frequency or severity rating. */
  readonly spasmRatings: number;
  readonly skipped: number;
  /** First and last day with a tick or rating, or null when the report holds neither. */
  readonly from: string | null;
  readonly to: string | null;
}

/**
 * Counts a report in the therapist's terms instead of records: days on which something was done
 * (a day with several exercises counts once), days with a spasm rating, skipped sessions. Tombstoned
 * self-reports are not counted.
 */
export function summariseReport(report: {
  readonly exportedAt: string;
  readonly ticks: readonly Pick<ExerciseTick, 'day' | 'status'>[];
  readonly selfReports: readonly { readonly reportedOn: string; readonly deleted: boolean; readonly spasmFrequencyPenn: number | null; readonly spasmSeverityNrs: number | null }[];
}): ReportSummary {
  const days = new Set<string>();
  let skipped = 0;
  const all: string[] = [];
  for (const t of report.ticks) {
    all.push(t.day);
    if (t.status === 'skipped') skipped++;
    else days.add(t.day);
  }
  let spasmRatings = 0;
  for (const s of report.selfReports) {
    if (s.deleted || (s.spasmFrequencyPenn === null && s.spasmSeverityNrs === null)) continue;
    spasmRatings++;
    all.push(s.reportedOn);
  }
  all.sort();
  return { madeOn: report.exportedAt.slice(0, 10), daysTicked: days.size, spasmRatings, skipped, from: all[0] ?? null, to: all.at(-1) ?? null };
}
