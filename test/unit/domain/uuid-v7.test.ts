import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { createUuidV7Generator, formatUuidV7 } from '../../../src/lib/domain';
import { isUuidV7, uuidV7Time } from '../../../src/lib/domain/uuid-v7';

const hexToBytes = (hex: string) => Uint8Array.from(hex.match(/../g)!.map((h) => parseInt(h, 16)));

const seededBytes = (seed: number) => {
  let s = seed >>> 0;
  return (n: number) => {
    const out = new Uint8Array(n);
    for (let i = 0; i < n; i++) {
      s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
      out[i] = s >>> 24;
    }
    return out;
  };
};

describe('formatUuidV7', () => {
  it('reproduces the RFC 9562 Appendix A.6 example', () => {
    // RFC 9562 A.6 (from memory of the RFC text): unix_ts_ms 0x017F22E279B0, rand_a 0xCC3,
    // rand_b 0x18C4DC0C0C07398F → 017F22E2-79B0-7CC3-98C4-DC0C0C07398F (2022-02-22T19:22:22Z).
    const fixture = {
      input: { ms: 0x017f22e279b0, randA: 0xcc3, randB: hexToBytes('18c4dc0c0c07398f') },
      expected: '017f22e2-79b0-7cc3-98c4-dc0c0c07398f',
      source: 'RFC 9562 Appendix A.6 (from memory)',
    };
    expect(formatUuidV7(fixture.input.ms, fixture.input.randA, fixture.input.randB)).toBe(fixture.expected);
    expect(new Date(uuidV7Time(fixture.expected)).toISOString()).toBe('2022-02-22T19:22:22.000Z');
  });

  it('sets version 7 and variant 0b10 for any input, and keeps the time (property)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 2 ** 48 - 1 }), fc.integer({ min: 0, max: 0xfff }), fc.uint8Array({ minLength: 8, maxLength: 8 }), (ms, randA, randB) => {
        const id = formatUuidV7(ms, randA, randB);
        expect(isUuidV7(id)).toBe(true);
        expect(id[14]).toBe('7');
        expect(['8', '9', 'a', 'b']).toContain(id[19]);
        expect(uuidV7Time(id)).toBe(ms);
        expect(parseInt(id.slice(15, 18), 16)).toBe(randA);
      }),
    );
  });

  it('refuses times outside 48 bits', () => {
    expect(() => formatUuidV7(-1, 0, new Uint8Array(8))).toThrow(RangeError);
    expect(() => formatUuidV7(2 ** 48, 0, new Uint8Array(8))).toThrow(RangeError);
    expect(() => uuidV7Time('not-an-id')).toThrow(RangeError);
  });
});

describe('createUuidV7Generator', () => {
  it('sorts in creation order within one millisecond', () => {
    const next = createUuidV7Generator(() => 1_700_000_000_000, seededBytes(1));
    const ids = Array.from({ length: 3000 }, next);
    expect([...ids].sort()).toEqual(ids);
    expect(new Set(ids).size).toBe(ids.length);
  });

  it('stays ordered when the clock steps back', () => {
    const times = [1000, 2000, 1500, 1500, 900, 2500];
    let i = 0;
    const next = createUuidV7Generator(() => times[i++]!, seededBytes(2));
    const ids = times.map(() => next());
    expect([...ids].sort()).toEqual(ids);
    expect(uuidV7Time(ids[2]!)).toBe(2000);
  });

  it('advances the timestamp when the 12-bit counter overflows', () => {
    // Counter seeds from the last two random bytes masked to 0x7ff: all-0xff bytes start it at 2047.
    const next = createUuidV7Generator(() => 5000, (n) => new Uint8Array(n).fill(0xff));
    const ids = Array.from({ length: 2050 }, next);
    expect(uuidV7Time(ids[0]!)).toBe(5000);
    expect(uuidV7Time(ids[2048]!)).toBe(5000);
    expect(uuidV7Time(ids[2049]!)).toBe(5001);
    expect([...ids].sort()).toEqual(ids);
  });

  it('orders ids from increasing times (property)', () => {
    fc.assert(
      fc.property(fc.array(fc.integer({ min: 0, max: 1000 }), { minLength: 1, maxLength: 200 }), fc.integer(), (steps, seed) => {
        let t = 1_600_000_000_000;
        let k = 0;
        const next = createUuidV7Generator(() => (t += steps[k++ % steps.length]!), seededBytes(seed));
        const ids = steps.map(() => next());
        expect([...ids].sort()).toEqual(ids);
      }),
    );
  });
});

