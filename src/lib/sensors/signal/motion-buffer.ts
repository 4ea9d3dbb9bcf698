import type { MotionRecording } from './motion-recording';

/**
 * A growing recording for live capture: seven Float64Array columns that double when full, so a
 * sample costs no allocation in the common case. Samples whose time does not move forward are
 * ignored (and counted), which keeps the recording's times strictly increasing.
 */
export class MotionBuffer {
  #columns: Float64Array[];
  #length = 0;
  #ignored = 0;

  constructor(initialCapacity = 1024) {
    this.#columns = Array.from({ length: 7 }, () => new Float64Array(Math.max(16, initialCapacity)));
  }

  get length(): number {
    return this.#length;
  }

  /** Samples refused because their time did not increase. */
  get ignored(): number {
    return this.#ignored;
  }

  /** Appends one sample; returns false (and counts it) when its time is not after the last one. */
  push(timeMs: number, alphaDps: number, betaDps: number, gammaDps: number, xMs2: number, yMs2: number, zMs2: number): boolean {
    const n = this.#length;
    if (n > 0 && !(timeMs > this.#columns[0][n - 1])) {
      this.#ignored++;
      return false;
    }
    if (n === this.#columns[0].length) {
      this.#columns = this.#columns.map((c) => {
        const bigger = new Float64Array(c.length * 2);
        bigger.set(c);
        return bigger;
      });
    }
    const c = this.#columns;
    c[0][n] = timeMs;
    c[1][n] = alphaDps;
    c[2][n] = betaDps;
    c[3][n] = gammaDps;
    c[4][n] = xMs2;
    c[5][n] = yMs2;
    c[6][n] = zMs2;
    this.#length = n + 1;
    return true;
  }

  /** Empties the buffer (keeps its memory). */
  clear(): void {
    this.#length = 0;
    this.#ignored = 0;
  }

  /** A copy of the samples so far, as a MotionRecording (optionally from sample `from`). */
  snapshot(from = 0): MotionRecording {
    const [timeMs, rateAlphaDps, rateBetaDps, rateGammaDps, accXMs2, accYMs2, accZMs2] = this.#columns.map((c) => c.slice(from, this.#length));
    return { timeMs, rateAlphaDps, rateBetaDps, rateGammaDps, accXMs2, accYMs2, accZMs2 };
  }

  /** A view (no copy) valid until the next push. */
  view(): MotionRecording {
    const [timeMs, rateAlphaDps, rateBetaDps, rateGammaDps, accXMs2, accYMs2, accZMs2] = this.#columns.map((c) => c.subarray(0, this.#length));
    return { timeMs, rateAlphaDps, rateBetaDps, rateGammaDps, accXMs2, accYMs2, accZMs2 };
  }
}
