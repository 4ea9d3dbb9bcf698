// The streamed restore on the settings page: a clinical-records backup made on one device is restored
// on a second, fresh one; the first try is cancelled (every object store's count as before, read with
// plain IndexedDB outside the app), the second finishes with every patient of the file. 360 and 1024 px,
// axe clean.
import { mkdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { bundleForPage } from './bundle-for-page';
import { setUpDevice } from './app-helpers';
import { launchChromium, newAppContext, runScriptInPage, screenshot, seriousAxeViolations, smallPhone, tablet } from './harness';

let browser: Browser;
let bundle: string;
beforeAll(async () => {
  bundle = await bundleForPage('test/e2e/in-page/store-checks.ts', 'kinnoteStoreChecks');
  browser = await launchChromium();
});
afterAll(async () => {
  await browser?.close();
});

/** Every object store's count in the app's database, read with plain IndexedDB. */
function storeCounts(page: Page): Promise<Record<string, number>> {
  return page.evaluate(
    () =>
      new Promise<Record<string, number>>((resolve, reject) => {
        const open = indexedDB.open('kinnote');
        open.onerror = () => reject(open.error);
        open.onsuccess = () => {
          const db = open.result;
          const names = [...db.objectStoreNames];
          const tx = db.transaction(names, 'readonly');
          const out: Record<string, number> = {};
          for (const name of names) {
            const r = tx.objectStore(name).count();
            r.onsuccess = () => (out[name] = r.result);
          }
          tx.oncomplete = () => {
            db.close();
            resolve(out);
          };
        };
      }),
  );
}

describe('streamed restore', () => {
  it('restores a backup from another device; a cancelled restore leaves the store as it was', async () => {
    const source = await newAppContext(browser, { viewport: tablet, acceptDownloads: true });
    const from = await source.newPage();
    await setUpDevice(from, { demo: false });
    await runScriptInPage(from, bundle);
    await from.evaluate(() => (globalThis as unknown as { fillCaseload: (n: number) => Promise<unknown> }).fillCaseload(1500));
    await from.goto('/settings');
    await from.getByLabel(/Clinical records only/).check();
    const download = from.waitForEvent('download', { timeout: 120_000 });
    await from.getByRole('button', { name: 'Save a backup file' }).click();
    // Kept outside the first context, whose downloads go when it closes.
    mkdirSync('test-output', { recursive: true });
    const path = join('test-output', 'restore-stream-source.json');
    await (await download).saveAs(path);
    const file = JSON.parse(readFileSync(path, 'utf8')) as { tables: Record<string, unknown[]> };
    await source.close();

    const context = await newAppContext(browser, { viewport: smallPhone });
    const page = await context.newPage();
    await setUpDevice(page, { demo: false });
    const before = await storeCounts(page);
    await page.goto('/settings');
    await page.getByLabel('Backup file').setInputFiles(path);
    await page.getByRole('button', { name: 'Import' }).click();
    const cancel = page.getByRole('button', { name: 'Cancel restore' });
    await cancel.waitFor();
    await screenshot(page, 'restore-stream-progress-360');
    await cancel.click();
    await page.getByText('Restore cancelled. Your records are as they were before it started.').waitFor({ timeout: 120_000 });
    expect(await storeCounts(page)).toEqual(before);
    expect(await seriousAxeViolations(page)).toEqual([]);
    await screenshot(page, 'restore-stream-cancelled-360');

    await page.setViewportSize(tablet);
    await page.getByLabel('Backup file').setInputFiles(path);
    await page.getByRole('button', { name: 'Import' }).click();
    await page.getByText(/restored, [\d,]+ records checked and merged/).waitFor({ timeout: 240_000 });
    expect(await seriousAxeViolations(page)).toEqual([]);
    await screenshot(page, 'restore-stream-done-1024');
    const after = await storeCounts(page);
    expect(after.patients).toBe(before.patients! + file.tables.patients!.length);
    expect(after.assessments).toBe(before.assessments! + file.tables.assessments!.length);
    await context.close();
  });
});
