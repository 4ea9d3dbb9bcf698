// A caseload of 5,000 patients: the list stays virtual (a few dozen rows in the page), scrolls to the
// last patient, and filters by search.
import { beforeAll, describe, expect, it } from 'vitest';
import { bundleForPage } from './bundle-for-page';
import { setUpDevice, unlockVault } from './app-helpers';
import { sharedChromium } from '../support/shared-browser';
import { newAppContext, phone, runScriptInPage, screenshot, setTextScale, smallPhone } from './harness';

const chromium = sharedChromium();
let bundle: string;
beforeAll(async () => {
  bundle = await bundleForPage('test/e2e/in-page/store-checks.ts', 'kinnoteStoreChecks');
});

describe('caseload with 5,000 patients', () => {
  it('renders only the rows in view, scrolls to the end and searches', async () => {
    const context = await newAppContext(chromium.browser, { viewport: phone });
    const page = await context.newPage();
    await setUpDevice(page, { demo: false });
    await runScriptInPage(page, bundle);
    const filled = (await page.evaluate(() => (globalThis as unknown as { fillCaseload: (n: number) => Promise<unknown> }).fillCaseload(5000))) as { patients: number; seconds: number };
    expect(filled.patients).toBe(5000);

    const started = Date.now();
    await page.goto('/patients');
    await page.getByText('5000 of 5000 patients').waitFor({ timeout: 60_000 });
    const shownAfterMs = Date.now() - started;
    console.log(`caseload of 5,000: filled in ${filled.seconds.toFixed(1)} s, listed ${shownAfterMs} ms after navigation`);
    const rendered = await page.locator('ul[aria-label="Patients"] > li').count();
    expect(rendered).toBeGreaterThan(5);
    expect(rendered).toBeLessThan(60);

    // Scroll to the bottom: the last row (posinset 5000) is rendered, the first is gone.
    await page.locator('.viewport').evaluate((el) => el.scrollTo(0, el.scrollHeight));
    await page.locator('li[aria-posinset="5000"]').waitFor();
    expect(await page.locator('li[aria-posinset="1"]').count()).toBe(0);
    expect(await page.locator('ul[aria-label="Patients"] > li').count()).toBeLessThan(60);
    await screenshot(page, 'caseload-5000-phone');

    // The first code made by fillCaseload is 3222-2222; its prefix matches the first 30 patients only.
    await page.getByLabel(/Search by code/).fill('3222-222');
    await page.getByText('30 of 5000 patients').waitFor();
    expect(await page.locator('a.row .code', { hasText: '3222-2222' }).count()).toBe(1);
    for (const code of await page.locator('a.row .code').allTextContents()) expect(code.startsWith('3222-222')).toBe(true);
    await context.close();
  });

  it('reads at 360 px with names shown, at 100 % and 200 % text: no row printed over the next', async () => {
    const context = await newAppContext(chromium.browser, { viewport: smallPhone });
    const page = await context.newPage();
    await setUpDevice(page);
    await page.goto('/patients');
    await unlockVault(page);
    await page.locator('a.row .name').first().waitFor();
    /** Rows whose content is taller than their slot, or whose slots overlap. */
    const overlaps = () =>
      page.evaluate(() => {
        const problems: string[] = [];
        const items = Array.from(document.querySelectorAll<HTMLElement>('ul[aria-label="Patients"] > li'));
        for (const li of items) {
          const cell = li.firstElementChild as HTMLElement | null;
          if (cell && cell.scrollHeight > li.clientHeight + 1) problems.push(`row ${li.getAttribute('aria-posinset')}: content ${cell.scrollHeight} px in a ${li.clientHeight} px row`);
        }
        const boxes = items.map((li) => li.getBoundingClientRect()).sort((a, b) => a.top - b.top);
        for (let i = 1; i < boxes.length; i++) if (boxes[i]!.top < boxes[i - 1]!.bottom - 0.5) problems.push(`rows ${i} and ${i + 1} overlap`);
        return problems;
      });
    expect(await overlaps()).toEqual([]);
    await screenshot(page, 'caseload-names-360');
    await setTextScale(page, 2);
    await expect.poll(overlaps, { timeout: 10_000 }).toEqual([]);
    await screenshot(page, 'caseload-names-360-text-200');
    await context.close();
  });
});
