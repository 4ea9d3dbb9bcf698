// Cost of one patient's caseload summary (what every write settles) against the full analysis the
// summary ran before (outcomeSeries: every point judged, Theil–Sen and Mann–Kendall trends), on one
// long Modified Ashworth series with daily visits. Figures are printed, never asserted.
import type { Observation } from '../../src/lib/domain';
import { caseloadSummary, outcomeSeries } from '../../src/lib/stats';
import { formatMs, medianOfSorted, timeRuns } from './timing';

function series(n: number): Observation[] {
  const grades = ['0', '1', '1+', '2', '3', '4'];
  return Array.from({ length: n }, (_, i) => {
    const takenAt = new Date(Date.UTC(2020, 0, 1) + i * 86_400_000).toISOString();
    const rank = (i * 7) % 6;
    return {
      id: `0190a000-0000-7000-8000-${String(i).padStart(12, '0')}`, createdAt: takenAt, updatedAt: takenAt, deviceId: 'd', clinicianId: 'c', deleted: false,
      patientId: 'p', assessmentId: `a${i}`, takenAt, measureCode: 'mas', siteCode: 'elbow-flexors', side: 'left', mode: null, instrument: null,
      value: { kind: 'ordinal', grade: grades[rank]!, rank }, traceId: null,
    };
  });
}

export async function run(print: (line: string) => void): Promise<void> {
  for (const n of [100, 1_000, 5_000]) {
    const observations = series(n);
    const runs = n >= 5_000 ? 3 : 10;
    const full = medianOfSorted(timeRuns(() => outcomeSeries(observations, { baselineRule: { kind: 'first' }, localMdc: [] }), runs, 1));
    const now = medianOfSorted(timeRuns(() => caseloadSummary([], observations, []), runs, 1));
    print(`one patient's caseload summary, ${n.toLocaleString('en')} observations in one series: ${formatMs(now)} (previous: the full outcomeSeries, ${formatMs(full)}) · ${(full / now).toFixed(0)}× previous`);
  }
}
