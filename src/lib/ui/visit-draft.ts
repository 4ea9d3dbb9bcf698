import type { KinnoteStore } from '$lib/store';
import { allRows, upgradeDraft, type AssessmentDraft } from './assessment-draft';
import { rowFilled } from './visit-form-layout';
import { DraftKeeper, type DraftEnvironment } from './draft-keeper';
import { readingsFromDraft, type UnreadableReading, type VisitReading } from './visit-readings';

/**
 * What the visit form's draft keeps: the form, the notes as last sealed (kept as they are while the
 * vault is locked), and the instrument readings taken in this visit (saved with it, all or nothing).
 */
export interface KeptVisit {
  readonly form: AssessmentDraft;
  readonly sealed: unknown;
  readonly readings: readonly VisitReading[];
  /** Readings in the stored draft that could not be read: shown by name, written back unchanged. */
  readonly unreadable: readonly UnreadableReading[];
}

type DraftVault = KinnoteStore['vault'];

/**
 * The visit form's draft keeper (one per tab, form "assessment" or "assessment-amend"): notes are
 * kept only sealed; readings as plain JSON. `onSealed` hears the notes as last sealed, for the next write.
 */
export function visitDraftKeeper(options: {
  patientId: string;
  amendId: string | null;
  vault: () => DraftVault | null;
  onSealed: (sealed: unknown) => void;
  onError: (error: unknown) => void;
  /** Tests pass their own (the browser's by default). */
  environment?: DraftEnvironment;
}): DraftKeeper<KeptVisit> {
  const { patientId } = options;
  return new DraftKeeper<KeptVisit>({
    form: options.amendId ? 'assessment-amend' : 'assessment',
    subjectId: options.amendId ?? patientId,
    encode: async ({ form, sealed, readings, unreadable }) => {
      const { notes, ...rest } = form;
      const vault = options.vault();
      let kept = sealed;
      if (vault?.status === 'unlocked') kept = notes ? await vault.seal(notes, `draft:${patientId}`) : null;
      options.onSealed(kept);
      return { draft: rest, sealedNotes: kept, readings: [...readings, ...unreadable.map((u) => u.stored)] };
    },
    decode: async (content) => {
      const c = content as { draft?: unknown; sealedNotes?: unknown; readings?: unknown } | null;
      const draft = upgradeDraft(c?.draft);
      if (!c || !draft || draft.patientId !== patientId) return null;
      let notes = '';
      const vault = options.vault();
      if (c.sealedNotes && vault?.status === 'unlocked') {
        try {
          notes = await vault.open(c.sealedNotes as Parameters<DraftVault['open']>[0], `draft:${patientId}`);
        } catch {
          notes = '';
        }
      }
      const { readings, unreadable } = readingsFromDraft(c.readings);
      return { form: { ...draft, notes }, sealed: c.sealedNotes ?? null, readings, unreadable };
    },
    onError: options.onError,
    ...(options.environment ? { environment: options.environment } : {}),
  });
}

/** What a visit draft holds, in a few words, for the list of other drafts (OtherDrafts.svelte). */
export function visitDraftSize(value: KeptVisit): string {
  const f = value.form;
  const filled = allRows(f).filter(rowFilled).length + Object.values(f.ratings).filter((v) => v !== null).length + value.readings.length;
  return `${filled} value${filled === 1 ? '' : 's'}`;
}
