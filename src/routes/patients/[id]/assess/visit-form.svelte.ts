import { tick } from 'svelte';
import { findMeasure, findSite, type Observation } from '$lib/domain';
import { seriesKey } from '$lib/stats';
import { VISIT_MESSAGES as M, draftObservations, newRow, rowMeasure, type FormRow, type RowMeasure, emptyDraft, type AssessmentDraft, type DraftIssue, repeatedReadings, type UnreadableReading, type VisitReading, missingReadings } from '$lib/ui';
import { lastTimeText, localNow } from './visit-words';


/**
 * The visit form's state, shared by its sections: the values typed, the instrument readings taken in
 * this visit, what is wrong with them, and last time's value of each test.
 */
export class VisitForm {
  readonly patientId: string;
  readonly amendId: string | null;
  draft = $state<AssessmentDraft>() as AssessmentDraft;
  readings = $state.raw<readonly VisitReading[]>([]);
  /** Readings in the restored draft that could not be read (named to the person, never saved). */
  unreadable = $state.raw<readonly UnreadableReading[]>([]);
  amendReason = $state('');
  showIssues = $state(false);
  /** The latest observation of each series, for "last time" beside each row. */
  // eslint-disable-next-line svelte/prefer-svelte-reactivity -- replaced whole (raw state), never changed in place
  lastBySeries = $state.raw(new Map<string, Observation>());
  /** No live visit of the patient before this one (a new visit, or the visit amended): said plainly. */
  firstVisit = $state(false);
  #keyCounter = 0;

  constructor(patientId: string, amendId: string | null) {
    this.patientId = patientId;
    this.amendId = amendId;
    this.draft = emptyDraft(patientId, localNow());
  }

  readonly checked = $derived.by(() => {
    const form = draftObservations(this.draft);
    const issues: DraftIssue[] = [...form.issues];
    for (const r of repeatedReadings(this.readings, form.observations)) issues.push({ field: `reading-${r.key}`, message: r.message });
    if (!this.amendId) issues.push(...missingReadings(this.draft, this.readings));
    if (this.amendId && this.amendReason.trim() === '') issues.push({ field: 'amendReason', message: M.amendReasonNeeded });
    return { observations: form.observations, issues };
  });

  issueFor(field: string): DraftIssue[] {
    return this.checked.issues.filter((i) => i.field === field || i.field.startsWith(`${field}.`));
  }
  invalid(field: string): boolean {
    return this.showIssues && this.issueFor(field).length > 0;
  }

  /** "Last time" for a row: the latest value of its series, with its date. */
  lastTime(measureCode: string, siteCode: string, side: string, mode: string | null = null): string {
    const o = this.lastBySeries.get(seriesKey({ measureCode, siteCode, side: side as Observation['side'], mode: mode as Observation['mode'] }));
    return lastTimeText(o, this.firstVisit);
  }

  isSkipped(key: string): boolean {
    return (this.draft.notTested ?? []).includes(key);
  }
  toggleSkipped(key: string): void {
    const list = this.draft.notTested ?? [];
    this.draft.notTested = list.includes(key) ? list.filter((k) => k !== key) : [...list, key];
  }

  nextKey(): string {
    this.#keyCounter += 1;
    return `${Date.now().toString(36)}-${this.#keyCounter}`;
  }

  /** Adds a row of a measure (its first site, left); focus moves to its first control (not left on the button). */
  async addRow(measureCode: string): Promise<void> {
    const measure = rowMeasure(measureCode);
    if (!measure) return;
    const key = this.nextKey();
    (this.draft.rows[measureCode] ??= []).push(newRow(measure, { key, siteCode: measure.sites[0]?.code ?? '', side: 'left' }));
    await tick();
    document.getElementById(`site-${key}`)?.focus();
  }
}

/** A carried row's name: "Left ankle plantarflexors"; with its mode and instrument when it has them ("…, passive, inclinometer"). */
export function rowTitle(measure: RowMeasure, row: FormRow): string {
  const base = `${M.sideWord(row.side)} ${siteName(measure.code, row.siteCode).toLowerCase()}`;
  const extra = 'angleDeg' in row ? [row.mode, row.instrument === null ? null : M.instruments[row.instrument].toLowerCase()].filter((x) => x !== null) : [];
  return [base, ...extra].join(', ');
}

export function siteName(measureCode: string, siteCode: string): string {
  const m = findMeasure(measureCode);
  return (m && findSite(m, siteCode)?.label) ?? siteCode;
}
