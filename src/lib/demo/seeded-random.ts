/**
 * A small seeded pseudo-random source for the demo scenario and tests: mulberry32 (a 32-bit
 * generator by Tommy Ettinger, public domain; period 2^32), plus helpers. Not for cryptography.
 * Same seed → same sequence on every platform (only 32-bit integer arithmetic and Math.imul).
 */
export class SeededRandom {
  #state: number;

  constructor(seed: number) {
    if (!Number.isFinite(seed)) throw new RangeError(`seed must be a finite number, not ${seed}`);
    // Mix the seed once so that nearby seeds (1, 2, 3) start far apart.
    this.#state = Math.imul((Math.trunc(seed) ^ 0x9e3779b9) >>> 0, 0x85ebca6b) >>> 0;
  }

  /** Next 32-bit unsigned integer. */
  nextUint32(): number {
    this.#state = (this.#state + 0x6d2b79f5) >>> 0;
    let t = this.#state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return (t ^ (t >>> 14)) >>> 0;
  }

  /** Uniform in [0, 1). */
  next(): number {
    return this.nextUint32() / 4294967296;
  }

  /** Uniform in [min, max). */
  uniform(min: number, max: number): number {
    return min + (max - min) * this.next();
  }

  /** Uniform integer in [min, max] inclusive. */
  int(min: number, max: number): number {
    return min + Math.floor(this.next() * (max - min + 1));
  }

  /** Normal(mean, sd) by the Box–Muller transform (one of the pair; simple beats fast here). */
  normal(mean: number, sd: number): number {
    const u = 1 - this.next(); // (0, 1]: log(0) would be -Infinity
    const v = this.next();
    return mean + sd * Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * v);
  }

  /** True with probability p. */
  chance(p: number): boolean {
    return this.next() < p;
  }

  pick<T>(items: readonly T[]): T {
    if (items.length === 0) throw new RangeError('pick from an empty list');
    return items[Math.floor(this.next() * items.length)] as T;
  }

  /** `length` pseudo-random bytes (for demo ids and codes; not secret). */
  bytes(length: number): Uint8Array {
    const out = new Uint8Array(length);
    for (let i = 0; i < length; i++) out[i] = this.nextUint32() & 0xff;
    return out;
  }
}
