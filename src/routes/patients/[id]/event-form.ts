// The event form's values: one shape for adding an intervention and for amending a saved one.
import { EVENT_KIND_LABELS, type ClinicalEvent, type EventKind } from '$lib/domain';
import type { Input, AmendedField } from '$lib/store';

export interface EventFormValues {
  kind: EventKind;
  occurredOn: string;
  side: 'left' | 'right' | 'both' | '';
  summary: string;
  muscles: string;
  dose: string;
}

export function emptyEventForm(today: string): EventFormValues {
  return { kind: 'botulinum-toxin-injection', occurredOn: today, side: '', summary: '', muscles: '', dose: '' };
}

export function eventFormOf(e: ClinicalEvent): EventFormValues {
  return { kind: e.kind, occurredOn: e.occurredOn, side: e.side ?? '', summary: e.summary, muscles: e.muscles ?? '', dose: e.dose ?? '' };
}

const orNull = (text: string) => (text.trim() === '' ? null : text.trim());

/** The record fields the form sets (notes and the end date are not on the form and stay as saved). */
export function eventFields(v: EventFormValues): Pick<Input<'events'>, 'kind' | 'occurredOn' | 'side' | 'summary' | 'muscles' | 'dose'> {
  return { kind: v.kind, occurredOn: v.occurredOn, side: v.side === '' ? null : v.side, summary: v.summary.trim(), muscles: orNull(v.muscles), dose: orNull(v.dose) };
}

const FIELD_WORDS: Record<string, string> = { kind: 'what', occurredOn: 'date', endsOn: 'ends', side: 'side', summary: 'summary', muscles: 'muscles', dose: 'dose', notesSealed: 'notes', deleted: 'deleted' };

/** One audited change in words, e.g. "date 2025-02-03 → 2025-03-02"; notes are never shown (protected). */
export function changeInWords(c: AmendedField): string {
  const name = FIELD_WORDS[c.field] ?? c.field;
  if (c.field.endsWith('Sealed')) return `${name} changed (protected: not kept in the audit)`;
  const word = (v: unknown) => (v === null || v === '' ? 'none' : c.field === 'kind' ? (EVENT_KIND_LABELS[v as EventKind] ?? String(v)) : typeof v === 'string' ? v : JSON.stringify(v));
  return `${name} ${word(c.before)} → ${word(c.after)}`;
}
