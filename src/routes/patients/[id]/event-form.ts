// The event form's values: one shape for adding an intervention and for amending a saved one.
import { EVENT_KIND_LABELS, type ClinicalEvent, type EventKind } from '$lib/domain';
import type { Input, AmendedField } from '$lib/store';
import { PATIENT_PAGE_MESSAGES as m } from '$lib/ui';

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

/** One audited change in words, e.g. "date 2025-02-03 → 2025-03-02"; notes are never shown (protected). */
export function changeInWords(c: AmendedField): string {
  const name = m.eventFields[c.field] ?? c.field;
  if (/Sealed$/.test(c.field)) return m.protectedChanged(name);
  const word = (v: unknown) => (v === null || v === '' ? m.noValue : c.field === 'kind' ? (EVENT_KIND_LABELS[v as EventKind] ?? String(v)) : typeof v === 'string' ? v : JSON.stringify(v));
  return m.fieldChanged(name, word(c.before), word(c.after));
}
