import type { RandomBytes } from '../domain';
import { base64ToBytes, bytesToBase64 } from './base64';
import { deriveKey, importAesKey, openBytes, openText, sealBytes, sealText, type SealedText } from './crypto-box';
import { StoreError } from './store-error';

/** What the vault keeps in the database: never the passphrase, never the key in clear. */
export interface VaultRecord {
  readonly version: 1;
  /** PBKDF2 salt, base64 (16 random bytes). */
  readonly salt: string;
  readonly iterations: number;
  /** The random data key, sealed under the passphrase key. */
  readonly wrappedKey: SealedText;
  readonly createdAt: string;
}

export interface VaultPersistence {
  read(): Promise<VaultRecord | undefined>;
  write(record: VaultRecord): Promise<void>;
}

export interface Timers {
  setTimeout(fn: () => void, ms: number): unknown;
  clearTimeout(handle: unknown): void;
}

export type VaultStatus = 'unset' | 'locked' | 'unlocked';

const WRAP_AAD = 'kinnote:vault-key:v1';

/**
 * Holds the key that protects identities and notes. Envelope design: a random 256-bit data key
 * encrypts the records; a key derived from the passphrase (PBKDF2-SHA-256) wraps the data key, so
 * changing the passphrase rewrites one small record, not every identity. While locked the data key
 * is dropped (the CryptoKey is non-extractable; dropping the reference is what a page can do).
 * Locks on demand and after `idleTimeoutMs` without `touch()` or use.
 */
export class Vault {
  #key: CryptoKey | null = null;
  #record: VaultRecord | undefined;
  #timer: unknown = undefined;
  #idleTimeoutMs: number | null;
  readonly #listeners = new Set<(status: VaultStatus) => void>();

  constructor(
    private readonly persistence: VaultPersistence,
    private readonly options: {
      readonly randomBytes: RandomBytes;
      readonly now: () => number;
      readonly iterations: number;
      readonly timers: Timers;
      readonly idleTimeoutMs: number | null;
    },
  ) {
    this.#idleTimeoutMs = options.idleTimeoutMs;
  }

  /** Reads the stored vault record; call once before use (openStore does). */
  async load(): Promise<void> {
    this.#record = await this.persistence.read();
  }

