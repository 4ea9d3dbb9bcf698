// The app shell: loads, installs its offline worker, works with the network cut, and only updates
// when the user accepts.
import { describe, expect, it } from 'vitest';
import { appendFileSync, cpSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { sharedChromium } from '../support/shared-browser';
import { startStaticServer } from '../../src/cli/commands/serve';
import {
  newAppContext,
  phone,
  screenshot,
  seriousAxeViolations,
  tablet,
  waitForOfflineWorker,
} from './harness';

const chromium = sharedChromium();

describe('app shell', () => {
  it('loads the first screen: a patient receives a programme, a therapist sets up (with the demo caseload), at phone and tablet size', async () => {
    for (const [name, viewport] of [
      ['phone', phone],
      ['tablet', tablet],
    ] as const) {
      const context = await newAppContext(chromium.browser, { viewport });
      const page = await context.newPage();
      await page.goto('/');
      await expect(page.title()).resolves.toBe('Kinnote');
      await page.getByRole('heading', { level: 1 }).waitFor();
      // Once the on-device store has opened, a new device asks whom it is for: a patient receives a
      // programme; a therapist opens the set-up form, which offers the demo caseload.
      await page.getByRole('button', { name: 'Receive my programme' }).waitFor();
      await page.getByRole('button', { name: 'Set up for a therapist' }).click();
      await page.getByRole('button', { name: /demo caseload/i }).waitFor();
      expect(await page.getByRole('button', { name: /demo caseload/i }).count()).toBe(1);
      expect(await page.getByText('not a diagnostic device').count()).toBeGreaterThan(0);
      await screenshot(page, `home-${name}`);
      await context.close();
    }
  });

  it('has no serious or critical axe-core violations on the first screen', async () => {
    const context = await newAppContext(chromium.browser);
    const page = await context.newPage();
    await page.goto('/');
    await page.getByRole('heading', { level: 1 }).waitFor();
    expect(await seriousAxeViolations(page)).toEqual([]);
    await context.close();
  });

  it('serves a manifest with name, icons, start_url and display', async () => {
    const context = await newAppContext(chromium.browser);
    const page = await context.newPage();
    await page.goto('/');
    const href = await page.locator('link[rel="manifest"]').getAttribute('href');
    expect(href).toBeTruthy();
    const response = await page.request.get(new URL(href as string, page.url()).toString());
    expect(response.ok()).toBe(true);
    const manifest = (await response.json()) as {
      name: string;
      short_name: string;
      start_url: string;
      scope: string;
      display: string;
      icons: Array<{ src: string; sizes: string; type: string; purpose?: string }>;
    };
    expect(manifest.name).toBe('Kinnote');
    expect(manifest.start_url).toBe('/');
    expect(manifest.display).toBe('standalone');
    const sizes = manifest.icons.map((i) => `${i.sizes}:${i.purpose ?? 'any'}`);
    expect(sizes).toEqual(expect.arrayContaining(['192x192:any', '512x512:any', '512x512:maskable']));
    for (const icon of manifest.icons) {
      const iconResponse = await page.request.get(new URL(icon.src, page.url()).toString());
      expect(iconResponse.ok(), icon.src).toBe(true);
      expect(iconResponse.headers()['content-type']).toBe(icon.type);
    }
    await context.close();
  });

  it('is controlled by a service worker, and after one visit reloads offline with its IndexedDB data', async () => {
    const context = await newAppContext(chromium.browser);
    const page = await context.newPage();
    await page.goto('/');
    await waitForOfflineWorker(page);
    expect(await page.evaluate(() => navigator.serviceWorker.controller?.scriptURL)).toMatch(/\/sw\.js$/);

    // A record written before the network goes.
    await page.evaluate(
      () =>
        new Promise<void>((done, fail) => {
          const open = indexedDB.open('kinnote-e2e-probe', 1);
          open.onupgradeneeded = () => open.result.createObjectStore('notes', { keyPath: 'id' });
          open.onerror = () => fail(open.error);
          open.onsuccess = () => {
            const tx = open.result.transaction('notes', 'readwrite');
            tx.objectStore('notes').put({ id: 'probe-1', text: 'written online' });
            tx.oncomplete = () => {
              open.result.close();
              done();
            };
            tx.onerror = () => fail(tx.error);
          };
        }),
    );

    await context.setOffline(true);
    await page.reload();
    await page.getByRole('heading', { level: 1, name: /welcome/i }).waitFor();
    // A deep link is also served from the precached shell.
    await page.goto('/some/deep/link');
    await page.getByRole('banner').waitFor();
    const text = await page.evaluate(
      () =>
        new Promise<string>((done, fail) => {
          const open = indexedDB.open('kinnote-e2e-probe', 1);
          open.onerror = () => fail(open.error);
          open.onsuccess = () => {
            const get = open.result.transaction('notes').objectStore('notes').get('probe-1');
            get.onsuccess = () => done((get.result as { text: string }).text);
            get.onerror = () => fail(get.error);
          };
        }),
    );
    expect(text).toBe('written online');
    await context.close();
  });

  it('negative control: without the service worker the offline reload fails', async () => {
    const context = await newAppContext(chromium.browser, { serviceWorkers: 'block' });
    const page = await context.newPage();
    await page.goto('/');
    await page.getByRole('heading', { level: 1 }).waitFor();
    await context.setOffline(true);
    await expect(page.reload()).rejects.toThrow(/ERR_INTERNET_DISCONNECTED/);
    await context.close();
  });

  it('shows that an update is ready and applies it only when the user accepts', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'kinnote-update-'));
    cpSync('build', dir, { recursive: true });
    const server = await startStaticServer(dir, 0);
    try {
      const context = await newAppContext(chromium.browser, { baseURL: server.url });
      const page = await context.newPage();
      await page.goto('/');
      await waitForOfflineWorker(page);
      const firstWorker = await page.evaluate(async () => (await navigator.serviceWorker.getRegistration())?.active?.state);
      expect(firstWorker).toBe('activated');

      // Publish a "new version": any byte change to sw.js makes the browser install it.
      appendFileSync(join(dir, 'sw.js'), '\n// next release\n');
      await page.evaluate(async () => (await navigator.serviceWorker.getRegistration())?.update());
      const updateButton = page.getByRole('button', { name: 'Update now' });
      await updateButton.waitFor({ timeout: 20_000 });
      await screenshot(page, 'update-ready-phone');

      // Until accepted, the new worker waits and the old one still controls the page.
      expect(await page.evaluate(async () => Boolean((await navigator.serviceWorker.getRegistration())?.waiting))).toBe(
        true,
      );

      const reloaded = page.waitForEvent('load');
      await updateButton.click();
      await reloaded;
      await waitForOfflineWorker(page);
      expect(await page.evaluate(async () => Boolean((await navigator.serviceWorker.getRegistration())?.waiting))).toBe(
        false,
      );
      expect(await page.getByRole('button', { name: 'Update now' }).count()).toBe(0);
      await context.close();
    } finally {
      await server.close();
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
