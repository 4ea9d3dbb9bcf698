// Imported by their own paths, not through the folder doors: the first screen loads this module, and a
// door would bring every module behind it into the first load (budget, DEVELOPERS.md).
import { moveLegacyDrafts, openStore, type KinnoteStore, dismissPhoneReanalysisNotice, phoneReanalysisPending, readPhoneReanalysisNotice, type PhoneReanalysisNotice, CHANGED_ELSEWHERE, type Actor, StoreError, type VaultStatus } from '$lib/store';
import { readDeviceProfile } from '$lib/programme';

/** What went wrong, for a person: the store's own message, or a plain one. */
export function describeError(error: unknown): string {
  if (error instanceof StoreError) {
    switch (error.code) {
      case 'QuotaExceeded':
        return 'This device is out of storage space. Nothing was saved. Free some space (or export and remove old data) and try again.';
      case 'Locked':
        return 'Names and notes are protected: unlock them with your passphrase first.';
      case 'WrongPassphrase':
        return 'That passphrase is not right. Nothing was changed.';
      case 'VersionConflict':
        return `Not saved: ${CHANGED_ELSEWHERE}. What you typed is kept until you reload.`;
      default:
        return error.message;
    }
  }
  return error instanceof Error ? error.message : String(error);
}

function localStorageOrNull(): Storage | null {
  try {
    return typeof localStorage === 'undefined' ? null : localStorage;
  } catch {
    return null;
  }
}

/**
 * The page's view of the record store: opened once per tab, with the vault's lock state and a
 * revision counter that pages read to reload after a write.
 */
class Session {
  store = $state.raw<KinnoteStore | null>(null);
  phase = $state<'closed' | 'opening' | 'ready' | 'failed'>('closed');
  failure = $state<string | null>(null);
  vaultStatus = $state<VaultStatus>('unset');
  actor = $state.raw<Actor | null>(null);
  /** What this device is for: a therapist's, a patient's own phone (home programme), or not chosen yet. */
  deviceMode = $state<'therapist' | 'patient' | null>(null);
  /** Bumped after every write made through `changed()`, in this tab or another, so pages can re-read. */
  revision = $state(0);
  /** Bumped when another tab of this app on this device wrote (a form may then be stale). */
  elsewhere = $state(0);
  /** The schema-7 re-analysis of saved phone recordings: its one-time notice until the user dismisses it. */
  reanalysisNotice = $state.raw<PhoneReanalysisNotice | null>(null);
  /** Set when the re-analysis could not finish (it is tried again on the next open). */
  reanalysisFailure = $state<string | null>(null);
  #opening: Promise<KinnoteStore> | null = null;
  // Tabs tell each other about writes, so a second tab re-reads instead of showing stale data.
  #channel: BroadcastChannel | null = null;

  /** Opens the store (once); resolves when ready. */
  open(): Promise<KinnoteStore> {
    if (this.#opening) return this.#opening;
    this.phase = 'opening';
    this.#opening = openStore().then(
      async (store) => {
        this.deviceMode = (await readDeviceProfile(store).catch(() => null))?.mode ?? (store.actor ? 'therapist' : null);
        // Drafts of earlier versions lived in localStorage: moved into the database once.
        await moveLegacyDrafts(store, localStorageOrNull()).catch(() => 0);
        this.store = store;
        this.actor = store.actor;
        this.vaultStatus = store.vault.status;
        store.vault.subscribe((status) => {
          this.vaultStatus = status;
        });
        if (typeof BroadcastChannel !== 'undefined') {
          this.#channel = new BroadcastChannel('kinnote-writes');
          this.#channel.onmessage = () => {
            this.elsewhere++;
            this.revision++;
          };
        }
        if (typeof window !== 'undefined') {
          // Any interaction keeps the vault open; idleness locks it (the store's timer).
          const touch = () => store.vault.touch();
          window.addEventListener('pointerdown', touch, { passive: true });
          window.addEventListener('keydown', touch, { passive: true });
        }
        this.phase = 'ready';
        void this.#reanalyse(store);
        return store;
      },
      (error: unknown) => {
        this.phase = 'failed';
        this.failure = describeError(error);
        this.#opening = null;
        throw error;
      },
    );
    return this.#opening;
  }

  /**
   * Schema 7: saved phone recordings are analysed again once, beside the page (the analysis code is
   * loaded only when that is pending); pages re-read when values changed. The notice stays until the
   * user dismisses it.
   */
  async #reanalyse(store: KinnoteStore): Promise<void> {
    try {
      if (await phoneReanalysisPending(store)) {
        const [{ reanalyseSavedRecording }, { runPendingPhoneReanalysis }] = await Promise.all([import('$lib/sensors'), import('$lib/store/phone-reanalysis-run')]);
        const notice = await runPendingPhoneReanalysis(store, reanalyseSavedRecording);
        if (notice && notice.recordingsChanged > 0) this.changed();
      }
      this.reanalysisNotice = await readPhoneReanalysisNotice(store);
    } catch (error) {
      this.reanalysisFailure = describeError(error);
    }
  }

  /** The user has read the re-analysis notice: never shown again. */
  async dismissReanalysisNotice(): Promise<void> {
    const store = this.store;
    if (!store) return;
    await dismissPhoneReanalysisNotice(store);
    this.reanalysisNotice = null;
  }

  /** Re-reads the device mode after it was chosen or changed (home programme set-up). */
  async refreshDeviceMode(): Promise<void> {
    const store = this.store;
    if (!store) return;
    this.deviceMode = (await readDeviceProfile(store).catch(() => null))?.mode ?? (store.actor ? 'therapist' : null);
  }

  /** Call after a write so that pages reading `revision` reload. */
  changed(): void {
    this.revision++;
    this.#channel?.postMessage({ kind: 'changed' });
    this.actor = this.store?.actor ?? null;
    // A device just set up for a therapist (it has a user now and no patient profile).
    if (this.deviceMode === null && this.actor) this.deviceMode = 'therapist';
  }
}

export const session = new Session();
