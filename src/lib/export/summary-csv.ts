import { csvRow, csvUnit } from './csv-cell';
import type { CohortSummary } from './summarise-cohort';
import type { TextChunk } from './text-chunk';

/** The summary file's header row. */
export const SUMMARY_CSV_HEADER = [
  'measure',
  'measure_label',
  'site',
  'mode',
  'quantity',
  'unit',
  'change_unit',
  'better_when',
  'pairs',
  'patients',
  'n',
  'median_change',
  'q1_change',
  'q3_change',
  'iqr_change',
  'mdc',
  'mdc_source',
  'mdc_citation',
  'mdc_note',
  'improved_beyond_mdc',
  'proportion_improved',
  'wilson95_low',
  'wilson95_high',
  'wilcoxon_n',
  'wilcoxon_zeros_dropped',
  'wilcoxon_statistic',
  'wilcoxon_p',
  'wilcoxon_method',
  'srm',
] as const;

/**
 * The summary CSV: one row per measure, site, mode and quantity, with the cohort statistics of
 * summariseCohort and the MDC's source ('local', 'reference' or 'none') and citation. Undefined
 * statistics (NaN, e.g. SRM with one pair) are empty cells. One chunk (a row per group).
 */
export function* summaryCsvChunks(summary: CohortSummary): Generator<TextChunk> {
  let text = csvRow(SUMMARY_CSV_HEADER);
  for (const g of summary.groups) {
    const s = g.summary;
    const improved = s.improvedBeyondMdc;
    text += csvRow([
      g.measureCode,
      g.measureLabel,
      g.siteCode,
      g.mode,
      g.quantity.key,
      csvUnit(g.quantity.unit),
      g.quantity.changeUnit,
      g.quantity.betterWhen,
      g.pairs,
      g.patients,
      s.n,
      s.medianChange,
      s.quartiles[0],
      s.quartiles[1],
      s.iqr,
      g.mdc?.value ?? null,
      g.mdc?.source ?? 'none',
      g.mdc?.citation ?? null,
      g.mdcNote,
      improved?.count ?? null,
      improved?.proportion ?? null,
      improved?.wilson95[0] ?? null,
      improved?.wilson95[1] ?? null,
      s.wilcoxon.n,
      s.wilcoxon.zerosDropped,
      s.wilcoxon.statistic,
      s.wilcoxon.p,
      s.wilcoxon.method,
      s.standardisedResponseMean,
    ]);
  }
  yield { text, rows: summary.groups.length };
}
