// Shared helpers for the browser tests: Debian's Chromium through playwright-core.
import { mkdirSync, readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { join } from 'node:path';
import { chromium, type Browser, type CDPSession, type BrowserContext, type BrowserContextOptions, type Page } from 'playwright-core';
import { inject } from 'vitest';

export const phone = { width: 390, height: 844 } as const;
export const smallPhone = { width: 360, height: 740 } as const;
export const tablet = { width: 1024, height: 768 } as const;

export const screenshotDir = join('test-output', 'screenshots');

export function baseUrl(): string {
  return inject('baseUrl');
}

export async function launchChromium(): Promise<Browser> {
  return chromium.launch({
    executablePath: inject('chromePath'),
    // playwright-core already passes --headless, --no-sandbox and a fresh profile.
    args: [
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
    ],
  });
}

export async function newAppContext(browser: Browser, options: BrowserContextOptions = {}): Promise<BrowserContext> {
  return browser.newContext({ viewport: phone, baseURL: baseUrl(), ...options });
}

/** Waits until the offline worker is active and controls the page (precache complete). */
export async function waitForOfflineWorker(page: Page): Promise<void> {
  // The predicate must be synchronous: an async one returns a promise, which counts as truthy at once.
  await page.waitForFunction(
    () => navigator.serviceWorker.controller?.state === 'activated',
    undefined,
    { timeout: 20_000, polling: 100 },
  );
}

/** Saves a full-page screenshot under test-output/screenshots (git-ignored) and returns its path. */
export async function screenshot(page: Page, name: string): Promise<string> {
  mkdirSync(screenshotDir, { recursive: true });
  const path = join(screenshotDir, `${name}.png`);
  await page.screenshot({ path, fullPage: true });
  return path;
}

const axeSource = readFileSync(createRequire(import.meta.url).resolve('axe-core/axe.min.js'), 'utf8');

export interface AxeViolation {
  id: string;
  impact: string | null;
  help: string;
  targets: string[];
}

/**
 * Runs a test tool's script (axe-core, a bundled check) in the page through the DevTools protocol.
 * Not as an inline <script> tag: the app's Content-Security-Policy refuses those, as it should.
 */
export async function runScriptInPage(page: Page, source: string): Promise<void> {
  await page.evaluate(`${source}\n;undefined`);
}

/** Runs axe-core (WCAG 2.0–2.2 A and AA rules) in the page; returns serious and critical violations. */
export async function seriousAxeViolations(page: Page): Promise<AxeViolation[]> {
  await runScriptInPage(page, axeSource);
  const violations = await page.evaluate(async () => {
    const axe = (window as unknown as { axe: { run: (ctx: Document, opts: object) => Promise<{ violations: Array<{ id: string; impact: string | null; help: string; nodes: Array<{ target: string[] }> }> }> } }).axe;
    const result = await axe.run(document, {
      runOnly: { type: 'tag', values: ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa'] },
    });
    return result.violations.map((v) => ({
      id: v.id,
      impact: v.impact,
      help: v.help,
      targets: v.nodes.map((n) => n.target.join(' ')),
    }));
  });
  return violations.filter((v) => v.impact === 'serious' || v.impact === 'critical');
}

/**
 * Sets the browser's default text size as a person does in the browser's settings (Chromium's
 * font-size preference, through the DevTools protocol): scale 2 is "text at 200 %" (WCAG 2.2 1.4.4).
 * Kinnote sizes everything in rem/em from a 100 % root, so the whole page scales. It holds for
 * every later navigation of this page.
 */
export async function setTextScale(page: Page, scale: number): Promise<void> {
  // The setting lives as long as the DevTools session that made it: keep one session per page.
  let cdp = textScaleSessions.get(page);
  if (!cdp) {
    cdp = await page.context().newCDPSession(page);
    textScaleSessions.set(page, cdp);
  }
  await cdp.send('Page.enable');
  await cdp.send('Page.setFontSizes', { fontSizes: { standard: Math.round(16 * scale), fixed: Math.round(13 * scale) } });
}
const textScaleSessions = new WeakMap<Page, CDPSession>();

/** The root font size in CSS px (16 at 100 % text, 32 at 200 %). */
export async function rootFontPx(page: Page): Promise<number> {
  return page.evaluate(() => parseFloat(getComputedStyle(document.documentElement).fontSize));
}

/**
 * Waits until the page has settled: its first heading is shown, web fonts are ready and the DOM
 * has not changed for `quietMs` (a condition, polled; never a fixed sleep). Times out with a message
 * naming what it was waiting for.
 */
export async function waitForSettledPage(page: Page, what: string, quietMs = 300, timeoutMs = 30_000): Promise<void> {
  await page.getByRole('heading', { level: 1 }).first().waitFor({ timeout: timeoutMs }).catch((error: unknown) => {
    throw new Error(`waiting for the first heading of ${what}: ${error instanceof Error ? error.message.split('\n')[0] : String(error)}`);
  });
  await page.evaluate(() => {
    const w = window as unknown as { __lastMutation?: number; __mutationWatch?: MutationObserver };
    w.__lastMutation = performance.now();
    w.__mutationWatch?.disconnect();
    w.__mutationWatch = new MutationObserver(() => (w.__lastMutation = performance.now()));
    w.__mutationWatch.observe(document.body, { subtree: true, childList: true, attributes: true, characterData: true });
  });
  await page
    .waitForFunction(
      (quiet) => {
        const w = window as unknown as { __lastMutation?: number };
        return document.fonts.status === 'loaded' && performance.now() - (w.__lastMutation ?? 0) >= quiet;
      },
      quietMs,
      { timeout: timeoutMs, polling: 100 },
    )
    .catch((error: unknown) => {
      throw new Error(`waiting for ${what} to stop changing for ${quietMs} ms: ${error instanceof Error ? error.message.split('\n')[0] : String(error)}`);
    });
}

/**
 * Reflow problems (WCAG 2.2 1.4.10) at the current viewport: the page wider than the screen, a
 * control that sticks out past the screen's edge, a control cut off by an ancestor that hides
 * overflow, and a control whose own text does not fit in it. Content inside a container that
 * scrolls sideways on purpose (a data table, which 1.4.10 allows) is judged against that container.
 * Returns one line per problem, naming the control by its role-ish tag and text.
 */
export async function reflowProblems(page: Page): Promise<string[]> {
  return page.evaluate(() => {
    const problems: string[] = [];
    const vw = document.documentElement.clientWidth;
    const slack = 1; // sub-pixel rounding
    const pageWidth = document.documentElement.scrollWidth;
    if (pageWidth > vw + slack) problems.push(`page is ${pageWidth}px wide in a ${vw}px viewport (${pageWidth - vw}px sideways overflow)`);
    const describe = (el: Element): string => {
      const text = (el.getAttribute('aria-label') ?? (el as HTMLElement).innerText ?? (el as HTMLInputElement).value ?? '').trim().replace(/\s+/g, ' ').slice(0, 40);
      const label = el.id ? document.querySelector(`label[for="${el.id}"]`)?.textContent?.trim().slice(0, 30) : (el.closest('label')?.textContent?.trim().replace(/\s+/g, ' ').slice(0, 30) ?? '');
      return `<${el.tagName.toLowerCase()}${el.getAttribute('type') ? ` type=${el.getAttribute('type')}` : ''}> "${text || label || ''}"`;
    };
    const visible = (el: Element): boolean => {
      const style = getComputedStyle(el);
      if (style.visibility === 'hidden' || style.display === 'none') return false;
      const r = el.getBoundingClientRect();
      if (r.width === 0 || r.height === 0) return false;
      // Visually hidden helpers (1 px, clipped) are not controls a person sees.
      if (r.width <= 2 && r.height <= 2) return false;
      // Parked off the left edge until focused (a skip link): hidden by design, not overflow.
      if (r.right <= 0 && document.activeElement !== el) return false;
      return !el.closest('[hidden], .visually-hidden, details:not([open]) > :not(summary)');
    };
    const controls = Array.from(document.querySelectorAll('a[href], button, input:not([type=hidden]), select, textarea, summary, [role=button], [role=link], [role=tab]'));
    for (const el of controls) {
      if (!visible(el)) continue;
      const r = el.getBoundingClientRect();
      // Nearest ancestor that clips or scrolls sideways.
      let clipper: Element | null = null;
      let scroller = false;
      for (let a = el.parentElement; a && a !== document.body; a = a.parentElement) {
        const ox = getComputedStyle(a).overflowX;
        if (ox === 'auto' || ox === 'scroll') {
          clipper = a;
          scroller = true;
          break;
        }
        if (ox === 'hidden' || ox === 'clip') {
          clipper = a;
          break;
        }
      }
      if (!scroller) {
        if (r.right > vw + slack) problems.push(`${describe(el)} sticks out ${Math.round(r.right - vw)}px past the right edge`);
        if (r.left < -slack) problems.push(`${describe(el)} sticks out ${Math.round(-r.left)}px past the left edge`);
      }
      if (clipper && !scroller) {
        const c = clipper.getBoundingClientRect();
        if (r.right > c.right + slack || r.left < c.left - slack) problems.push(`${describe(el)} is cut off by a container that hides overflow`);
      }
      if (scroller && clipper) {
        const c = clipper.getBoundingClientRect();
        if (c.right > vw + slack) problems.push(`a sideways-scrolling container holding ${describe(el)} is itself wider than the screen`);
      }
      // Text that does not fit inside the control itself (a truncated date, a cut-off label).
      const tag = el.tagName;
      if ((tag === 'BUTTON' || tag === 'SELECT' || tag === 'A' || tag === 'SUMMARY' || (tag === 'INPUT' && /^(date|time|datetime-local|month|week|number)$/.test((el as HTMLInputElement).type))) && el.scrollWidth > el.clientWidth + slack && getComputedStyle(el).overflowX !== 'visible') {
        problems.push(`${describe(el)} text does not fit (${el.scrollWidth}px in ${el.clientWidth}px)`);
      }
    }
    return problems;
  });
}
