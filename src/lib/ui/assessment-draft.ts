import { checkObservation, findMeasure, ordinalValue, tardieuValue, type Assessment, type Observation, type ObservationValue, type RomMode } from '$lib/domain';
import { FORM_MEASURES, RATING_MEASURES, ROW_MEASURES, type FormRow } from './visit-form-layout';

/**
 * What the assessment form holds while the therapist types: plain strings for number fields so that
 * a half-typed value survives a reload. Kept as a draft on every change (see draft-keeper.ts).
 */
/** An instrument reading to take today: the pendulum test of one knee, or an inclinometer ROM reading. */
export interface InstrumentRow {
  key: string;
  kind: 'pendulum' | 'inclinometer';
  siteCode: string;
  side: 'left' | 'right';
  mode: RomMode | null;
}

export interface AssessmentDraft {
  /** 2: rows and ratings per measure code (1 held mas, tardieu, rom, pennFrequency, spasmSeverity: see upgradeDraft). */
  readonly version: 2;
  patientId: string;
  /** Local date-time as in <input type="datetime-local">, e.g. "2026-12-01T09:30". */
  performedAtLocal: string;
  setting: Assessment['setting'];
  position: NonNullable<Assessment['conditions']['position']> | '';
  minutesSinceMedication: string;
  painNrs: string;
  /**
   * The rows of each measure the form lays out as rows (visit-form-layout.ts), by measure code, in
   * the shape of its catalogue entry; `carried` rows come from the visit protocol.
   */
  rows: Record<string, FormRow[]>;
  /** Whole-person ratings by measure code: null until recorded. */
  ratings: Record<string, number | null>;
  notes: string;
  /** Keys of rows marked "Not tested today": saved nowhere, and never an issue. */
  notTested?: string[];
  /**
   * Instrument readings carried from the last visit, to take today from within the visit (a pendulum
   * test by file or phone, a phone inclinometer reading): done when a reading of this visit matches.
   */
  instruments?: InstrumentRow[];
}

/** Every form measure's list of rows and rating, empty (rows and ratings already held are kept). */
function withEveryMeasure(rows: Record<string, FormRow[]>, ratings: Record<string, number | null>): Pick<AssessmentDraft, 'rows' | 'ratings'> {
  return {
    rows: Object.fromEntries(ROW_MEASURES.map((m) => [m.code, rows[m.code] ?? []])),
    ratings: Object.fromEntries(RATING_MEASURES.map((m) => [m.code, ratings[m.code] ?? null])),
  };
}

export function emptyDraft(patientId: string, performedAtLocal: string): AssessmentDraft {
  return {
    version: 2,
    patientId,
    performedAtLocal,
    setting: 'home',
    position: '',
    minutesSinceMedication: '',
    painNrs: '',
    ...withEveryMeasure({}, {}),
    notes: '',
    notTested: [],
  };
}

/** Every row of the form, in form order. */
export function allRows(draft: AssessmentDraft): FormRow[] {
  return ROW_MEASURES.flatMap((m) => draft.rows[m.code] ?? []);
}

/**
 * A draft as kept on this device, in today's shape, or null when it is not a visit draft: version 1
 * (the form's measures as fields of their own) becomes version 2; a measure the catalogue has gained
 * since gets its empty rows or rating.
 */
export function upgradeDraft(stored: unknown): Omit<AssessmentDraft, 'notes'> | null {
  if (typeof stored !== 'object' || stored === null) return null;
  const d = stored as Record<string, unknown> & Partial<AssessmentDraft>;
  if (d.version === 2) return { ...d, ...withEveryMeasure(d.rows ?? {}, d.ratings ?? {}) } as AssessmentDraft;
  if (d.version !== 1) return null;
  const { mas, tardieu, rom, pennFrequency, spasmSeverity, ...rest } = d as Record<string, unknown>;
  const list = (x: unknown) => (Array.isArray(x) ? (x as FormRow[]) : []);
  const rating = (x: unknown) => (typeof x === 'number' ? x : null);
  return {
    ...(rest as Omit<AssessmentDraft, 'notes' | 'rows' | 'ratings' | 'version'>),
    version: 2,
    ...withEveryMeasure({ mas: list(mas), tardieu: list(tardieu), rom: list(rom) }, { 'penn-spasm-frequency': rating(pennFrequency), 'spasm-severity': rating(spasmSeverity) }),
  };
}

/** A problem with one field of the form, named so the page can show it beside the field. */
export interface DraftIssue {
  /** e.g. "rom.2.angleDeg", "mas.0.grade", "painNrs". */
  readonly field: string;
  readonly message: string;
}

export type ObservationDraft = Pick<Observation, 'measureCode' | 'siteCode' | 'side' | 'mode' | 'instrument' | 'value'>;

function parseNumber(text: string): number | null {
  const trimmed = text.trim().replace(',', '.');
  if (trimmed === '') return null;
  const n = Number(trimmed);
  return Number.isFinite(n) ? n : Number.NaN;
}

function siteLabel(measureCode: string, siteCode: string): string {
  return findMeasure(measureCode)?.sites.find((s) => s.code === siteCode)?.label ?? siteCode;
}

/**
 * Turns the form into observations, checking each against the measure catalogue (ranges and
 * physiological limits). Every row needs a value or an explicit "Not tested today" (a blank row is
 * an issue, so that a test is never dropped from the visit unnoticed); a half-filled row is an issue.
 */
