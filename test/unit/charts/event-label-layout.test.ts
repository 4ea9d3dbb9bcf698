import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { layoutEventLabels } from '../../../src/lib/charts/event-label-layout';

describe('layoutEventLabels', () => {
  it('keeps far-apart labels in one row, right of their lines', () => {
    const { placed, rows } = layoutEventLabels([{ x: 10, width: 40 }, { x: 100, width: 40 }], 0, 300, 6);
    expect(rows).toBe(1);
    expect(placed).toEqual([{ left: 13, row: 0 }, { left: 103, row: 0 }]);
  });

  it('puts a close label on the next row and flips a label at the right edge to the left of its line', () => {
    const { placed, rows } = layoutEventLabels([{ x: 10, width: 80 }, { x: 40, width: 80 }, { x: 290, width: 50 }], 0, 300, 6);
    expect(rows).toBe(2);
    expect(placed[1]?.row).toBe(1);
    expect(placed[2]).toEqual({ left: 290 - 3 - 50, row: 0 });
  });

  it('never overlaps within a row and never leaves [left, right] when a label fits (property)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.tuple(fc.integer({ min: 40, max: 400 }), fc.integer({ min: 5, max: 120 })), { maxLength: 12 }),
        (list) => {
          const items = list.map(([x, width]) => ({ x, width })).sort((a, b) => a.x - b.x);
          const { placed, rows } = layoutEventLabels(items, 40, 400, 6);
          expect(placed).toHaveLength(items.length);
          for (let i = 0; i < items.length; i++) {
            const p = placed[i]!;
            expect(p.left).toBeGreaterThanOrEqual(40);
            expect(p.left + items[i]!.width).toBeLessThanOrEqual(400 + 1e-9);
            expect(p.row).toBeLessThan(rows);
            for (let j = 0; j < i; j++) {
              const q = placed[j]!;
              if (q.row !== p.row) continue;
              const apart = q.left + items[j]!.width <= p.left || p.left + items[i]!.width <= q.left;
              expect(apart).toBe(true);
            }
          }
        },
      ),
    );
  });
});
