// `npm run bench -- report-pdf`: the referral report's PDF for each invented demo patient (seed
// 20261201), made in Node with the same module the page loads on a tap. Prints the time to make one
// PDF (median and slowest of several rounds, after a warm-up), its size and its pages. Figures are
// printed, never asserted. In the browser the first tap also fetches and compiles the module (from
// the offline cache): the gzip size of that chunk is printed by the build, see DEVELOPERS.md.
import { performance } from 'node:perf_hooks';
import { referralReportPdf } from '../../src/lib/export/referral-report-pdf';
import { demoReports } from '../unit/export/demo-reports';
import { formatMs } from './timing';

const ROUNDS = 5;

export async function run(print: (line: string) => void): Promise<void> {
  const reports = demoReports(false);
  const createdAtMs = Date.UTC(2026, 11, 1);
  // Warm-up: the first PDF also decompresses pdf-lib's font metrics.
  const coldStart = performance.now();
  await referralReportPdf(reports[0]!.report, { locale: 'en-GB', createdAtMs });
  print(`first PDF in a fresh process (font metrics unpacked): ${formatMs(performance.now() - coldStart)}`);
  print('| patient | measures | pages | bytes | median | slowest |');
  print('|---|---|---|---|---|---|');
  for (const { report } of reports) {
    const times: number[] = [];
    let pages = 0;
    let bytes = 0;
    for (let round = 0; round < ROUNDS; round++) {
      const start = performance.now();
      const pdf = await referralReportPdf(report, { locale: 'en-GB', createdAtMs });
      times.push(performance.now() - start);
      pages = pdf.pageCount;
      bytes = pdf.bytes.length;
    }
    times.sort((a, b) => a - b);
    print(`| ${report.patientCode} | ${report.measures.length} | ${pages} | ${bytes} | ${formatMs(times[ROUNDS >> 1]!)} | ${formatMs(times[ROUNDS - 1]!)} |`);
  }
}
