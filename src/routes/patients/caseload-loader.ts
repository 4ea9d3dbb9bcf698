// The caseload's named loaders: rows (first screen from an index, then everyone) and first names.
import type { KinnoteStore } from '$lib/store';
import { caseloadRows, type CaseloadRow } from '$lib/ui';
import * as t from './caseload-messages';

/** Rows of the first screen, read from an index before the whole caseload. */
export const FIRST_SCREEN_ROWS = 40;

/**
 * Reads the caseload: when `firstScreen` is given, it gets the first rows at a cost that does not grow
 * with the caseload (null or none: skipped), then the whole caseload is returned. One small stored row
 * per patient, kept up to date on write (store/caseload-summaries.ts).
 */
export async function loadCaseload(store: KinnoteStore, firstScreen: ((rows: CaseloadRow[]) => void) | null): Promise<CaseloadRow[]> {
  if (firstScreen) {
    const first = await store.caseloadFirstRows(FIRST_SCREEN_ROWS);
    if (first !== null && first.length > 0) firstScreen(caseloadRows(first));
  }
  return caseloadRows(await store.caseload());
}

/** First names by patient id while the vault is unlocked; empty while locked. */
export async function loadFirstNames(store: KinnoteStore | null): Promise<Map<string, string>> {
  if (!store || store.vault.status !== 'unlocked') return new Map();
  const entries: Array<[string, string]> = [];
  for (const row of await store.identities.list()) {
    const identity = await store.identities.open(row);
    entries.push([identity.patientId, identity.givenName]);
  }
  return new Map(entries);
}

/** "Due in 3 days", "Overdue by 2 days", "Due today", or why there is no date. */
export function dueText(row: CaseloadRow, nowMs: number): string {
  if (row.nextDueMs === null) return row.patient.status === 'active' ? t.noAssessmentYet : row.patient.status;
  const days = Math.round((row.nextDueMs - nowMs) / 86_400_000);
  if (days < 0) return t.overdueBy(-days);
  if (days === 0) return t.dueToday;
  return t.dueIn(days);
}
