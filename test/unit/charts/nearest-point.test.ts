import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { nearestPoint } from '../../../src/lib/charts/nearest-point';

const identity = (v: number) => v;

describe('nearestPoint', () => {
  it('picks by screen distance, not by data units', () => {
    // Two points; in data units the second is nearer in y, on screen (y scaled ×100) the first is nearer.
    const xs = [0, 10];
    const ys = [1, 0];
    expect(nearestPoint(xs, ys, identity, (y) => y * 100, 4, 100)).toBe(0);
    expect(nearestPoint(xs, ys, identity, identity, 6, 0)).toBe(1);
  });

  it('skips null and non-finite values and answers null when nothing is left', () => {
    expect(nearestPoint([0, 1, 2], [null, Number.NaN, 5], identity, identity, 0, 0)).toBe(2);
    expect(nearestPoint([0, 1], [null, undefined], identity, identity, 0, 0)).toBeNull();
    expect(nearestPoint([], [], identity, identity, 0, 0)).toBeNull();
  });

  it('agrees with a brute-force sort of the distances (property)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.tuple(fc.integer({ min: -500, max: 500 }), fc.integer({ min: -500, max: 500 })), { minLength: 1, maxLength: 60 }),
        fc.integer({ min: -600, max: 600 }),
        fc.integer({ min: -600, max: 600 }),
        (points, px, py) => {
          const xs = points.map((p) => p[0]);
          const ys = points.map((p) => p[1]);
          const found = nearestPoint(xs, ys, identity, identity, px, py) as number;
          const distances = points.map(([x, y]) => Math.hypot(x - px, y - py));
          expect(distances[found]).toBe(Math.min(...distances));
        },
      ),
    );
  });
});
