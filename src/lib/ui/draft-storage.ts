import type { AssessmentDraft } from './assessment-draft';

// Drafts live in localStorage: written synchronously on every change, so a reload, a lock, an app
// update or a crash loses nothing. Notes are not kept here in clear: the page seals them with the
// vault (AES-GCM) and stores only the sealed form (see the assessment page).
const prefix = 'kinnote.draft.';

export interface StoredDraft {
  readonly draft: Omit<AssessmentDraft, 'notes'>;
  /** Notes sealed by the vault, opaque here; null when there are none. */
  readonly sealedNotes: unknown;
  readonly savedAtMs: number;
}

function storage(): Storage | null {
  try {
    return typeof localStorage === 'undefined' ? null : localStorage;
  } catch {
    return null;
  }
}

export function loadDraft(patientId: string): StoredDraft | null {
  const text = storage()?.getItem(prefix + patientId);
  if (!text) return null;
  try {
    const parsed = JSON.parse(text) as StoredDraft;
    return parsed?.draft?.version === 1 && parsed.draft.patientId === patientId ? parsed : null;
  } catch {
    return null;
  }
}

/** Saves the draft (without clear-text notes). Returns false when the browser refused (e.g. full). */
export function saveDraft(draft: AssessmentDraft, sealedNotes: unknown, savedAtMs: number): boolean {
  const rest: Omit<AssessmentDraft, 'notes'> & { notes?: string } = { ...draft };
  delete rest.notes;
  try {
    storage()?.setItem(prefix + draft.patientId, JSON.stringify({ draft: rest, sealedNotes, savedAtMs }));
    return true;
  } catch {
    return false;
  }
}

export function discardDraft(patientId: string): void {
  storage()?.removeItem(prefix + patientId);
}
