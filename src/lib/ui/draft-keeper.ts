import { discardDraft, draftsFor, takeOverDraft, writeDraft, type DraftRow, type KinnoteStore } from '$lib/store';

/**
 * Keeps one form's unsaved values as a draft in IndexedDB (store/drafts.ts) while a person types,
 * for any form (the assessment today, the visit form next): at most `delayMs` after a change the
 * latest values are written in a durable transaction, so a browser killed a second after typing
 * loses nothing. Each tab keeps its own draft (a tab id in sessionStorage, made unique among open
 * tabs with a Web Lock), so one tab's save never deletes another tab's typing. The page passes
 * `draftId` to the save so that the draft is removed in the save's own transaction, and calls
 * `pause()` before saving so that no late write brings the draft back.
 */

/** Where a draft comes from, as shown in the choice between drafts. */
export type DraftOrigin = 'this-tab' | 'open-tab' | 'closed-tab';

export interface DraftChoice<T> {
  readonly id: string;
  readonly savedAtMs: number;
  readonly origin: DraftOrigin;
  readonly value: T;
}

export interface DraftStart<T> {
  /** The values to put in the form (this tab's draft, or the only one a closed tab left). */
  readonly restored: { readonly value: T; readonly savedAtMs: number } | null;
  /** Other drafts of the same form and subject: the page offers a choice when there are any. */
  readonly others: readonly DraftChoice<T>[];
}

/** The browser pieces the keeper uses; tests pass their own. */
export interface DraftEnvironment {
  readonly sessionStorage: Pick<Storage, 'getItem' | 'setItem'> | null;
  readonly locks: Pick<LockManager, 'request' | 'query'> | null;
  readonly setTimeout: (fn: () => void, ms: number) => unknown;
  readonly clearTimeout: (handle: unknown) => void;
  readonly now: () => number;
  readonly randomId: () => string;
}

export interface DraftKeeperOptions<T> {
  /** Form name, e.g. "assessment" (lower-case words joined by "-"). */
  readonly form: string;
  /** Whose form, usually the patient id. */
  readonly subjectId: string;
  /** Turns the form's values into plain JSON (seal protected text here). */
  readonly encode: (value: T) => unknown;
  /** Reads stored content back; null when it cannot be read (it is then offered nowhere). */
  readonly decode: (content: unknown) => Promise<T | null> | T | null;
  /** Longest wait between a change and its write; default 250 ms. */
  readonly delayMs?: number;
  /** Called when a write fails (e.g. the device is full), with the error; the next change retries. */
  readonly onError?: (error: unknown) => void;
  readonly environment?: DraftEnvironment;
}

const TAB_KEY = 'kinnote.tab-id';
const LOCK_PREFIX = 'kinnote-tab:';

// One environment per tab (per page's JavaScript realm), so every form in the tab shares its tab id.
let browser: DraftEnvironment | null = null;
function browserEnvironment(): DraftEnvironment {
  browser ??= makeBrowserEnvironment();
  return browser;
}

function makeBrowserEnvironment(): DraftEnvironment {
  const session = (() => {
    try {
      return typeof sessionStorage === 'undefined' ? null : sessionStorage;
    } catch {
      return null;
    }
  })();
  const locks = typeof navigator !== 'undefined' && 'locks' in navigator ? navigator.locks : null;
  return {
    sessionStorage: session,
    locks,
    setTimeout: (fn, ms) => globalThis.setTimeout(fn, ms),
    clearTimeout: (handle) => globalThis.clearTimeout(handle as ReturnType<typeof setTimeout>),
    now: () => Date.now(),
    randomId: () => crypto.randomUUID(),
  };
}

const tabIds = new WeakMap<DraftEnvironment, Promise<string>>();

/**
 * This tab's id: kept in sessionStorage (so a reload keeps its draft) and held as a Web Lock for the
 * tab's life. A duplicated tab copies sessionStorage; it finds the lock taken and picks a new id.
 */
export function tabId(environment: DraftEnvironment): Promise<string> {
  let pending = tabIds.get(environment);
  if (!pending) {
    pending = claimTabId(environment);
    tabIds.set(environment, pending);
  }
  return pending;
}

