// The record store on Chromium's real IndexedDB and Web Crypto: migration, a real full disk, and
// encrypted backups. The store code runs in the page from a bundle of test/e2e/in-page/store-checks.ts.
import { beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { bundleForPage } from './bundle-for-page';
import { newAppContext, runScriptInPage, screenshot, seriousAxeViolations, phone, tablet } from './harness';
import type { storeChecks } from './in-page/store-checks';
import { setUpDevice } from './app-helpers';
import { sharedChromium } from '../support/shared-browser';
import { LATEST_SCHEMA_VERSION } from '../../src/lib/store/schema';

type Checks = typeof storeChecks;
const chromium = sharedChromium();
let bundle: string;
beforeAll(async () => {
  bundle = await bundleForPage('test/e2e/in-page/store-checks.ts', 'kinnoteStoreChecks');
});

/** A page on the app's origin (worker blocked, so the app's own cache does not count in quotas). */
async function checksPage(): Promise<Page> {
  const context = await newAppContext(chromium.browser, { serviceWorkers: 'block' });
  const page = await context.newPage();
  await page.goto('/in-page-checks');
  await runScriptInPage(page, bundle);
  return page;
}

async function run<K extends keyof Checks>(page: Page, name: K, ...args: Parameters<Checks[K]>): Promise<Awaited<ReturnType<Checks[K]>>> {
  return page.evaluate(
    ([n, a]) => (globalThis as unknown as { storeChecks: Record<string, (...x: unknown[]) => Promise<unknown>> }).storeChecks[n as string]!(...(a as unknown[])),
    [name, args] as const,
  ) as Promise<Awaited<ReturnType<Checks[K]>>>;
}

describe('record store in Chromium', () => {
  it('upgrades a version-1 database to the latest version with every record intact', async () => {
    const page = await checksPage();
    const result = await run(page, 'migration');
    expect(result).toEqual({
      from: 1,
      to: LATEST_SCHEMA_VERSION,
      patientCode: 'K7QM-3XHD',
      takenAt: ['2025-01-02T09:00:00.000Z'],
      traceSamples: [1, 2, 3],
      traceIsFloat64: true,
    });
    await page.context().close();
  });

  it('a real full disk (quota lowered to 4 MB) fails as QuotaExceeded and leaves every table as it was', async () => {
    const page = await checksPage();
    const cdp = await page.context().newCDPSession(page);
    await cdp.send('Storage.overrideQuotaForOrigin', { origin: new URL(page.url()).origin, quotaSize: 4 * 1024 * 1024 });
    const result = await run(page, 'quota', 15_000);
    expect(result.code).toBe('QuotaExceeded');
    expect(result.message).toMatch(/out of storage space; nothing was saved/);
    expect(result.after).toEqual(result.before);
    expect(result.firstPatientObservations).toBe(10);
    await page.context().close();
  });

  it('encrypted backups round-trip; wrong passphrase, tampered and truncated files are refused whole', async () => {
    const page = await checksPage();
    const r = await run(page, 'encryptedBackup');
    expect(r.wrongPassphrase).toBe('WrongPassphrase');
    expect(['TamperedBundle', 'WrongPassphrase']).toContain(r.tampered);
    expect(['TamperedBundle', 'InvalidBundle']).toContain(r.truncated);
    expect(r.afterRefusals).toEqual(r.empty);
    expect(r.first).toBe('imported');
    expect(r.afterFirst.observations).toBe(20);
    // Importing the same file again changes no record.
    expect(r.second).toBe('imported');
    expect({ ...r.afterSecond, audit: 0 }).toEqual({ ...r.afterFirst, audit: 0 });
    expect(r.notesReadable).toBe('Invented note for the browser check');
    await page.context().close();
  });

  it('the settings page shows storage, lock and backup at phone and tablet size, axe-clean', async () => {
    for (const [size, viewport] of [
      ['phone', phone],
      ['tablet', tablet],
    ] as const) {
      const context = await newAppContext(chromium.browser, { viewport });
      const page = await context.newPage();
      await setUpDevice(page, { demo: false });
      await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Settings' }).click();
      await page.getByRole('heading', { name: 'Storage on this device' }).waitFor();
      await page.getByText(/Using .* [MG]B of about/).waitFor();
      expect(await page.getByText('Unlocked: names and notes are readable on this device.').count()).toBe(1);
      await screenshot(page, `settings-${size}`);
      expect(await seriousAxeViolations(page)).toEqual([]);
      await context.close();
    }
  });
});
