import { VISIT_MESSAGES as M, formMeasure, type DraftIssue } from '$lib/ui';
import { siteName, type VisitForm } from './visit-form.svelte';

// Every issue names its field and links to it: "rom.2.angleDeg" → the element with id "rom-2-angleDeg",
// or the nearest enclosing row ("rom-2") when the field has no control of its own.
export const fieldId = (field: string) => field.replaceAll('.', '-');

function issueTarget(field: string): HTMLElement | null {
  const parts = field.split('.');
  for (let n = parts.length; n > 0; n--) {
    const el = document.getElementById(fieldId(parts.slice(0, n).join('.')));
    if (el) return el;
  }
  return null;
}

/** The field an issue is about, in words: "Range of motion, left knee flexion". */
export function issueLabel(form: VisitForm, issue: DraftIssue): string {
  const [section, index] = issue.field.split('.');
  if (section?.startsWith('reading-')) return M.instrumentReading;
  if (section?.startsWith('instrument-')) return M.instrumentReadingDue;
  const measure = section === undefined ? undefined : formMeasure(section);
  const row = measure ? form.draft.rows[measure.code]?.[Number(index)] : undefined;
  if (measure && row) return `${measure.form.name}, ${row.side} ${siteName(measure.code, row.siteCode).toLowerCase()}`;
  if (measure && index === undefined) return measure.form.name;
  return M.fieldNames[issue.field] ?? issue.field;
}

/** Moves focus to the field's control (or its row) and scrolls it into view. */
export function focusField(field: string): void {
  const el = issueTarget(field);
  const control = el?.matches('input, select, textarea') ? el : el?.querySelector<HTMLElement>('input:not([type=radio]), select, input[type=radio], button');
  (control ?? el)?.focus();
  el?.scrollIntoView({ block: 'center' });
}
