/** One event label to place: the event line's x and the label's width, both in the same pixels. */
export interface EventLabelItem {
  readonly x: number;
  readonly width: number;
}

/** Where a label goes: its left edge and its row (0 = the row nearest the plot). */
export interface PlacedEventLabel {
  readonly left: number;
  readonly row: number;
}

/**
 * Places event labels in rows above a plot so that none overlaps another and none leaves [left, right]
 * (where the axis labels sit). Each label starts just right of its line, or ends just left of it when it
 * would pass the right edge, then is clamped into the range; it takes the first row whose previous label
 * ends at least `gap` before it. Items must be sorted by x. Greedy interval colouring (first fit), so
 * labels keep their time order within each row. Cost: O(n · rows).
 */
export function layoutEventLabels(items: readonly EventLabelItem[], left: number, right: number, gap: number): { placed: PlacedEventLabel[]; rows: number } {
  const rowEnds: number[] = [];
  const placed: PlacedEventLabel[] = [];
  for (const item of items) {
    let start = item.x + gap / 2;
    if (start + item.width > right) start = item.x - gap / 2 - item.width;
    start = Math.max(left, Math.min(start, right - item.width));
    let row = rowEnds.findIndex((end) => end + gap <= start);
    if (row === -1) {
      row = rowEnds.length;
      rowEnds.push(0);
    }
    rowEnds[row] = start + item.width;
    placed.push({ left: start, row });
  }
  return { placed, rows: rowEnds.length };
}
