/**
 * The index of the point nearest to (pointerX, pointerY) in screen space, among the points whose value is
 * finite; null when there is none. Positions come from `toX` and `toY` (e.g. uPlot's valToPos), so the
 * distance is measured in pixels, as a person sees it, not in data units (days against degrees).
 * Cost: O(n) per call.
 */
export function nearestPoint(
  xs: ArrayLike<number>,
  ys: ArrayLike<number | null | undefined>,
  toX: (x: number) => number,
  toY: (y: number) => number,
  pointerX: number,
  pointerY: number,
): number | null {
  let best: number | null = null;
  let bestDistance = Infinity;
  const n = Math.min(xs.length, ys.length);
  for (let i = 0; i < n; i++) {
    const x = xs[i] as number;
    const y = ys[i];
    if (y === null || y === undefined || !Number.isFinite(y) || !Number.isFinite(x)) continue;
    const dx = toX(x) - pointerX;
    const dy = toY(y) - pointerY;
    const distance = dx * dx + dy * dy;
    if (distance < bestDistance) {
      bestDistance = distance;
      best = i;
    }
  }
  return best;
}
