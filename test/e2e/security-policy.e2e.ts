// The app runs under its Content-Security-Policy: walking the main pages (demo caseload, a patient,
// an assessment form, settings, reliability, cohort) reports no securitypolicyviolation event, the
// policy arrives both as the built page's meta tag and as `kinnote serve`'s header, and an inline
// script that someone managed to put into the page is refused.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { openFirstPatient, setUpDevice } from './app-helpers';
import { baseUrl, newAppContext, tablet, waitForSettledPage } from './harness';
import { sharedChromium } from '../support/shared-browser';

const chromium = sharedChromium();
let context: BrowserContext;
let page: Page;
const violations: string[] = [];

beforeAll(async () => {
  context = await newAppContext(chromium.browser, { viewport: tablet });
  // Registered before any page script runs, on every document of the context.
  await context.exposeBinding('__reportViolation', (_source, text: string) => violations.push(text));
  await context.addInitScript(() => {
    document.addEventListener('securitypolicyviolation', (e) => {
      void (window as unknown as { __reportViolation: (t: string) => Promise<void> }).__reportViolation(`${location.pathname}: ${e.violatedDirective} blocked ${e.blockedURI || '(inline)'} at ${e.sourceFile}:${e.lineNumber}`);
    });
  });
  page = await context.newPage();
}, 60_000);
afterAll(async () => {
  await context?.close();
});

describe('Content-Security-Policy', () => {
  it('is sent as a header and written into the page, without inline script or remote origins', async () => {
    const response = await fetch(`${baseUrl()}/patients`);
    const header = response.headers.get('content-security-policy') ?? '';
    expect(header).toMatch(/script-src 'self' 'sha256-[A-Za-z0-9+/=]+'(;|$)/);
    expect(header).toContain("frame-ancestors 'none'");
    expect(header).not.toMatch(/script-src[^;]*unsafe-inline/);
    expect(header).not.toMatch(/https?:\/\//);
    expect(response.headers.get('x-content-type-options')).toBe('nosniff');
    expect(response.headers.get('referrer-policy')).toBe('no-referrer');
    const html = await response.text();
    expect(html).toMatch(/<meta http-equiv="content-security-policy" content="[^"]*script-src 'self' 'sha256-/);
    const bad = await fetch(`${baseUrl()}/%E0%A4%A`);
    expect(bad.status).toBe(400);
  });

  it('the main pages run with no violation reported', async () => {
    await setUpDevice(page);
    const patientPath = await openFirstPatient(page);
    for (const path of ['/', '/patients', patientPath, `${patientPath}/assess`, `${patientPath}/programme`, '/reliability', '/cohort', '/settings']) {
      await page.goto(path);
      await waitForSettledPage(page, `the page ${path}`);
    }
    expect(violations).toEqual([]);
  }, 120_000);

  it('an injected inline script is refused and reported (negative control)', async () => {
    await page.goto('/settings');
    await waitForSettledPage(page, 'settings');
    const ran = await page.evaluate(() => {
      const s = document.createElement('script');
      s.textContent = 'window.__injected = true;';
      document.body.append(s);
      return (window as unknown as { __injected?: boolean }).__injected === true;
    });
    expect(ran).toBe(false);
    await expect.poll(() => violations.length).toBeGreaterThan(0);
    expect(violations.at(-1)).toMatch(/script-src/);
  });
});
