import type { Dexie } from 'dexie';
import { canonicalJson } from './canonical-json';
import type { KinnoteStore } from './open-store';
import { StoreError, toStoreError } from './store-error';

/**
 * Unsaved form content ("drafts"), kept in IndexedDB's `drafts` table (schema v4). Why here and not
 * in localStorage: Chromium writes localStorage to disk lazily, so a browser killed soon after
 * typing lost the value, and a draft removed right after a save came back after a crash while the
 * saved assessment (IndexedDB) had reached disk: Save then made a duplicate. In IndexedDB the draft
 * is written in its own durable transaction, and removed in the same transaction that saves the
 * record it becomes, so both land or neither does.
 *
 * One draft per form, subject and tab: `id = form:subjectId:tabId`. Drafts are device-local: they
 * never travel in backups and have no audit trail (they are not records). Protected text (notes)
 * must be sealed by the caller before it is put in `content`.
 */
export interface DraftRow {
  /** `${form}:${subjectId}:${tabId}` */
  readonly id: string;
  /** Which form, e.g. "assessment", "programme". */
  readonly form: string;
  /** Whose form, usually the patient id. */
  readonly subjectId: string;
  /** The tab that writes it (a random id kept in the tab's sessionStorage). */
  readonly tabId: string;
  readonly savedAtMs: number;
  /** Plain JSON owned by the form (protected text only in sealed form). */
  readonly content: unknown;
}

export const DRAFTS_TABLE = 'drafts';
/** The tab id given to drafts moved over from localStorage (no tab owns them any more). */
export const LEGACY_TAB_ID = 'from-local-storage';
/** meta key set by the v4 upgrade while localStorage drafts still wait to be moved over. */
export const LEGACY_DRAFTS_META_KEY = 'draftsFromLocalStorage';
const LEGACY_PREFIX = 'kinnote.draft.';
const NAME = /^[a-z][a-z0-9-]{0,31}$/;

export function draftId(form: string, subjectId: string, tabId: string): string {
  return `${form}:${subjectId}:${tabId}`;
}

function table(db: Dexie) {
  return db.table<DraftRow, string>(DRAFTS_TABLE);
}

/**
 * Saves (replaces) one draft. Throws StoreError ValidationFailed for a malformed form name or
 * content that is not plain JSON, QuotaExceeded when the device is full.
 */
export async function writeDraft(store: KinnoteStore, draft: Omit<DraftRow, 'id'>): Promise<DraftRow> {
  if (!NAME.test(draft.form)) throw new StoreError('ValidationFailed', `draft form name ${JSON.stringify(draft.form)} must be lower-case words joined by "-"`);
  if (draft.subjectId === '' || draft.tabId === '') throw new StoreError('ValidationFailed', 'a draft needs a subject and a tab id');
  try {
    canonicalJson(draft.content);
  } catch (cause) {
    throw new StoreError('ValidationFailed', `draft of ${draft.form}: ${(cause as Error).message}`, { cause });
  }
  const row: DraftRow = { ...draft, id: draftId(draft.form, draft.subjectId, draft.tabId) };
  try {
    await table(store.db).put(row);
  } catch (error) {
    throw toStoreError(error, `keeping the draft of ${draft.form}`);
  }
  return row;
}

/** Every draft of one form and subject, newest first. */
export async function draftsFor(store: KinnoteStore, form: string, subjectId: string): Promise<DraftRow[]> {
  try {
    const rows = await table(store.db).where('[form+subjectId]').equals([form, subjectId]).toArray();
    return rows.sort((a, b) => b.savedAtMs - a.savedAtMs);
  } catch (error) {
    throw toStoreError(error, `reading drafts of ${form}`);
  }
}

/** Removes one draft (nothing happens when there is none). */
export async function discardDraft(store: KinnoteStore, id: string): Promise<void> {
  try {
    await table(store.db).delete(id);
  } catch (error) {
    throw toStoreError(error, 'discarding the draft');
  }
}

