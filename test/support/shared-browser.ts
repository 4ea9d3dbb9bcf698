// The browser set-up every browser-test file shares: one Chromium per file, launched before its
// tests and closed after them (vitest's beforeAll/afterAll).
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll } from 'vitest';
import { openFirstPatient, setUpDevice } from '../e2e/app-helpers';
import { launchChromium, newAppContext, tablet, waitForOfflineWorker } from '../e2e/harness';

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

/**
 * One tablet-sized page shared by a file's tests: the device set up with the demo caseload (and the
 * offline worker waited for, when asked) and the first patient's page open. Read the fields inside tests.
 */
export function sharedPatientPage(options: { readonly offlineWorker?: boolean } = {}): {
  readonly browser: Browser;
  readonly context: BrowserContext;
  readonly page: Page;
  readonly patientPath: string;
} {
  let state: { browser: Browser; context: BrowserContext; page: Page; patientPath: string } | undefined;
  let browser: Browser | undefined;
  let context: BrowserContext | undefined;
  beforeAll(async () => {
    browser = await launchChromium();
    context = await newAppContext(browser, { viewport: tablet });
    const page = await context.newPage();
    await setUpDevice(page);
    if (options.offlineWorker) await waitForOfflineWorker(page);
    state = { browser, context, page, patientPath: await openFirstPatient(page) };
  }, 120_000);
  afterAll(async () => {
    await context?.close();
    await browser?.close();
  });
  const ready = () => {
    if (!state) throw new Error('sharedPatientPage: read before beforeAll set the page up');
    return state;
  };
  return {
    get browser() {
      return ready().browser;
    },
    get context() {
      return ready().context;
    },
    get page() {
      return ready().page;
    },
    get patientPath() {
      return ready().patientPath;
    },
  };
}
