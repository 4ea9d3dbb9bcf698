/**
 * Fixed-window attempt counter per key (the client address): at most `limit` attempts per
 * `windowMs`. In memory: a restart forgets it, which costs an attacker a restart they cannot cause.
 */
export class RateLimit {
  private readonly windows = new Map<string, { start: number; count: number }>();
  constructor(
    private readonly limit: number,
    private readonly windowMs: number,
    private readonly now: () => number = () => Date.now(),
  ) {}

  /** Counts one attempt; returns the milliseconds to wait when over the limit, else 0. */
  hit(key: string): number {
    const t = this.now();
    let w = this.windows.get(key);
    if (!w || t - w.start >= this.windowMs) {
      w = { start: t, count: 0 };
      this.windows.set(key, w);
      if (this.windows.size > 10_000) this.sweep(t);
    }
    w.count++;
    return w.count > this.limit ? w.start + this.windowMs - t : 0;
  }

  private sweep(t: number): void {
    for (const [key, w] of this.windows) if (t - w.start >= this.windowMs) this.windows.delete(key);
  }
}