async function claimTabId(env: DraftEnvironment): Promise<string> {
  let id = env.sessionStorage?.getItem(TAB_KEY) ?? null;
  for (let attempt = 0; attempt < 3; attempt++) {
    id ??= env.randomId();
    if (!env.locks || (await holdLock(env.locks, LOCK_PREFIX + id))) break;
    id = null;
  }
  id ??= env.randomId();
  try {
    env.sessionStorage?.setItem(TAB_KEY, id);
  } catch {
    // Without sessionStorage a reload starts a new tab id; its old draft is then offered back.
  }
  return id;
}

/** Takes the lock if free and holds it until the tab closes; false when another tab holds it. */
function holdLock(locks: Pick<LockManager, 'request'>, name: string): Promise<boolean> {
  return new Promise((resolve) => {
    locks
      .request(name, { ifAvailable: true }, (lock) => {
        resolve(lock !== null);
        // Held for the tab's life: the promise never settles.
        return lock ? new Promise<void>(() => {}) : undefined;
      })
      .catch(() => resolve(true));
  });
}

async function openTabIds(locks: DraftEnvironment['locks']): Promise<Set<string> | null> {
  if (!locks) return null;
  try {
    const state = await locks.query();
    return new Set((state.held ?? []).map((l) => l.name ?? '').filter((n) => n.startsWith(LOCK_PREFIX)).map((n) => n.slice(LOCK_PREFIX.length)));
  } catch {
    return null;
  }
}

export class DraftKeeper<T> {
  readonly #options: DraftKeeperOptions<T>;
  readonly #env: DraftEnvironment;
  readonly #delayMs: number;
  #store: KinnoteStore | null = null;
  #tabId: string | null = null;
  #latest: { value: T } | null = null;
  #timer: unknown = null;
  #writing: Promise<void> = Promise.resolve();
  #paused = false;
  #stopped = false;
  #closed = false;

  constructor(options: DraftKeeperOptions<T>) {
    this.#options = options;
    this.#env = options.environment ?? browserEnvironment();
    this.#delayMs = options.delayMs ?? 250;
  }

  /** This tab's draft id, to pass to the save (null before start). */
  get id(): string | null {
    return this.#tabId === null ? null : `${this.#options.form}:${this.#options.subjectId}:${this.#tabId}`;
  }

