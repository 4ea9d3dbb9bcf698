import { liveQuery, type KinnoteStore } from '$lib/store';
import { explainBlockedTeamServer, pagePolicy } from '$lib/security';
import { countWaiting, isRevoked, readTeamLink, syncNow, TeamSyncError, type TeamLink } from '$lib/sync';
import { deviceRevoked, offline, waitingForUnlock } from './team-messages';

/** How soon after a save the changes go to the team (a burst of saves makes one sync). */
const AFTER_SAVE_MS = 4000;

const deps = () => ({
  fetch: (input: RequestInfo | URL, init?: RequestInit) => globalThis.fetch(input, init),
  randomBytes: (n: number) => globalThis.crypto.getRandomValues(new Uint8Array(n)),
  explainUnreachable: (serverUrl: string) => explainBlockedTeamServer(serverUrl, pagePolicy(), globalThis.location.origin),
});

/**
 * Keeps this device in step with its team in the background: on open, when the network returns,
 * a few seconds after a save, and on "Sync now". Entry never waits for it: a sync runs beside the
 * page, one at a time, and a failure only changes the quiet status line.
 */
class TeamSyncRunner {
  link = $state.raw<TeamLink | null>(null);
  busy = $state(false);
  lastError = $state<string | null>(null);
  waiting = $state(0);
  #store: KinnoteStore | null = null;
  #timer: ReturnType<typeof setTimeout> | undefined;
  #again = false;

  async start(store: KinnoteStore): Promise<void> {
    if (this.#store === store) return;
    this.#store = store;
    await this.refresh();
    globalThis.addEventListener?.('online', () => void this.sync());
    // Every store write adds an audit entry in its own transaction: a change there means a save.
    liveQuery(() => store.db.table('audit').count()).subscribe({
      next: () => {
        void this.countWaiting();
        clearTimeout(this.#timer);
        this.#timer = setTimeout(() => void this.sync(), AFTER_SAVE_MS);
      },
      error: () => undefined,
    });
    void this.sync();
  }

  async refresh(): Promise<void> {
    if (!this.#store) return;
    this.link = await readTeamLink(this.#store);
    await this.countWaiting();
  }

  async countWaiting(): Promise<void> {
    const store = this.#store;
    const link = this.link;
    if (!store || !link || link.role === 'auditor') {
      this.waiting = 0;
      return;
    }
    this.waiting = await countWaiting(store, link);
  }

  async sync(): Promise<void> {
    const store = this.#store;
    if (!store) return;
    if (this.busy) {
      this.#again = true;
      return;
    }
    this.link = await readTeamLink(store);
    if (!this.link) return;
    if (this.link.role !== 'auditor' && store.vault.status !== 'unlocked') {
      this.lastError = waitingForUnlock;
      return;
    }
    this.busy = true;
    try {
      await syncNow(store, deps());
      this.lastError = null;
    } catch (error) {
      this.lastError = isRevoked(error)
        ? deviceRevoked
        : error instanceof TeamSyncError && error.status === null && /cannot be reached/.test(error.message)
          ? offline
          : (error as Error).message;
    } finally {
      this.busy = false;
      await this.refresh();
    }
    if (this.#again) {
      this.#again = false;
      void this.sync();
    }
  }
}

export const teamSync = new TeamSyncRunner();
export { deps as teamSyncDeps };
