// The caseload with a large number of patients in Chromium: how long after navigation its first rows
// are painted (full page load, in-app link, going back), and the data read the previous way (every
// patient, assessment and observation, summarised on open) against the stored per-patient
// summaries, in the same page. First on the demo caseload (5 runs each), then at size
// CASELOAD_BENCH_PATIENTS (default 5,000; 0 skips it; each patient gets one assessment and two
// observations, as in the caseload browser test). Needs a build and Chromium.
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

/** What a person waits for: first caseload rows after a full load, an in-app link and going back, `runs` times each. */
async function timeToFirstRows(page: Page, print: (line: string) => void, runs: number, label: string): Promise<void> {
  const all: Record<'full' | 'link' | 'back', number[]> = { full: [], link: [], back: [] };
  for (let i = 1; i <= runs; i++) {
    await page.goto('/patients');
    await page.locator('a.row').first().waitFor({ timeout: 120_000 });
    const { ms, shellMs } = (await page.evaluate('({ ms: window.firstRowMs, shellMs: window.shellMs })')) as { ms: number; shellMs: number };
    all.full.push(ms);
    print(
      `[${label}] full page load of /patients #${i}: first rows ${Math.round(ms)} ms after navigation start (app shell at ${Math.round(shellMs)} ms, then store open and summaries read ${Math.round(ms - shellMs)} ms) · goal ${GOAL_MS} ms: ${(GOAL_MS / ms).toFixed(2)}× of goal`,
    );
  }
  for (let i = 1; i <= runs; i++) {
    await page.locator('nav[aria-label="Main"] a[href="/settings"]').click();
    // The URL, not any heading: the caseload's own heading would let the click below race the navigation away (a hang).
    await page.waitForURL(/\/settings$/);
    await page.getByRole('heading', { level: 1 }).first().waitFor();
    const ms = await firstRowAfter(page, 'click-caseload');
    all.link.push(ms);
    print(`[${label}] in-app link to the caseload #${i}: first rows ${Math.round(ms)} ms after the click · goal ${GOAL_MS} ms: ${(GOAL_MS / ms).toFixed(2)}× of goal`);
  }
  for (let i = 1; i <= runs; i++) {
    await page.locator('a.row').first().click();
    await page.waitForURL(/\/patients\/[^/]+$/);
    await page.getByRole('heading', { level: 1 }).first().waitFor();
    const ms = await firstRowAfter(page, 'back');
    all.back.push(ms);
    print(`[${label}] back from a patient to the caseload #${i}: first rows ${Math.round(ms)} ms after history.back() · goal ${GOAL_MS} ms: ${(GOAL_MS / ms).toFixed(2)}× of goal`);
  }
  const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)] as number;
  print(`[${label}] medians of ${runs}: full load ${Math.round(median(all.full))} ms, in-app link ${Math.round(median(all.link))} ms, back ${Math.round(median(all.back))} ms (first rows after the action)`);
}

/** Records when the first caseload row (and the app's shell, the main navigation) appears after a full page load. */
const FIRST_ROW_OBSERVER = `new MutationObserver((_, observer) => {
  if (window.shellMs === undefined && document.querySelector('nav[aria-label="Main"]')) window.shellMs = performance.now();
  if (window.firstRowMs === undefined && document.querySelector('a.row')) {
    window.firstRowMs = performance.now();
    observer.disconnect();
  }
}).observe(document, { childList: true, subtree: true });`;

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
    // The demo caseload (12 invented patients), as a person trying the app meets it: 5 runs of each.
    const demoContext = await browser.newContext({ serviceWorkers: 'block', baseURL: server.url, viewport: { width: 1024, height: 768 } });
    await demoContext.addInitScript(FIRST_ROW_OBSERVER);
    const demoPage = await demoContext.newPage();
    await setUpDevice(demoPage, { demo: true });
    print(`load average ${loadavg().map((l) => l.toFixed(1)).join(' ')} on ${cpus().length} cores; Chromium ${browser.version()}, the demo caseload`);
    await timeToFirstRows(demoPage, print, 5, 'demo caseload');
    await demoContext.close();
    if (process.env.CASELOAD_BENCH_PATIENTS === '0') return;

    const context = await browser.newContext({ serviceWorkers: 'block', baseURL: server.url, viewport: { width: 1024, height: 768 } });
    await context.addInitScript(FIRST_ROW_OBSERVER);
    const page = await context.newPage();
    await setUpDevice(page, { demo: false });
    await page.evaluate(`${bundle}\n;undefined`);
    const filled = (await page.evaluate((n) => (globalThis as unknown as { fillCaseload: (n: number) => Promise<{ seconds: number }> }).fillCaseload(n), size)) as { seconds: number };
    print(`load average ${loadavg().map((l) => l.toFixed(1)).join(' ')} on ${cpus().length} cores; Chromium ${browser.version()}, caseload of ${size.toLocaleString('en')} patients (1 assessment, 2 observations each; written through the repositories in ${filled.seconds.toFixed(1)} s)`);

    await timeToFirstRows(page, print, 3, `${size.toLocaleString('en')} patients`);
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
