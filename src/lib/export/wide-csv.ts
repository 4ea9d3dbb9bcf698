import type { MeasureQuantity } from './measure-quantities';
import { csvRow, csvUnit } from './csv-cell';
import { dayColumnName, patientCells, patientHeader, type Cell } from './long-csv';
import { measureQuantities } from './measure-quantities';
import { disclosedDay, type DisclosurePlan } from './prepare-disclosure';
import type { Cohort } from './select-cohort';
import { groupKey, pairChange, type CohortSummary } from './summarise-cohort';
import { ChunkBuilder, DEFAULT_CHUNK_CHARS, type TextChunk } from './text-chunk';

/** The wide file's header row. */
export function wideCsvHeader(plan: DisclosurePlan): string[] {
  const day = dayColumnName(plan);
  return [
    ...patientHeader(plan),
    'measure',
    'site',
    'side',
    'mode',
    'quantity',
    'unit',
    'change_unit',
    'better_when',
    'event_kind',
    `event_${day}`,
    `baseline_${day}`,
    'baseline_value',
    'baseline_grade',
    `follow_up_${day}`,
    'follow_up_value',
    'follow_up_grade',
    'change',
    'same_assessor',
    'mdc',
    'mdc_source',
    'verdict',
  ];
}

const gradeLabel = (q: MeasureQuantity, rank: number): string | null => q.grades?.find((g) => g.rank === rank)?.label ?? null;

/**
 * The wide CSV: one row per pair (patient, measure, site, side, mode) and quantity, with baseline,
 * follow-up, change (follow-up − baseline; grade steps for ordinal quantities) and the verdict of
 * the stats engine's changeVerdict against the pair's own MDC (chooseMdc, as the summary counts it). Values of
 * ordinal quantities are ranks, with the grade label beside them. Streams in chunks. Cost O(pairs).
 */
export function* wideCsvChunks(cohort: Cohort, summary: CohortSummary, plan: DisclosurePlan, chunkChars = DEFAULT_CHUNK_CHARS): Generator<TextChunk> {
  const builder = new ChunkBuilder(chunkChars);
  const header = builder.add(csvRow(wideCsvHeader(plan)), 0);
  if (header) yield header;
  const cells: Cell[] = [];
  for (const pair of cohort.pairs) {
    const s = pair.series;
    const view = plan.patients.get(s.patient.id);
    if (!view) continue;
    const sameAssessor = s.assessments[pair.baselineIndex]?.assessorId === s.assessments[pair.followUpIndex]?.assessorId;
    for (const quantity of measureQuantities(s.measure)) {
      const group = summary.byKey.get(groupKey(pair, quantity));
      const mdc = group?.mdcByPair.get(pair) ?? null;
      const change = pairChange(pair, quantity, mdc);
      cells.length = 0;
      patientCells(plan, view, cells);
      cells.push(
        s.measure.code,
        s.siteCode,
        s.side,
        s.mode,
        quantity.key,
        csvUnit(quantity.unit),
        csvUnit(quantity.changeUnit),
        quantity.betterWhen,
        pair.event?.kind ?? null,
        pair.eventDay === null ? null : disclosedDay(plan, view, pair.eventDay),
        disclosedDay(plan, view, s.days[pair.baselineIndex] as number),
        change.baseline,
        gradeLabel(quantity, change.baseline),
        disclosedDay(plan, view, s.days[pair.followUpIndex] as number),
        change.followUp,
        gradeLabel(quantity, change.followUp),
        change.change,
        sameAssessor ? 'yes' : 'no',
        mdc?.value ?? null,
        mdc?.source ?? 'none',
        change.verdict,
      );
      const chunk = builder.add(csvRow(cells), 1);
      if (chunk) yield chunk;
    }
  }
  const rest = builder.flush();
  if (rest.text.length > 0) yield rest;
}

/** Rows of the wide file: one per pair and quantity. */
export function wideRowCount(cohort: Cohort): number {
  let rows = 0;
  for (const pair of cohort.pairs) rows += measureQuantities(pair.series.measure).length;
  return rows;
}