  get status(): VaultStatus {
    if (!this.#record) return 'unset';
    return this.#key ? 'unlocked' : 'locked';
  }

  get idleTimeoutMs(): number | null {
    return this.#idleTimeoutMs;
  }

  /** Calls `listener` on every status change; returns the unsubscribe function. */
  subscribe(listener: (status: VaultStatus) => void): () => void {
    this.#listeners.add(listener);
    return () => this.#listeners.delete(listener);
  }

  /**
   * First run: sets the passphrase and leaves the vault unlocked. Throws StoreError
   * ValidationFailed if a passphrase is already set or the new one is under 8 characters.
   */
  async setup(passphrase: string): Promise<void> {
    if (this.#record) throw new StoreError('ValidationFailed', 'a vault passphrase is already set; use changePassphrase');
    checkStrength(passphrase);
    const rawKey = this.options.randomBytes(32);
    const salt = this.options.randomBytes(16);
    const wrapKey = await deriveKey(passphrase, salt, this.options.iterations);
    const record: VaultRecord = {
      version: 1,
      salt: bytesToBase64(salt),
      iterations: this.options.iterations,
      wrappedKey: await sealBytes(wrapKey, rawKey, WRAP_AAD, this.options.randomBytes(12)),
      createdAt: new Date(this.options.now()).toISOString(),
    };
    const key = await importAesKey(rawKey);
    rawKey.fill(0);
    await this.persistence.write(record);
    this.#record = record;
    this.#setKey(key);
  }

  /** Opens the vault. Throws StoreError WrongPassphrase (nothing written) or Locked if none is set. */
  async unlock(passphrase: string): Promise<void> {
    const record = this.#record;
    if (!record) throw new StoreError('Locked', 'no vault passphrase is set yet; set one first');
    const rawKey = await this.#unwrap(record, passphrase);
    const key = await importAesKey(rawKey);
    rawKey.fill(0);
    this.#setKey(key);
  }

  /** Locks now: names and notes become unreadable until the next unlock. */
  lock(): void {
    if (this.#timer !== undefined) this.options.timers.clearTimeout(this.#timer);
    this.#timer = undefined;
    if (this.#key === null) return;
    this.#key = null;
    this.#emit();
  }

  /**
   * Re-wraps the data key under a new passphrase. Throws WrongPassphrase when `oldPassphrase` does
   * not open the vault (nothing written).
   */
  async changePassphrase(oldPassphrase: string, newPassphrase: string): Promise<void> {
    const record = this.#record;
    if (!record) throw new StoreError('Locked', 'no vault passphrase is set yet; set one first');
    checkStrength(newPassphrase);
    const rawKey = await this.#unwrap(record, oldPassphrase);
    const salt = this.options.randomBytes(16);
    const wrapKey = await deriveKey(newPassphrase, salt, this.options.iterations);
    const next: VaultRecord = {
      ...record,
      salt: bytesToBase64(salt),
      iterations: this.options.iterations,
      wrappedKey: await sealBytes(wrapKey, rawKey, WRAP_AAD, this.options.randomBytes(12)),
    };
    const key = await importAesKey(rawKey);
    rawKey.fill(0);
    await this.persistence.write(next);
    this.#record = next;
    this.#setKey(key);
  }

  /** Sets the idle time after which the vault locks itself; null never locks on idle. */
  setIdleTimeoutMs(ms: number | null): void {
    if (ms !== null && !(ms > 0)) throw new RangeError('idle timeout must be above 0 ms, or null');
    this.#idleTimeoutMs = ms;
    this.touch();
  }

  /** Records user activity: restarts the idle countdown while unlocked. */
  touch(): void {
    if (this.#timer !== undefined) this.options.timers.clearTimeout(this.#timer);
    this.#timer = undefined;
    if (this.#key !== null && this.#idleTimeoutMs !== null) {
      this.#timer = this.options.timers.setTimeout(() => this.lock(), this.#idleTimeoutMs);
    }
  }

  /** Encrypts protected text bound to `aad`. Throws StoreError Locked while locked. */
  async seal(text: string, aad: string): Promise<SealedText> {
    const key = this.#requireKey();
    this.touch();
    return sealText(key, text, aad, this.options.randomBytes(12));
  }

  /** Decrypts protected text. Throws Locked while locked, Unknown if the ciphertext is damaged. */
  async open(sealed: SealedText, aad: string): Promise<string> {
    const key = this.#requireKey();
    this.touch();
    try {
      return await openText(key, sealed, aad);
    } catch (cause) {
      throw new StoreError('Unknown', `protected text for ${aad} could not be decrypted: it is damaged`, { cause });
    }
  }

  #requireKey(): CryptoKey {
    if (this.#key === null) {
      throw new StoreError('Locked', this.#record ? 'names and notes are locked; unlock with the passphrase' : 'set a vault passphrase before entering names or notes');
    }
    return this.#key;
  }

  async #unwrap(record: VaultRecord, passphrase: string): Promise<Uint8Array> {
    if (passphrase.length === 0) throw new StoreError('WrongPassphrase', 'wrong passphrase');
    const wrapKey = await deriveKey(passphrase, base64ToBytes(record.salt), record.iterations);
    try {
      return await openBytes(wrapKey, record.wrappedKey, WRAP_AAD);
    } catch (cause) {
      throw new StoreError('WrongPassphrase', 'wrong passphrase: the vault stays locked and nothing was changed', { cause });
    }
  }

  #setKey(key: CryptoKey): void {
    this.#key = key;
    this.touch();
    this.#emit();
  }

  #emit(): void {
    const status = this.status;
    for (const listener of this.#listeners) listener(status);
  }
}

function checkStrength(passphrase: string): void {
  if ([...passphrase].length < 8) {
    throw new StoreError('ValidationFailed', 'the passphrase needs at least 8 characters', {
      issues: [{ record: 'vault', path: 'passphrase', message: 'at least 8 characters' }],
    });
  }
}