  /**
   * Reads the drafts of this form and subject. This tab's own draft is restored; with none, the one
   * draft a closed tab left (a crash, a closed browser) is taken over and restored. Every other
   * draft is returned in `others` for the page to offer.
   */
  async start(store: KinnoteStore): Promise<DraftStart<T>> {
    this.#store = store;
    this.#tabId = await tabId(this.#env);
    const rows = await draftsFor(store, this.#options.form, this.#options.subjectId);
    const open = await openTabIds(this.#env.locks);
    const origin = (row: DraftRow): DraftOrigin => (row.tabId === this.#tabId ? 'this-tab' : open?.has(row.tabId) ? 'open-tab' : 'closed-tab');
    const choices: DraftChoice<T>[] = [];
    for (const row of rows) {
      const value = await this.#decode(row.content);
      if (value !== null) choices.push({ id: row.id, savedAtMs: row.savedAtMs, origin: origin(row), value });
    }
    let own = choices.find((c) => c.origin === 'this-tab') ?? null;
    const closed = choices.filter((c) => c.origin === 'closed-tab');
    let takenFrom: string | null = null;
    if (!own && closed.length === 1) {
      const moved = await takeOverDraft(store, closed[0]!.id, this.#tabId);
      if (moved) {
        takenFrom = closed[0]!.id;
        own = { ...closed[0]!, id: moved.id, origin: 'this-tab' };
      }
    }
    const others = choices.filter((c) => c.origin !== 'this-tab' && c.id !== takenFrom);
    return { restored: own ? { value: own.value, savedAtMs: own.savedAtMs } : null, others };
  }

  /** Continues another draft here (it replaces this tab's draft). Null when it is gone. */
  async continueFrom(choiceId: string): Promise<{ value: T; savedAtMs: number } | null> {
    if (!this.#store || !this.#tabId) return null;
    this.#cancelTimer();
    await this.#writing;
    const moved = await takeOverDraft(this.#store, choiceId, this.#tabId);
    if (!moved) return null;
    const value = await this.#decode(moved.content);
    return value === null ? null : { value, savedAtMs: moved.savedAtMs };
  }

  /** Removes one draft (another tab's left-over, or this tab's own when the person discards it). */
  async discard(id: string): Promise<void> {
    if (!this.#store) return;
    if (id === this.id) {
      this.#cancelTimer();
      this.#latest = null;
      await this.#writing;
    }
    await discardDraft(this.#store, id);
  }

  /**
   * Notes a change; the latest values are written at most `delayMs` later, or at once with `now` (for a
   * change that is costly to redo, e.g. an instrument reading: a page closed or reloaded within the
   * delay would lose it, since a write begun while the page goes away may never land).
   */
  schedule(value: T, now = false): void {
    if (this.#stopped || this.#closed) return;
    this.#latest = { value };
    if (now && !this.#paused) {
      void this.flush();
      return;
    }
    if (this.#paused || this.#timer !== null) return;
    this.#timer = this.#env.setTimeout(() => {
      this.#timer = null;
      void this.flush();
    }, this.#delayMs);
  }

  /** Writes the latest values now (e.g. when the page is hidden); resolves when they are on disk. */
  flush(): Promise<void> {
    this.#cancelTimer();
    const next = this.#latest;
    const store = this.#store;
    if (!next || !store || this.#paused || this.#stopped || this.#tabId === null) return this.#writing;
    this.#latest = null;
    const tab = this.#tabId;
    this.#writing = this.#writing.then(async () => {
      if (this.#paused || this.#stopped) {
        this.#latest ??= next;
        return;
      }
      try {
        const content = await this.#options.encode(next.value);
        await writeDraft(store, { form: this.#options.form, subjectId: this.#options.subjectId, tabId: tab, savedAtMs: this.#env.now(), content });
      } catch (error) {
        this.#latest ??= next;
        this.#options.onError?.(error);
      }
    });
    return this.#writing;
  }

  /** Before a save: no write starts until `resume()` or `stop()`; resolves once writes in flight end. */
  async pause(): Promise<void> {
    this.#paused = true;
    this.#cancelTimer();
    await this.#writing;
  }

  /** After a failed save: writing goes on (the values changed meanwhile are written). */
  resume(): void {
    this.#paused = false;
    if (this.#latest) this.schedule(this.#latest.value);
  }

  /** When the page goes away unsaved: writes what is pending, then nothing more. */
  close(): Promise<void> {
    const last = this.flush();
    this.#closed = true;
    return last;
  }

  /**
   * After a successful save when the form stays open (the programme form, or a form that changed
   * while it was saving). The save removed the draft; what was noted during the save reflects the
   * values from before the save's outcome, so it is dropped. Pass `typedDuringSave` (what the form
   * shows now, re-read by the page) when the person changed the form while the save ran: it becomes
   * this tab's draft at once, so nothing typed meanwhile is lost. Later changes are kept as usual.
   */
  continueAfterSave(typedDuringSave: T | null): Promise<void> {
    this.#paused = false;
    this.#stopped = false;
    this.#cancelTimer();
    this.#latest = typedDuringSave === null ? null : { value: typedDuringSave };
    return this.flush();
  }

  /** After a successful save: nothing more is written. */
  stop(): void {
    this.#stopped = true;
    this.#cancelTimer();
  }

  #cancelTimer(): void {
    if (this.#timer !== null) this.#env.clearTimeout(this.#timer);
    this.#timer = null;
  }

  async #decode(content: unknown): Promise<T | null> {
    try {
      return await this.#options.decode(content);
    } catch {
      return null;
    }
  }
}

/**
 * For a page's onMount: writes the pending draft when the tab is hidden or the page goes away (a
 * phone may discard a hidden tab without another event). Returns the clean-up, which stops that
 * and closes the keeper.
 */
export function keepDraftWhenLeaving(keeper: Pick<DraftKeeper<unknown>, 'flush' | 'close'>): () => void {
  const hide = () => document.visibilityState === 'hidden' && void keeper.flush();
  const leave = () => void keeper.flush();
  document.addEventListener('visibilitychange', hide);
  window.addEventListener('pagehide', leave);
  return () => {
    document.removeEventListener('visibilitychange', hide);
    window.removeEventListener('pagehide', leave);
    void keeper.close();
  };
}
