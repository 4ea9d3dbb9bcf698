import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { ProgrammeTransferError, QrPartCollector, splitIntoQrParts } from '../../../src/lib/programme';
import { fnv1a32Hex } from '../../../src/lib/programme/qr-chunks';

describe('QR parts', () => {
  it('FNV-1a 32-bit matches the published test vectors', () => {
    // Test vectors from the FNV reference (draft-eastlake-fnv, appendix): "" → 811c9dc5, "a" → e40c292c, "foobar" → bf9cf968 (from memory).
    expect(fnv1a32Hex('')).toBe('811c9dc5');
    expect(fnv1a32Hex('a')).toBe('e40c292c');
    expect(fnv1a32Hex('foobar')).toBe('bf9cf968');
  });

  it('splits and reassembles any text, whatever the scan order and repeats', () => {
    fc.assert(
      fc.property(fc.string({ minLength: 0, maxLength: 3000 }), fc.integer({ min: 50, max: 800 }), fc.integer(), (text, size, seed) => {
        const parts = splitIntoQrParts(text, size, 100);
        expect(parts).not.toBeNull();
        const order = parts!.map((p, i) => ({ p, k: Math.sin(seed + i) }));
        order.sort((a, b) => a.k - b.k);
        const collector = new QrPartCollector();
        let result: ReturnType<QrPartCollector['add']> | null = null;
        for (const { p } of [...order, order[0]!]) {
          result = collector.add(p);
          if (result.kind === 'complete') break;
        }
        expect(result).toEqual({ kind: 'complete', text });
      }),
    );
  });

  it('gives up beyond the most parts allowed', () => {
    expect(splitIntoQrParts('x'.repeat(701), 700, 1)).toBeNull();
    expect(splitIntoQrParts('x'.repeat(700), 700, 1)).toHaveLength(1);
  });

  it('refuses a part of another file mid-way, and codes that are not ours', () => {
    const a = splitIntoQrParts('A'.repeat(1500), 700)!;
    const b = splitIntoQrParts('B'.repeat(1500), 700)!;
    const c = new QrPartCollector();
    expect(c.add(a[0]!)).toEqual({ kind: 'added', have: 1, of: 3 });
    expect(c.add(b[1]!).kind).toBe('other-file');
    expect(c.add(a[0]!)).toEqual({ kind: 'repeat', have: 1, of: 3 });
    expect(c.missing).toEqual([2, 3]);
    expect(c.add('https://example.org').kind).toBe('not-ours');
    expect(c.add('KNQ1 00000000 4/3 x').kind).toBe('not-ours');
  });

  it('detects a misread part when the whole does not match its set name', () => {
    const parts = splitIntoQrParts('hello world, this is a programme', 10)!;
    const c = new QrPartCollector();
    c.add(parts[0]!);
    c.add(parts[1]!.replace('this', 'th1s'));
    c.add(parts[2]!);
    expect(() => c.add(parts[3]!)).toThrow(ProgrammeTransferError);
  });
});
