/** Fills and returns a buffer of `length` random bytes (crypto.getRandomValues at the edges, a seeded source in tests). */
export type RandomBytes = (length: number) => Uint8Array;

const HEX = Array.from({ length: 256 }, (_, i) => i.toString(16).padStart(2, '0'));
const UUID_V7_PATTERN = /^[0-9a-f]{8}-[0-9a-f]{4}-7[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/;
const MAX_UNIX_MS = 2 ** 48 - 1;

/**
 * Formats one UUIDv7 from its parts (RFC 9562 §5.7): 48-bit big-endian Unix milliseconds, 4-bit
 * version 0b0111, 12-bit `randA`, 2-bit variant 0b10, 62 bits from `randB` (its first 8 bytes; the two
 * top bits are overwritten by the variant). Throws RangeError for a time outside 0..2^48−1 ms.
 */
export function formatUuidV7(unixMs: number, randA: number, randB: Uint8Array): string {
  if (!Number.isInteger(unixMs) || unixMs < 0 || unixMs > MAX_UNIX_MS) {
    throw new RangeError(`uuidV7: time ${unixMs} ms is outside 0..2^48-1`);
  }
  if (randB.length < 8) throw new RangeError('uuidV7: randB needs 8 bytes');
  const bytes = new Uint8Array(16);
  // 48-bit timestamp, big-endian; split because bitwise operators work on 32 bits.
  const high = Math.floor(unixMs / 2 ** 16);
  bytes[0] = (high >>> 24) & 0xff;
  bytes[1] = (high >>> 16) & 0xff;
  bytes[2] = (high >>> 8) & 0xff;
  bytes[3] = high & 0xff;
  bytes[4] = (unixMs >>> 8) & 0xff;
  bytes[5] = unixMs & 0xff;
  bytes[6] = 0x70 | ((randA >>> 8) & 0x0f);
  bytes[7] = randA & 0xff;
  bytes[8] = 0x80 | ((randB[0] as number) & 0x3f);
  for (let i = 1; i < 8; i++) bytes[8 + i] = randB[i] as number;
  let s = '';
  for (let i = 0; i < 16; i++) {
    if (i === 4 || i === 6 || i === 8 || i === 10) s += '-';
    s += HEX[bytes[i] as number];
  }
  return s;
}

/**
 * Returns a generator of UUIDv7 strings that sort in creation order even within one millisecond
 * or when the clock steps back: RFC 9562 §6.2 method 1 (a 12-bit counter in rand_a, seeded at
 * random with its top bit clear at each new millisecond, incremented otherwise); when the counter
 * would overflow, the timestamp is advanced by 1 ms, as §6.2 allows. rand_b is fresh randomness.
 * Cost: one call to `randomBytes` per id.
 */
export function createUuidV7Generator(now: () => number, randomBytes: RandomBytes): () => string {
  let lastMs = -1;
  let counter = 0;
  return () => {
    let ms = Math.floor(now());
    const random = randomBytes(10);
    if (ms > lastMs) {
      lastMs = ms;
      // Top bit clear leaves at least 2048 increments before rollover within one millisecond.
      counter = (((random[8] as number) << 8) | (random[9] as number)) & 0x7ff;
    } else {
      ms = lastMs;
      counter++;
      if (counter > 0xfff) {
        lastMs++;
        ms = lastMs;
        counter = 0;
      }
    }
    return formatUuidV7(ms, counter, random);
  };
}

/** True when `id` is a lower-case UUID with version 7 and the RFC 9562 variant bits. */
export function isUuidV7(id: string): boolean {
  return UUID_V7_PATTERN.test(id);
}

/** The Unix millisecond timestamp held in the first 48 bits of a UUIDv7. Throws on a non-v7 id. */
export function uuidV7Time(id: string): number {
  if (!isUuidV7(id)) throw new RangeError(`not a UUIDv7: ${id}`);
  return parseInt(id.slice(0, 8) + id.slice(9, 13), 16);
}
