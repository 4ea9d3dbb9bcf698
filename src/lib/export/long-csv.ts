import type { Observation } from '../domain';
import { csvRow, csvUnit } from './csv-cell';
import { disclosedDay, type DisclosurePlan, type PatientView } from './prepare-disclosure';
import { compileFilters, isExportedObservation, type Cohort } from './select-cohort';
import { ChunkBuilder, DEFAULT_CHUNK_CHARS, type TextChunk } from './text-chunk';

/** A CSV cell before formatting (null = empty). */
export type Cell = string | number | null;

/** The date column's name in each date mode: the column says what the number or date means. */
export function dayColumnName(plan: DisclosurePlan): string {
  return plan.dateMode === 'days-from-baseline' ? 'day_from_baseline' : plan.dateMode === 'shifted' ? 'shifted_date' : 'date';
}

/** Patient columns: label, birth band (or year), condition; identified adds name and date of birth. */
export function patientHeader(plan: DisclosurePlan): string[] {
  const head = [plan.kind === 'identified' ? 'patient_code' : 'patient', plan.kind === 'identified' ? 'birth_year' : 'birth_years', 'condition'];
  if (plan.kind === 'identified') head.push('family_name', 'given_name', 'date_of_birth');
  return head;
}

export function patientCells(plan: DisclosurePlan, view: PatientView, out: Cell[]): void {
  out.push(view.label, view.birthYears, view.condition);
  if (plan.kind === 'identified') out.push(view.identity?.familyName ?? null, view.identity?.givenName ?? null, view.identity?.dateOfBirth ?? null);
}

/** The long file's header row (without the line end). */
export function longCsvHeader(plan: DisclosurePlan): string[] {
  const day = dayColumnName(plan);
  return [
    ...patientHeader(plan),
    day,
    ...(plan.kind === 'identified' ? ['taken_at'] : []),
    'event_kind',
    `event_${day}`,
    'role',
    'setting',
    'assessor',
    'measure',
    'site',
    'side',
    'mode',
    'instrument',
    'unit',
    'value',
    'grade',
    'grade_rank',
    'r1_deg',
    'r2_deg',
    'quality',
    'spasticity_angle_deg',
  ];
}

/** Appends the value columns (value, grade, grade_rank, r1_deg, r2_deg, quality, spasticity_angle_deg). */
function valueCells(value: Observation['value'], out: Cell[]): void {
  switch (value.kind) {
    case 'ordinal':
      out.push(null, value.grade, value.rank, null, null, null, null);
      return;
    case 'tardieu':
      out.push(null, null, null, value.r1Deg, value.r2Deg, value.quality, value.spasticityAngleDeg);
      return;
    case 'angle':
      out.push(value.angleDeg, null, null, null, null, null, null);
      return;
    default:
      out.push(value.value, null, null, null, null, null, null);
  }
}

/**
 * The long CSV (RFC 4180 via csvRow, CRLF, formula-like text neutralised): a header, then one row
 * per exported observation of the cohort (see Cohort.observationCount) in series order, with the
 * role 'baseline' or 'follow-up' where it is one. De-identified rows carry the pseudonym, birth
 * band, condition and disclosed day only; no free text, ids or identities. Streams: yields chunks
 * of about `chunkChars` characters and holds one row at a time. Cost O(rows).
 */
export function* longCsvChunks(cohort: Cohort, plan: DisclosurePlan, chunkChars = DEFAULT_CHUNK_CHARS): Generator<TextChunk> {
  const compiled = compileFilters(cohort.filters);
  const builder = new ChunkBuilder(chunkChars);
  const header = builder.add(csvRow(longCsvHeader(plan)), 0);
  if (header) yield header;
  const identified = plan.kind === 'identified';
  const cells: Cell[] = [];
  for (const pair of cohort.pairs) {
    const s = pair.series;
    const view = plan.patients.get(s.patient.id);
    if (!view) continue;
    const eventDay = pair.eventDay === null ? null : disclosedDay(plan, view, pair.eventDay);
    for (let i = pair.baselineIndex; i <= pair.lastIndex; i++) {
      if (!isExportedObservation(pair, i, compiled)) continue;
      const o = s.observations[i] as Observation;
      const a = s.assessments[i];
      cells.length = 0;
      patientCells(plan, view, cells);
      cells.push(disclosedDay(plan, view, s.days[i] as number));
      if (identified) cells.push(o.takenAt);
      cells.push(
        pair.event?.kind ?? null,
        eventDay,
        i === pair.baselineIndex ? 'baseline' : i === pair.followUpIndex ? 'follow-up' : null,
        a?.setting ?? null,
        a ? plan.clinicianLabel(a.assessorId) : null,
        o.measureCode,
        o.siteCode,
        o.side,
        o.mode,
        o.instrument,
        csvUnit(s.measure.unit),
      );
      valueCells(o.value, cells);
      const chunk = builder.add(csvRow(cells), 1);
      if (chunk) yield chunk;
    }
  }
  const rest = builder.flush();
  if (rest.text.length > 0) yield rest;
}
