import {
  checkObservation,
  findMeasure,
  MEASURE_CATALOGUE,
  ordinalValue,
  tardieuValue,
  type Assessment,
  type Instrument,
  type Observation,
  type ObservationValue,
  type RomMode,
} from '$lib/domain';

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
  readonly version: 1;
  patientId: string;
  /** Local date-time as in <input type="datetime-local">, e.g. "2026-12-01T09:30". */
  performedAtLocal: string;
  setting: Assessment['setting'];
  position: NonNullable<Assessment['conditions']['position']> | '';
  minutesSinceMedication: string;
  painNrs: string;
  /** Rows; `carried` rows come from the visit protocol (site and side fixed so the series continue). */
  mas: Array<{ key: string; siteCode: string; side: 'left' | 'right'; grade: string | null; carried?: boolean }>;
  tardieu: Array<{ key: string; siteCode: string; side: 'left' | 'right'; r1Deg: string; r2Deg: string; quality: number | null; carried?: boolean }>;
  rom: Array<{
    key: string;
    carried?: boolean;
    siteCode: string;
    side: 'left' | 'right';
    mode: RomMode;
    instrument: Instrument;
    angleDeg: string;
  }>;
  pennFrequency: number | null;
  spasmSeverity: number | null;
  notes: string;
  /** Keys of rows marked "Not tested today": saved nowhere, and never an issue. */
  notTested?: string[];
  /**
   * Instrument readings carried from the last visit, to take today from within the visit (a pendulum
   * test by file or phone, a phone inclinometer reading): done when a reading of this visit matches.
   */
  instruments?: InstrumentRow[];
}

export function emptyDraft(patientId: string, performedAtLocal: string): AssessmentDraft {
  return {
    version: 1,
    patientId,
    performedAtLocal,
    setting: 'home',
    position: '',
    minutesSinceMedication: '',
    painNrs: '',
    mas: [],
    tardieu: [],
    rom: [],
    pennFrequency: null,
    spasmSeverity: null,
    notes: '',
    notTested: [],
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
  draft.mas.forEach((row, i) => {
    if (skipped.has(row.key)) return;
    if (row.grade === null) {
      blank(`mas.${i}.grade`);
      return;
    }
    let value: ObservationValue;
    try {
      value = ordinalValue('mas', row.grade);
    } catch (error) {
      // A grade off the scale can only come from a draft read back from storage: named, never thrown.
      issues.push({ field: `mas.${i}.grade`, message: error instanceof RangeError ? error.message : String(error) });
      return;
    }
    add(`mas.${i}`, { measureCode: 'mas', siteCode: row.siteCode, side: row.side, mode: null, instrument: null, value });
  });

  draft.tardieu.forEach((row, i) => {
    if (skipped.has(row.key)) return;
    const r1 = parseNumber(row.r1Deg);
    const r2 = parseNumber(row.r2Deg);
    if (r1 === null && r2 === null && row.quality === null) {
      blank(`tardieu.${i}.r1Deg`);
      return;
    }
    const missing: string[] = [];
    if (r1 === null) missing.push('r1Deg');
    if (r2 === null) missing.push('r2Deg');
    if (row.quality === null) missing.push('quality');
    for (const f of missing) issues.push({ field: `tardieu.${i}.${f}`, message: 'needed for a Tardieu entry' });
    if (missing.length > 0) return;
    if (Number.isNaN(r1) || Number.isNaN(r2)) {
      issues.push({ field: `tardieu.${i}.${Number.isNaN(r1) ? 'r1Deg' : 'r2Deg'}`, message: 'not a number' });
      return;
    }
    add(`tardieu.${i}`, {
      measureCode: 'tardieu',
      siteCode: row.siteCode,
      side: row.side,
      mode: null,
      instrument: null,
      value: tardieuValue(r1 as number, r2 as number, row.quality as number),
    });
  });

  draft.rom.forEach((row, i) => {
    if (skipped.has(row.key)) return;
    const angle = parseNumber(row.angleDeg);
    if (angle === null) {
      blank(`rom.${i}.angleDeg`);
      return;
    }
    if (Number.isNaN(angle)) {
      issues.push({ field: `rom.${i}.angleDeg`, message: 'not a number' });
      return;
    }
    add(`rom.${i}`, {
      measureCode: 'rom',
      siteCode: row.siteCode,
      side: row.side,
      mode: row.mode,
      instrument: row.instrument,
      value: { kind: 'angle', angleDeg: angle },
    });
  });

  const whole = (code: string, field: string, value: number | null) => {
    if (value === null) return;
    const v: ObservationValue = { kind: 'rating', value };
    add(field, { measureCode: code, siteCode: 'whole-body', side: 'none', mode: null, instrument: null, value: v });
  };
  whole('penn-spasm-frequency', 'pennFrequency', draft.pennFrequency);
  whole('spasm-severity', 'spasmSeverity', draft.spasmSeverity);

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

/** Sites offered per section, straight from the catalogue. */
export function catalogueSites(measureCode: string): ReadonlyArray<{ code: string; label: string }> {
  return MEASURE_CATALOGUE.find((m) => m.code === measureCode)?.sites ?? [];
}
