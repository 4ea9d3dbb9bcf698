// The streamed backup of the clinical records on the settings page: progress, cancel (the store
// unchanged, no file), then a full backup whose file is checked with Node's own SHA-256 (node:crypto,
// outside the app), at 360 px and 1024 px, axe clean.
import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { bundleForPage } from './bundle-for-page';
import { setUpDevice } from './app-helpers';
import { newAppContext, runScriptInPage, screenshot, seriousAxeViolations, smallPhone, tablet } from './harness';
import { sharedChromium } from '../support/shared-browser';

const chromium = sharedChromium();
let bundle: string;
beforeAll(async () => {
  bundle = await bundleForPage('test/e2e/in-page/store-checks.ts', 'kinnoteStoreChecks');
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

describe('streamed backup', () => {
  it('shows progress, cancels leaving the store as it was, then saves a file that checks out', async () => {
    const context = await newAppContext(chromium.browser, { viewport: smallPhone, acceptDownloads: true });
    const page = await context.newPage();
    await setUpDevice(page, { demo: false });
    await runScriptInPage(page, bundle);
    await page.evaluate(() => (globalThis as unknown as { fillCaseload: (n: number) => Promise<unknown> }).fillCaseload(3000));
    const before = await storeCounts(page);
    let downloads = 0;
    page.on('download', () => downloads++);

    await page.goto('/settings');
    await page.getByLabel(/Clinical records only/).check();
    await page.getByRole('button', { name: 'Save a backup file' }).click();
    const cancel = page.getByRole('button', { name: 'Cancel backup' });
    await cancel.waitFor();
    await screenshot(page, 'backup-stream-progress-360');
    await cancel.click();
    await page.getByText('Backup cancelled. Nothing was saved; your records are unchanged.').waitFor();
    expect(await storeCounts(page)).toEqual(before);
    expect(downloads).toBe(0);
    expect(await seriousAxeViolations(page)).toEqual([]);
    await screenshot(page, 'backup-stream-cancelled-360');

    await page.setViewportSize(tablet);
    const download = page.waitForEvent('download', { timeout: 120_000 });
    await page.getByRole('button', { name: 'Save a backup file' }).click();
    const file = readFileSync((await (await download).path())!, 'utf8');
    await page.getByText(/^Saved [\d,]+ records/).waitFor();
    expect(await seriousAxeViolations(page)).toEqual([]);
    await screenshot(page, 'backup-stream-saved-1024');
    // The checksum member comes first; the rest, from "{", is the body it covers.
    const match = /^\{"checksum":\{"algorithm":"SHA-256","value":"([0-9a-f]{64})"\},/.exec(file);
    expect(match).not.toBeNull();
    const body = `{${file.slice(match![0].length).trimEnd()}`;
    expect(createHash('sha256').update(body).digest('hex')).toBe(match![1]);
    const parsed = JSON.parse(body) as { tables: Record<string, unknown[]>; protectedContent: string };
    expect(parsed.protectedContent).toBe('omitted');
    expect(parsed.tables.patients).toHaveLength(3000);
    expect(parsed.tables.observations).toHaveLength(6000);
    expect(parsed.tables.identities).toHaveLength(0);
    expect(await storeCounts(page)).toEqual(before);
    await context.close();
  });
});
