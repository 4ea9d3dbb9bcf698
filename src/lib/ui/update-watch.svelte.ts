import { Workbox } from 'workbox-window';

/**
 * Registers the offline worker and tracks whether a new version is waiting.
 * A waiting version never takes over by itself: `applyUpdate` (the user's "Update now") asks it
 * to skip waiting and reloads once it controls the page, so no one loses work mid-entry.
 */
class UpdateWatch {
  updateReady = $state(false);
  offlineReady = $state(false);
  #workbox: Workbox | undefined;
  #accepted = false;

  start(): void {
    if (this.#workbox || typeof navigator === 'undefined' || !('serviceWorker' in navigator)) return;
    // Dev server has no generated worker; only the production build registers it.
    if (import.meta.env.DEV) return;
    const workbox = new Workbox('/sw.js', { scope: '/' });
    workbox.addEventListener('waiting', () => {
      this.updateReady = true;
    });
    workbox.addEventListener('activated', (event) => {
      if (!event.isUpdate) this.offlineReady = true;
    });
    // Reload only for an update the user accepted. (workbox-window's own isUpdate flag is false when
    // the first install and an update happen within one page session.)
    workbox.addEventListener('controlling', () => {
      if (this.#accepted) window.location.reload();
    });
    void workbox.register().catch((error: unknown) => {
      console.warn('Kinnote: the offline worker could not be registered', error);
    });
    this.#workbox = workbox;
  }

  applyUpdate(): void {
    this.#accepted = true;
    this.#workbox?.messageSkipWaiting();
  }
}

export const updateWatch = new UpdateWatch();