/**
 * Removes a draft inside the caller's transaction, which must include the `drafts` table: the save
 * of the record the draft became and the removal of the draft commit together.
 */
export async function discardDraftInTransaction(db: Dexie, id: string | null | undefined): Promise<void> {
  if (id) await table(db).delete(id);
}

/**
 * Moves a draft to another tab (a draft left by a closed tab or a crash, continued here), in one
 * transaction; the tab's own draft of that form is replaced. Returns the moved draft, or null when
 * it is gone (another tab took it first).
 */
export async function takeOverDraft(store: KinnoteStore, fromId: string, toTabId: string): Promise<DraftRow | null> {
  try {
    return await store.db.transaction('rw', [DRAFTS_TABLE], async () => {
      const from = await table(store.db).get(fromId);
      if (!from) return null;
      const moved: DraftRow = { ...from, tabId: toTabId, id: draftId(from.form, from.subjectId, toTabId) };
      if (moved.id === from.id) return from;
      await table(store.db).delete(fromId);
      await table(store.db).put(moved);
      return moved;
    });
  } catch (error) {
    throw toStoreError(error, 'continuing the draft');
  }
}

/** The part of the Web Storage interface the move from localStorage needs. */
export interface LegacyDraftStorage {
  readonly length: number;
  key(index: number): string | null;
  getItem(key: string): string | null;
  removeItem(key: string): void;
}

/**
 * Moves assessment drafts kept in localStorage by earlier versions (`kinnote.draft.<patientId>`)
 * into the drafts table, once: the v4 upgrade leaves a marker in meta, and the marker is cleared in
 * the same transaction that writes the moved drafts, so a crash in between moves them again and a
 * second run never brings back a draft that was saved or discarded since. The localStorage keys are
 * removed afterwards (and again on later runs, should that removal not have reached disk).
 * Unreadable entries are left in localStorage untouched. Returns how many drafts were moved.
 */
export async function moveLegacyDrafts(store: KinnoteStore, storage: LegacyDraftStorage | null): Promise<number> {
  if (!storage) return 0;
  const keys: string[] = [];
  for (let i = 0; i < storage.length; i++) {
    const key = storage.key(i);
    if (key?.startsWith(LEGACY_PREFIX)) keys.push(key);
  }
  const moved: DraftRow[] = [];
  const readable: string[] = [];
  for (const key of keys) {
    const patientId = key.slice(LEGACY_PREFIX.length);
    try {
      const parsed = JSON.parse(storage.getItem(key) ?? '') as { draft?: { patientId?: unknown }; sealedNotes?: unknown; savedAtMs?: unknown };
      if (parsed?.draft?.patientId !== patientId || typeof parsed.savedAtMs !== 'number') continue;
      canonicalJson(parsed);
      moved.push({
        id: draftId('assessment', patientId, LEGACY_TAB_ID),
        form: 'assessment',
        subjectId: patientId,
        tabId: LEGACY_TAB_ID,
        savedAtMs: parsed.savedAtMs,
        content: { draft: parsed.draft, sealedNotes: parsed.sealedNotes ?? null },
      });
      readable.push(key);
    } catch {
      // Not a draft this app can read: leave it where it is.
    }
  }
  let count: number;
  try {
    count = await store.db.transaction('rw', [DRAFTS_TABLE, 'meta'], async () => {
      const marker = await store.db.table('meta').get(LEGACY_DRAFTS_META_KEY);
      if (!marker) return 0;
      if (moved.length > 0) await table(store.db).bulkPut(moved);
      await store.db.table('meta').delete(LEGACY_DRAFTS_META_KEY);
      return moved.length;
    });
  } catch (error) {
    throw toStoreError(error, 'moving drafts from localStorage');
  }
  for (const key of readable) {
    try {
      storage.removeItem(key);
    } catch {
      // A later start removes it; the marker is gone, so it is never moved twice.
    }
  }
  return count;
}