export function draftObservations(draft: AssessmentDraft): { observations: ObservationDraft[]; issues: DraftIssue[] } {
  const observations: ObservationDraft[] = [];
  const issues: DraftIssue[] = [];
  const seen = new Set<string>();
  const add = (field: string, obs: ObservationDraft) => {
    const key = `${obs.measureCode}|${obs.siteCode}|${obs.side}|${obs.mode ?? ''}`;
    if (seen.has(key)) {
      issues.push({ field, message: `${siteLabel(obs.measureCode, obs.siteCode)} (${obs.side}) is entered twice` });
      return;
    }
    seen.add(key);
    const problems = checkObservation({
      ...obs,
      id: '',
      patientId: draft.patientId,
      assessmentId: '',
      takenAt: '',
      traceId: null,
      createdAt: '',
      updatedAt: '',
      deviceId: '',
      clinicianId: '',
      deleted: false,
    } as Observation);
    if (problems.length > 0) {
      for (const p of problems) issues.push({ field: `${field}.${p.path.replace(/^value\./, '')}`, message: p.message });
      return;
    }
    observations.push(obs);
  };

  const skipped = new Set(draft.notTested ?? []);
  const blank = (field: string) => issues.push({ field, message: 'no value yet: record one, or tap "Not tested today"' });
  for (const measure of FORM_MEASURES) {
    const code = measure.code;
    if (measure.form.shape === 'rating') {
      const value = draft.ratings[code] ?? null;
      const siteCode = measure.sites[0]?.code ?? '';
      if (value !== null) add(code, { measureCode: code, siteCode, side: 'none', mode: null, instrument: null, value: { kind: 'rating', value } });
      continue;
    }
    (draft.rows[code] ?? []).forEach((row, i) => {
      if (skipped.has(row.key)) return;
      const value = rowValue(code, `${code}.${i}`, row, blank, (field, message) => issues.push({ field, message }));
      if (!value) return;
      const { mode, instrument } = 'angleDeg' in row ? row : { mode: null, instrument: null };
      add(`${code}.${i}`, { measureCode: code, siteCode: row.siteCode, side: row.side, mode, instrument, value });
    });
  }

  const pain = parseNumber(draft.painNrs);
  if (pain !== null && !(Number.isInteger(pain) && pain >= 0 && pain <= 10)) {
    issues.push({ field: 'painNrs', message: 'pain is a whole number from 0 to 10' });
  }
  const minutes = parseNumber(draft.minutesSinceMedication);
  if (minutes !== null && !(Number.isInteger(minutes) && minutes >= 0 && minutes <= 60 * 24 * 7)) {
    issues.push({ field: 'minutesSinceMedication', message: 'minutes since medication: a whole number up to one week' });
  }
  if (Number.isNaN(Date.parse(draft.performedAtLocal))) issues.push({ field: 'performedAtLocal', message: 'date and time needed' });
  return { observations, issues };
}

/** The assessment's conditions from the form (call after draftObservations found no issues). */
export function draftConditions(draft: AssessmentDraft): Assessment['conditions'] {
  const pain = parseNumber(draft.painNrs);
  const minutes = parseNumber(draft.minutesSinceMedication);
  return {
    position: draft.position === '' ? null : draft.position,
    minutesSinceMedication: minutes === null || Number.isNaN(minutes) ? null : minutes,
    painNrs: pain === null || Number.isNaN(pain) ? null : pain,
  };
}

/**
 * A row's value by its shape, or null with the issue named: blank (no value yet), half filled (each
 * missing part), not a number, a grade off the scale. The catalogue's limits are checked after (add).
 */
function rowValue(code: string, field: string, row: FormRow, blank: (field: string) => void, issue: (field: string, message: string) => void): ObservationValue | null {
  if ('grade' in row) {
    if (row.grade === null) {
      blank(`${field}.grade`);
      return null;
    }
    try {
      return ordinalValue(code, row.grade);
    } catch (error) {
      // A grade off the scale can only come from a draft read back from storage: named, never thrown.
      issue(`${field}.grade`, error instanceof RangeError ? error.message : String(error));
      return null;
    }
  }
  if ('r1Deg' in row) {
    const r1 = parseNumber(row.r1Deg);
    const r2 = parseNumber(row.r2Deg);
    if (r1 === null && r2 === null && row.quality === null) {
      blank(`${field}.r1Deg`);
      return null;
    }
    const missing: string[] = [];
    if (r1 === null) missing.push('r1Deg');
    if (r2 === null) missing.push('r2Deg');
    if (row.quality === null) missing.push('quality');
    for (const f of missing) issue(`${field}.${f}`, 'needed for a Tardieu entry');
    if (missing.length > 0) return null;
    if (Number.isNaN(r1) || Number.isNaN(r2)) {
      issue(`${field}.${Number.isNaN(r1) ? 'r1Deg' : 'r2Deg'}`, 'not a number');
      return null;
    }
    return tardieuValue(r1 as number, r2 as number, row.quality as number);
  }
  const angle = parseNumber(row.angleDeg);
  if (angle === null) {
    blank(`${field}.angleDeg`);
    return null;
  }
  if (Number.isNaN(angle)) {
    issue(`${field}.angleDeg`, 'not a number');
    return null;
  }
  return { kind: 'angle', angleDeg: angle };
}

