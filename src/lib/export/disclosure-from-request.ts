import type { Identity, RandomBytes } from '../domain';
import type { Disclosure } from './prepare-disclosure';

/**
 * Who the export may name, as a page or the command asks for it. The per-export HMAC key and the
 * date offsets are drawn by disclosureFromRequest and never leave the export or get saved.
 */
export type CohortDisclosureRequest =
  | { readonly kind: 'deidentified'; readonly dates: 'days-from-baseline' | 'shifted'; readonly maxShiftDays?: number }
  /** Only from an unlocked vault (or a decrypted backup); the caller logs the export first. */
  | { readonly kind: 'identified'; readonly identities: readonly Identity[] };

/**
 * A uniform in [0, 1) with 53 random bits from a byte source (two 32-bit words: 32 + 21 bits), as
 * Math.random's range but from a cryptographic source at the edges.
 *
 * @example
 * const uniform = uniformFromBytes((n) => crypto.getRandomValues(new Uint8Array(n)));
 * uniform(); // e.g. 0.7316…
 */
function uniformFromBytes(randomBytes: RandomBytes): () => number {
  return () => {
    const bytes = randomBytes(8);
    const view = new DataView(bytes.buffer, bytes.byteOffset, 8);
    return (view.getUint32(0) * 2 ** 21 + (view.getUint32(4) >>> 11)) / 2 ** 53;
  };
}

/**
 * The Disclosure for a request: identified passes the identities on; de-identified draws a fresh
 * 32-byte HMAC key and, for shifted dates, offsets from `randomBytes` (a cryptographic source:
 * crypto.getRandomValues in the page and the worker, node:crypto in the command).
 */
export function disclosureFromRequest(request: CohortDisclosureRequest, randomBytes: RandomBytes): Disclosure {
  if (request.kind === 'identified') return { kind: 'identified', identities: request.identities };
  return {
    kind: 'deidentified',
    keyBytes: randomBytes(32),
    dates: request.dates === 'shifted' ? { kind: 'shifted', rng: uniformFromBytes(randomBytes), maxShiftDays: request.maxShiftDays } : { kind: 'days-from-baseline' },
  };
}
