// Plays a table of devicemotion rows in the page, for the phone-sensor browser tests: one event every
// 16 ms, the row chosen by the page's clock at `rateHz`, so a late timer on a loaded machine skips rows
// as a real phone would, never slows the motion down.
import type { Page } from 'playwright-core';

type MotionState = { release: number | null; hold: number | null; table: number[][]; sent: number };
const RATE_HZ = 100;

/**
 * Starts the events from `table` (rows [alpha, beta, gamma, x, y, z]): before release, rows
 * [0, holdRows) in a loop (the whole table when holdRows is not given); after releaseMotion, from
 * row holdRows on, holding the last row.
 */
export async function playMotion(page: Page, table: number[][], holdRows?: number): Promise<void> {
  await page.evaluate(
    ({ table, hold, rateHz }) => {
      const w = window as unknown as { __motion: MotionState };
      w.__motion = { release: null, hold, table, sent: 0 };
      window.setInterval(() => {
        const m = w.__motion;
        m.sent++;
        const holdRows = m.hold ?? m.table.length;
        const k =
          m.release === null
            ? Math.floor((performance.now() * rateHz) / 1000) % Math.max(1, holdRows)
            : Math.min(m.table.length - 1, holdRows + Math.floor(((performance.now() - m.release) * rateHz) / 1000));
        const [alpha, beta, gamma, x, y, z] = m.table[k] as number[];
        window.dispatchEvent(new DeviceMotionEvent('devicemotion', { rotationRate: { alpha, beta, gamma }, accelerationIncludingGravity: { x, y, z }, interval: 16 }));
      }, 16);
    },
    { table, hold: holdRows ?? null, rateHz: RATE_HZ },
  );
}

/** Lets go: the rows after the hold play once, by time. */
export async function releaseMotion(page: Page): Promise<void> {
  await page.evaluate(() => {
    (window as unknown as { __motion: MotionState }).__motion.release = performance.now();
  });
}

/** Swaps the played table; the hold and the release stay as they were. */
export async function swapMotionTable(page: Page, table: number[][]): Promise<void> {
  await page.evaluate((t) => {
    (window as unknown as { __motion: MotionState }).__motion.table = t;
  }, table);
}

/**
 * Waits until `count` more events have been dispatched (a condition on the data the page received,
 * not on the clock: a loaded machine that fires the timer late simply waits longer).
 */
export async function waitForMotionEvents(page: Page, count: number, what: string): Promise<void> {
  const from = await page.evaluate(() => (window as unknown as { __motion: MotionState }).__motion.sent);
  await page
    .waitForFunction((target) => (window as unknown as { __motion: MotionState }).__motion.sent >= target, from + count, { timeout: 30_000, polling: 50 })
    .catch((error: unknown) => {
      throw new Error(`waiting for ${count} more devicemotion events (${what}): ${String(error).split('\n')[0]}`);
    });
}