describe('createUuidV7Generator many (ids in batches)', () => {
  const countingBytes = () => {
    let s = 12345;
    const calls: number[] = [];
    const bytes = (n: number) => {
      calls.push(n);
      const out = new Uint8Array(n);
      for (let i = 0; i < n; i++) {
        s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
        out[i] = s >>> 24;
      }
      return out;
    };
    return { bytes, calls };
  };
  /** The id rebuilt from its parts by formatUuidV7 (which reproduces the RFC 9562 example above). */
  const reformatted = (id: string) => {
    const h = id.replace(/-/g, '');
    return formatUuidV7(uuidV7Time(id), parseInt(h.slice(13, 16), 16), hexToBytes(h.slice(16, 32)));
  };

  it('reads the clock once and draws randomness once per batch; ids are RFC 9562 version 7, sorted and unique', () => {
    const { bytes, calls } = countingBytes();
    let readings = 0;
    const gen = createUuidV7Generator(() => (readings++, 1_750_000_000_000.7), bytes);
    const ids = gen.many(5000);
    expect(readings).toBe(1);
    expect(calls).toEqual([5000 * 8 + 2]);
    expect(ids).toHaveLength(5000);
    expect(ids.every(isUuidV7)).toBe(true);
    expect(ids.every((id) => reformatted(id) === id)).toBe(true);
    expect([...ids].sort()).toEqual(ids);
    expect(new Set(ids).size).toBe(5000);
    expect(uuidV7Time(ids[0]!)).toBe(1_750_000_000_000);
    // 5,000 ids from one reading outrun the 12-bit counter: the timestamp moves on, as RFC 9562 §6.2 allows.
    expect(uuidV7Time(ids[4999]!)).toBeGreaterThan(1_750_000_000_000);
    expect(uuidV7Time(ids[4999]!)).toBeLessThanOrEqual(1_750_000_000_000 + 3);
  });

  it('keeps 62 fresh random bits per id: rand_b is the drawn bytes with the variant bits set', () => {
    const { bytes } = countingBytes();
    const drawn: Uint8Array[] = [];
    const gen = createUuidV7Generator(() => 1_000, (n) => {
      const b = bytes(n);
      drawn.push(b);
      return b;
    });
    const ids = gen.many(3);
    ids.forEach((id, i) => {
      const h = id.replace(/-/g, '');
      const expected = Array.from(drawn[0]!.subarray(i * 8, i * 8 + 8), (b, k) => (k === 0 ? 0x80 | (b & 0x3f) : b));
      expect(Array.from(hexToBytes(h.slice(16, 32)))).toEqual(expected);
    });
  });

  it('advances the timestamp when the counter overflows inside a batch', () => {
    // All-0xff randomness seeds the counter at 2047: ids 0..2048 share the millisecond, 2049 is the next.
    const gen = createUuidV7Generator(() => 5000, (n) => new Uint8Array(n).fill(0xff));
    const ids = gen.many(2050);
    expect(uuidV7Time(ids[2048]!)).toBe(5000);
    expect(uuidV7Time(ids[2049]!)).toBe(5001);
    expect(parseInt(ids[2049]!.slice(15, 18), 16)).toBe(0);
    expect([...ids].sort()).toEqual(ids);
  });

  it('stays in creation order mixed with single ids, batches of any size and a clock that steps back (property)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.tuple(fc.integer({ min: -3000, max: 3000 }), fc.integer({ min: 0, max: 300 })), { minLength: 1, maxLength: 60 }),
        fc.integer(),
        (steps, seed) => {
          let t = 1_600_000_000_000;
          let k = 0;
          const gen = createUuidV7Generator(() => (t += steps[k++ % steps.length]![0]), seededBytes(seed));
          const ids: string[] = [];
          for (const [, count] of steps) {
            if (count % 7 === 0) ids.push(gen());
            else ids.push(...gen.many(count));
          }
          expect([...ids].sort()).toEqual(ids);
          expect(new Set(ids).size).toBe(ids.length);
          expect(ids.every(isUuidV7)).toBe(true);
        },
      ),
      { numRuns: 200 },
    );
  });

  it('gives nothing for a batch of none and refuses a clock outside 48 bits', () => {
    const gen = createUuidV7Generator(() => -5, (n) => new Uint8Array(n));
    expect(gen.many(0)).toEqual([]);
    expect(() => gen.many(2)).toThrow(RangeError);
    expect(() => gen()).toThrow(RangeError);
  });
});
