// Schema 7 in the app (issue 13): a device whose database the older app left at version 6 with phone
// pendulum recordings opens the new version; the saved results are analysed again and the user is told
// once, in a notice, which values changed and which were kept but flagged.
import { beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { bundleForPage } from './bundle-for-page';
import { sharedChromium } from '../support/shared-browser';
import { newAppContext, reflowProblems, runScriptInPage, screenshot, seriousAxeViolations, setTextScale, smallPhone, tablet } from './harness';

const chromium = sharedChromium();
let bundle: string;
beforeAll(async () => {
  bundle = await bundleForPage('test/e2e/in-page/phone-reanalysis-v6.ts', 'kinnotePhoneReanalysisV6');
}, 120_000);

/** A fresh profile whose 'kinnote' database is the older app's version 6, built before the app ever ran. */
async function deviceWithOldRecordings(viewport: { width: number; height: number }): Promise<Page> {
  const context = await newAppContext(chromium.browser, { viewport, serviceWorkers: 'block' });
  const page = await context.newPage();
  // A static file of the app's origin: no app code runs there, so the database is still absent.
  await page.goto('/icons/kinnote.svg');
  await runScriptInPage(page, bundle);
  expect(await page.evaluate(() => (globalThis as unknown as { phoneReanalysisV6: { build(): Promise<number> } }).phoneReanalysisV6.build())).toBe(6);
  await page.goto('/');
  return page;
}

describe('re-analysis of saved phone recordings (schema 7) in Chromium', () => {
  for (const [name, viewport] of [['360', smallPhone], ['1024', tablet]] as const) {
    it(`tells the user once which values changed and which were flagged (${name} px)`, async () => {
      const page = await deviceWithOldRecordings(viewport);
      const notice = page.getByRole('region', { name: 'Saved phone pendulum results were checked again' });
      await notice.waitFor({ timeout: 60_000 });
      await expect.poll(() => notice.innerText()).toMatch(/3 saved phone recordings were analysed again from their raw samples: values changed in 2, and 1 could not be confirmed/);
      const text = await notice.innerText();
      // The older A1 of the extension-type leg (16.6°) and its resting angle of the unaffected leg (28.0°) are named with their new values.
      expect(text).toMatch(/first swing[^:]*: 16\.6° → \d+\.\d°/i);
      expect(text).toMatch(/resting angle[^:]*: 28\.0° → (8\d|9\d)\.\d°/i);
      expect(text).toMatch(/relaxation index \(R2\): not saved → 1\.\d\d/i);
      expect(text).toMatch(/Kept as saved, but doubtful/);
      expect(text).toMatch(/gyroscope and its gravity reading disagree/);
      expect(await seriousAxeViolations(page)).toEqual([]);
      expect(await reflowProblems(page)).toEqual([]);
      await screenshot(page, `reanalysis-notice-${name}`);
      if (name === '360') {
        await setTextScale(page, 2);
        await notice.waitFor();
        expect(await reflowProblems(page)).toEqual([]);
        await screenshot(page, 'reanalysis-notice-360-text-200');
        await setTextScale(page, 1);
      }
      // Dismissed once, never shown again (also after a reload).
      await page.getByRole('button', { name: 'I have read this' }).click();
      await notice.waitFor({ state: 'detached' });
      await page.reload();
      await page.getByRole('link', { name: 'Caseload' }).waitFor();
      expect(await notice.count()).toBe(0);
      await page.context().close();
    }, 120_000);
  }
});
