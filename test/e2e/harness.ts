// Shared helpers for the browser tests: Debian's Chromium through playwright-core.
import { mkdirSync, readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { join } from 'node:path';
import { chromium, type Browser, type BrowserContext, type BrowserContextOptions, type Page } from 'playwright-core';
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

/** Runs axe-core (WCAG 2.0–2.2 A and AA rules) in the page; returns serious and critical violations. */
export async function seriousAxeViolations(page: Page): Promise<AxeViolation[]> {
  await page.addScriptTag({ content: axeSource });
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
