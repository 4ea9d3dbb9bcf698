import { CompensatedAccumulator } from '../../stats';

/** Mean of values[from..to). */
export function mean(values: Float64Array, from: number, to: number): number {
  let sum = 0;
  for (let i = from; i < to; i++) sum += values[i];
  return sum / (to - from);
}

/** Per-axis means of three columns over [from, to). */
export function meanVector(x: Float64Array, y: Float64Array, z: Float64Array, from: number, to: number): Float64Array {
  return Float64Array.of(mean(x, from, to), mean(y, from, to), mean(z, from, to));
}

export function norm(v: ArrayLike<number>): number {
  return Math.hypot(v[0], v[1], v[2]);
}

export function dot(a: ArrayLike<number>, b: ArrayLike<number>): number {
  return a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
}

/** Wraps an angle difference into (−180, 180]. */
export function wrap180(deg: number): number {
  const r = deg - 360 * Math.floor((deg + 180) / 360);
  return r === -180 ? 180 : r;
}

/** Moving mean of value(i) over ±halfWindowMs (two pointers, O(n)). */
export function movingMean(timeMs: Float64Array, value: (i: number) => number, halfWindowMs: number): Float64Array {
  const n = timeMs.length;
  const values = new Float64Array(n);
  for (let i = 0; i < n; i++) values[i] = value(i);
  const out = new Float64Array(n);
  let lo = 0;
  let hi = 0;
  let sum = 0;
  for (let i = 0; i < n; i++) {
    while (hi < n && timeMs[hi] <= timeMs[i] + halfWindowMs) sum += values[hi++];
    while (timeMs[lo] < timeMs[i] - halfWindowMs) sum -= values[lo++];
    out[i] = sum / (hi - lo);
  }
  return out;
}

/** Largest distance between a block mean of a vector column and the window's mean (blocks of blockMs). */
export function blockSpread(timeMs: Float64Array, x: Float64Array, y: Float64Array, z: Float64Array, from: number, to: number, blockMs: number): number {
  const overall = meanVector(x, y, z, from, to);
  let worst = 0;
  let start = from;
  while (start < to) {
    let end = start;
    while (end < to && timeMs[end] < timeMs[start] + blockMs) end++;
    const block = meanVector(x, y, z, start, end);
    worst = Math.max(worst, Math.hypot(block[0] - overall[0], block[1] - overall[1], block[2] - overall[2]));
    start = end;
  }
  return worst;
}

/** Trapezoidal integral of a rate (deg/s) over time stamps (ms), from 0; Neumaier-compensated. */
export function integrateRate(timeMs: Float64Array, rateDps: Float64Array, out: Float64Array): void {
  const sum = new CompensatedAccumulator();
  out[0] = 0;
  for (let i = 1; i < timeMs.length; i++) {
    sum.add(0.5 * (rateDps[i] + rateDps[i - 1]) * ((timeMs[i] - timeMs[i - 1]) / 1000));
    out[i] = sum.total;
  }
}

/** Knee flexion (deg) from a gravity reading g (points up), knee axis k and shank line s (unit, ⊥ k). */
export function flexionFromGravity(g: Float64Array, k: Float64Array, s: Float64Array): number {
  // Downward direction d = −g; flexion θ satisfies d·s = sin θ·|d⊥|, d·(k × s) = cos θ·|d⊥|.
  const e0 = k[1] * s[2] - k[2] * s[1];
  const e1 = k[2] * s[0] - k[0] * s[2];
  const e2 = k[0] * s[1] - k[1] * s[0];
  const alongS = -(g[0] * s[0] + g[1] * s[1] + g[2] * s[2]);
  const alongE = -(g[0] * e0 + g[1] * e1 + g[2] * e2);
  return Math.atan2(alongS, alongE) / (Math.PI / 180);
}
