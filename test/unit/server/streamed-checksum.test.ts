import { describe, expect, it } from 'vitest';
import { StreamedChecksum } from '../../server-load/load-run';

// The load bench's constant-memory checksum (each simulated device's record set). Expected sums were
// computed outside the project with Python's hashlib: (int(sha256(b'alpha')) + int(sha256(b'beta'))) mod 2**256,
// and the same with 'alpha' twice (that sum wraps past 2**256, so it also checks the modulus).
const digestOf = (texts: string[]) => {
  const c = new StreamedChecksum();
  for (const t of texts) c.add(t);
  return c.digest();
};

describe('StreamedChecksum', () => {
  it('is the count and the sum of SHA-256 digests modulo 2^256 (Python hashlib oracle)', () => {
    expect(digestOf(['alpha', 'beta'])).toBe('2:83225b94c794de88a4afb04c228d13b9c0e2addb524146e68eff2ed05ee14b4b');
    expect(digestOf(['alpha', 'beta', 'alpha'])).toBe('3:11f652422ff07427521fd29db0a80b2698f9a6c43ebe14c0add3305eee036f43');
  });

  it('does not depend on the order of arrival, and sees a duplicate, a loss or a change', () => {
    const texts = Array.from({ length: 200 }, (_, i) => `{"id":"r${i}","v":${(i * 37) % 11}}`);
    const shuffled = [...texts].reverse().sort((a, b) => (a.length % 3) - (b.length % 3));
    expect(digestOf(shuffled)).toBe(digestOf(texts));
    expect(digestOf([...texts, texts[5]!])).not.toBe(digestOf(texts));
    expect(digestOf(texts.slice(1))).not.toBe(digestOf(texts));
    expect(digestOf([...texts.slice(1), texts[0]!.replace('"v":0', '"v":1')])).not.toBe(digestOf(texts));
  });
});
