// The caseload with a large number of patients in Chromium: how long after navigation its first rows
// are painted (full page load, in-app link, going back), and the data read the previous way (every
// patient, assessment and observation, summarised on open) against the stored per-patient
// summaries, in the same page. Size: CASELOAD_BENCH_PATIENTS (default 5,000; each patient gets one
// assessment and two observations, as in the caseload browser test). Needs a build and Chromium.
import { existsSync } from 'node:fs';
import { cpus, loadavg } from 'node:os';
import { chromium, type Page } from 'playwright-core';
import { startStaticServer } from '../../src/cli/commands/serve';
import { bundleForPage } from '../e2e/bundle-for-page';
import { setUpDevice } from '../e2e/app-helpers';

const GOAL_MS = 200;

/**
 * Milliseconds from `act` to the first caseload row in the page, measured inside the page. Passed
 * as text: tsx would wrap named inner functions in a helper the page does not have.
 */
async function firstRowAfter(page: Page, act: 'click-caseload' | 'back'): Promise<number> {
  const trigger = act === 'back' ? 'history.back()' : `document.querySelector('nav[aria-label="Main"] a[href="/patients"]').click()`;
  return (await page.evaluate(`new Promise((resolve) => {
    const start = performance.now();
    const observer = new MutationObserver(() => {
      if (document.querySelector('a.row')) {
        observer.disconnect();
        resolve(performance.now() - start);
      }
    });
    observer.observe(document.body, { childList: true, subtree: true });
    ${trigger};
  })`)) as number;
}

export async function run(print: (line: string) => void): Promise<void> {
  const chromePath = [process.env.CHROME_PATH, '/usr/bin/chromium'].find((p) => p && existsSync(p));
  if (!chromePath || !existsSync('build/index.html')) {
    print('skipped: needs Chromium and a production build (npm run build)');
    return;
  }
  const size = Number(process.env.CASELOAD_BENCH_PATIENTS ?? 5000);
  const bundle = await bundleForPage('test/e2e/in-page/store-checks.ts', 'kinnoteStoreChecks');
  const server = await startStaticServer('build', 0);
  const browser = await chromium.launch({ executablePath: chromePath, args: ['--disable-gpu', '--disable-quic', '--disable-background-networking'] });
  try {
    const context = await browser.newContext({ serviceWorkers: 'block', baseURL: server.url, viewport: { width: 1024, height: 768 } });
    // Records when the first caseload row appears after a full page load (ms since navigation start).
    // And when the app's shell (the main navigation) appears, to tell app start from the caseload's own work.
    await context.addInitScript(`new MutationObserver((_, observer) => {
      if (window.shellMs === undefined && document.querySelector('nav[aria-label="Main"]')) window.shellMs = performance.now();
      if (window.firstRowMs === undefined && document.querySelector('a.row')) {
        window.firstRowMs = performance.now();
        observer.disconnect();
      }
    }).observe(document, { childList: true, subtree: true });`);
    const page = await context.newPage();
    await setUpDevice(page, { demo: false });
    await page.evaluate(`${bundle}\n;undefined`);
    const filled = (await page.evaluate((n) => (globalThis as unknown as { fillCaseload: (n: number) => Promise<{ seconds: number }> }).fillCaseload(n), size)) as { seconds: number };
    print(`load average ${loadavg().map((l) => l.toFixed(1)).join(' ')} on ${cpus().length} cores; Chromium ${browser.version()}, caseload of ${size.toLocaleString('en')} patients (1 assessment, 2 observations each; written through the repositories in ${filled.seconds.toFixed(1)} s)`);

    for (let i = 1; i <= 3; i++) {
      await page.goto('/patients');
      await page.locator('a.row').first().waitFor({ timeout: 120_000 });
      const { ms, shellMs } = (await page.evaluate('({ ms: window.firstRowMs, shellMs: window.shellMs })')) as { ms: number; shellMs: number };
      print(
        `full page load of /patients #${i}: first rows ${Math.round(ms)} ms after navigation start (app shell at ${Math.round(shellMs)} ms, then store open and summaries read ${Math.round(ms - shellMs)} ms) · goal ${GOAL_MS} ms: ${(GOAL_MS / ms).toFixed(2)}× of goal`,
      );
    }
    for (let i = 1; i <= 3; i++) {
      await page.locator('nav[aria-label="Main"] a[href="/settings"]').click();
      await page.getByRole('heading', { level: 1 }).first().waitFor();
      const ms = await firstRowAfter(page, 'click-caseload');
      print(`in-app link to the caseload #${i}: first rows ${Math.round(ms)} ms after the click · goal ${GOAL_MS} ms: ${(GOAL_MS / ms).toFixed(2)}× of goal`);
    }
    for (let i = 1; i <= 3; i++) {
      await page.locator('a.row').first().click();
      await page.waitForURL(/\/patients\/[^/]+$/);
      await page.getByRole('heading', { level: 1 }).first().waitFor();
      const ms = await firstRowAfter(page, 'back');
      print(`back from a patient to the caseload #${i}: first rows ${Math.round(ms)} ms after history.back() · goal ${GOAL_MS} ms: ${(GOAL_MS / ms).toFixed(2)}× of goal`);
    }
    await page.evaluate(`${bundle}\n;undefined`);
    const read = (await page.evaluate(() => (globalThis as unknown as { caseloadReadTimes: () => Promise<unknown> }).caseloadReadTimes())) as {
      patients: number;
      observations: number;
      previousMs: number;
      storedMs: number;
      storedAgainMs: number;
      same: boolean;
    };
    print(
      `caseload data read, ${read.patients.toLocaleString('en')} patients / ${read.observations.toLocaleString('en')} observations: previous way (read everything, summarise on open) ${Math.round(read.previousMs)} ms, ` +
        `stored summaries ${Math.round(read.storedMs)} ms (again: ${Math.round(read.storedAgainMs)} ms) = ${(read.previousMs / read.storedMs).toFixed(1)}× faster; same figures: ${read.same ? 'yes' : 'NO'}`,
    );
  } finally {
    await browser.close();
    await server.close();
  }
}
