// The browser set-up every browser-test file shares: one Chromium per file, launched before its
// tests and closed after them (vitest's beforeAll/afterAll).
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll } from 'vitest';
import { launchChromium } from '../e2e/harness';

/**
 * Call at the top of a test file; read `.browser` inside the tests.
 *
 * @example
 * const chromium = sharedChromium();
 * it('…', async () => { const context = await newAppContext(chromium.browser, { viewport: tablet }); });
 */
export function sharedChromium(): { readonly browser: Browser } {
  let browser: Browser | undefined;
  beforeAll(async () => {
    browser = await launchChromium();
  });
  afterAll(async () => {
    await browser?.close();
  });
  return {
    get browser(): Browser {
      if (!browser) throw new Error('sharedChromium: the browser is read before beforeAll launched it');
      return browser;
    },
  };
}
