// The referral report's share action in Chromium, offline: the PDF is made on the device, loaded on
// demand; without the Web Share API it is downloaded (named by code and day), with a share sheet
// (stubbed here: headless Chromium on Linux has none) the File handed over is an application/pdf;
// closing the sheet is no error; a refused share falls back to a download and says why. The files
// are read back with poppler (pdfinfo, pdftotext) and two are rendered to images to look at.
import { execFileSync } from 'node:child_process';
import { existsSync, mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BrowserContext, Download, Page } from 'playwright-core';
import { setUpDevice, unlockVault } from './app-helpers';
import { newAppContext, screenshot, screenshotDir, smallPhone, tablet, waitForOfflineWorker, waitForSettledPage } from './harness';
import { sharedChromium } from '../support/shared-browser';

type ShareMode = 'absent' | 'accept' | 'abort' | 'refuse' | 'no-file';
interface SharedFile {
  name: string;
  type: string;
  size: number;
  head: string;
  title: string;
  base64: string;
}

const chromium = sharedChromium();
let context: BrowserContext;
let page: Page;
let reportPaths: string[] = [];
const outDir = join('test-output', 'share');

beforeAll(async () => {
  for (const tool of ['/usr/bin/pdfinfo', '/usr/bin/pdftotext', '/usr/bin/pdftoppm']) {
    if (!existsSync(tool)) throw new Error(`${tool} missing: the share test reads the PDF back with poppler-utils (apt-get install -y poppler-utils)`);
  }
  mkdirSync(outDir, { recursive: true });
  context = await newAppContext(chromium.browser, { viewport: tablet, acceptDownloads: true });
  // Each document reads the mode the test chose: no Web Share API at all, or a stub that takes the
  // file, is closed by the person (AbortError) or refuses (NotAllowedError, as after a lapsed tap).
  await context.addInitScript(() => {
    const mode = localStorage.getItem('kinnote-test-share-mode') ?? 'absent';
    const proto = Navigator.prototype as unknown as Record<string, unknown>;
    delete proto.share;
    delete proto.canShare;
    if (mode === 'no-file') {
      // A browser that cannot make the File: the PDF cannot be handed over, and the page must say so.
      (window as unknown as { File: unknown }).File = class {
        constructor() {
          throw new TypeError('File is not available here (test)');
        }
      };
    }
    if (mode === 'absent' || mode === 'no-file') return;
    const w = window as unknown as { __shared: unknown[] };
    w.__shared = [];
    Object.defineProperty(navigator, 'canShare', { configurable: true, value: (data: ShareData) => (data.files ?? []).length > 0 });
    Object.defineProperty(navigator, 'share', {
      configurable: true,
      value: async (data: ShareData) => {
        for (const f of data.files ?? []) {
          const bytes = new Uint8Array(await f.arrayBuffer());
          let binary = '';
          for (const b of bytes) binary += String.fromCharCode(b);
          w.__shared.push({ name: f.name, type: f.type, size: f.size, head: await f.slice(0, 5).text(), title: data.title ?? '', base64: btoa(binary) });
        }
        if (mode === 'abort') throw new DOMException('Share canceled', 'AbortError');
        if (mode === 'refuse') throw new DOMException('Must be handling a user gesture to perform a share request.', 'NotAllowedError');
      },
    });
  });
  page = await context.newPage();
  await setUpDevice(page);
  await waitForOfflineWorker(page);
  await page.goto('/patients');
  await page.locator('a.row').first().waitFor();
  const paths = [...new Set(await page.locator('a.row').evaluateAll((as) => as.map((a) => (a as HTMLAnchorElement).getAttribute('href') as string)))];
  // Two demo patients: the first and the fourth row of the caseload.
  reportPaths = [`${paths[0]}/report`, `${paths[Math.min(3, paths.length - 1)]}/report`];
}, 120_000);
afterAll(async () => {
  await context?.close();
});

async function openReport(path: string, mode: ShareMode): Promise<void> {
  await page.evaluate((m) => localStorage.setItem('kinnote-test-share-mode', m), mode);
  await page.goto(path);
  await page.locator('article.report').waitFor();
  await waitForSettledPage(page, `report ${path}`);
}

function pdfFacts(file: string): { pages: number; a4: boolean; text: string } {
  const info = execFileSync('/usr/bin/pdfinfo', [file], { encoding: 'utf8' });
  const pages = Number(/^Pages:\s+(\d+)/m.exec(info)?.[1]);
  const size = /^Page size:\s+([\d.]+) x ([\d.]+) pts/m.exec(info);
  const a4 = size !== null && Math.abs(Number(size[1]) - 595.28) < 0.01 && Math.abs(Number(size[2]) - 841.89) < 0.01;
  const text = execFileSync('/usr/bin/pdftotext', ['-enc', 'UTF-8', file, '-'], { encoding: 'utf8' }).replace(/\s+/g, ' ');
  return { pages, a4, text };
}

const code = async () => ((await page.locator('article.report .who .code').textContent()) ?? '').trim();
const status = () => page.getByRole('status').filter({ hasText: /PDF|pdf|nothing was sent/ });

describe('report share action', () => {
  it('without the Web Share API: offline, keyboard, 44 px; the PDF (loaded on demand) is downloaded as kinnote-report-<code>-<day>.pdf, 1-2 A4 pages with the cautions', async () => {
    await context.setOffline(true);
    for (const [n, path] of reportPaths.entries()) {
      await openReport(path, 'absent');
      const button = page.getByRole('button', { name: 'Download PDF' });
      const box = await button.boundingBox();
      expect(box!.height).toBeGreaterThanOrEqual(44);
      const scripts: string[] = [];
      const onRequest = (r: { url(): string }) => {
        if (r.url().endsWith('.js')) scripts.push(r.url());
      };
      page.on('request', onRequest);
      let download: Download;
      const tapMs = Date.now();
      if (n === 0) {
        // Reached with Tab from the scope choice, and pressed with Enter.
        await page.getByRole('combobox', { name: 'Report on' }).focus();
        for (let i = 0; i < 12 && !(await button.evaluate((b) => b === document.activeElement)); i++) await page.keyboard.press('Tab');
        expect(await button.evaluate((b) => b === document.activeElement)).toBe(true);
        [download] = await Promise.all([page.waitForEvent('download'), page.keyboard.press('Enter')]);
      } else {
        [download] = await Promise.all([page.waitForEvent('download'), button.click()]);
      }
      // Printed, never asserted: from the tap to the download (fetching the chunk from the offline cache, making the PDF).
      const elapsedMs = Date.now() - tapMs;
      page.off('request', onRequest);
      // The PDF module came with the tap (pdf-lib is not in the page's first load), from the offline cache.
      expect(scripts.length, 'a script chunk fetched on the tap').toBeGreaterThan(0);
      const c = await code();
      expect(download.suggestedFilename()).toMatch(new RegExp(`^kinnote-report-${c}-\\d{4}-\\d{2}-\\d{2}\\.pdf$`));
      const file = join(outDir, download.suggestedFilename());
      await download.saveAs(file);
      const facts = pdfFacts(file);
      expect(facts.a4).toBe(true);
      expect(facts.pages).toBeGreaterThanOrEqual(1);
      expect(facts.pages).toBeLessThanOrEqual(2);
      expect(facts.text).toContain(c);
      expect(facts.text).toMatch(/not a diagnostic device.*decisions rest with licensed clinicians.*local protocols and data-protection law/);
      // Every verdict sentence of the page is in the file (the minus sign spelled "-" in the standard font).
      for (const sentence of await page.locator('article.report td.sentence').allTextContents()) expect(facts.text).toContain(sentence.replace(/\u2212/g, '-').replace(/\s+/g, ' ').trim());
      await expect.poll(() => status().textContent()).toMatch(new RegExp(`Downloaded kinnote-report-${c}-.*\\.pdf \\([12] pages?`));
      expect(await page.getByRole('alert').count()).toBe(0);
      execFileSync('/usr/bin/pdftoppm', ['-r', '70', '-png', file, join(screenshotDir, `share-pdf-${n + 1}`)]);
      console.log(`${download.suggestedFilename()}: ${facts.pages} page(s), tap to download ${elapsedMs} ms; pages rendered to ${screenshotDir}/share-pdf-${n + 1}-*.png`);
    }
    await context.setOffline(false);
  }, 180_000);

  it('with a share sheet: hands over one File of type application/pdf named by code and day; no download', async () => {
    await openReport(reportPaths[0]!, 'accept');
    let downloads = 0;
    const onDownload = () => downloads++;
    page.on('download', onDownload);
    await page.getByRole('button', { name: 'Share as PDF' }).click();
    await expect.poll(() => status().textContent()).toMatch(/Handed kinnote-report-.*\.pdf .* to the app you chose/);
    const shared = (await page.evaluate(() => (window as unknown as { __shared: unknown[] }).__shared)) as SharedFile[];
    const c = await code();
    expect(shared).toHaveLength(1);
    expect(shared[0]!.type).toBe('application/pdf');
    expect(shared[0]!.head).toBe('%PDF-');
    expect(shared[0]!.size).toBeGreaterThan(2000);
    expect(shared[0]!.name).toMatch(new RegExp(`^kinnote-report-${c}-\\d{4}-\\d{2}-\\d{2}\\.pdf$`));
    expect(shared[0]!.title).toBe(`Outcome report ${c}`);
    page.off('download', onDownload);
    expect(downloads).toBe(0);
    await page.setViewportSize(smallPhone);
    await screenshot(page, 'report-share-360');
    await page.locator('div.controls').screenshot({ path: join(screenshotDir, 'report-share-360-controls.png') });
    await page.setViewportSize(tablet);
  }, 60_000);

  it('closing the share sheet (AbortError) is no error and sends nothing; a refused share (NotAllowedError) downloads instead and says why; a file that cannot be made is an alert', async () => {
    await openReport(reportPaths[0]!, 'abort');
    let downloads = 0;
    const onDownload = () => downloads++;
    page.on('download', onDownload);
    await page.getByRole('button', { name: 'Share as PDF' }).click();
    await expect.poll(() => status().textContent()).toBe('Sharing cancelled: nothing was sent.');
    expect(await page.getByRole('alert').count()).toBe(0);
    expect(downloads).toBe(0);
    page.off('download', onDownload);

    await openReport(reportPaths[0]!, 'refuse');
    const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'Share as PDF' }).click()]);
    expect(download.suggestedFilename()).toMatch(/^kinnote-report-.*\.pdf$/);
    await expect.poll(() => status().textContent()).toMatch(/did not take the file \(NotAllowedError: .*\); kinnote-report-.*\.pdf .* was downloaded instead/);
    await page.locator('div.controls').screenshot({ path: join(screenshotDir, 'report-share-refused-controls.png') });

    // A failure to make the file is said plainly, as an alert, and nothing is downloaded.
    await openReport(reportPaths[0]!, 'no-file');
    let failedDownloads = 0;
    const onFailedDownload = () => failedDownloads++;
    page.on('download', onFailedDownload);
    await page.getByRole('button', { name: 'Download PDF' }).click();
    await expect.poll(() => page.getByRole('alert').textContent()).toMatch(/^Could not make the PDF: .*File is not available here \(test\).*Nothing was sent/);
    page.off('download', onFailedDownload);
    expect(failedDownloads).toBe(0);
    expect(await page.getByRole('button', { name: 'Download PDF' }).isEnabled()).toBe(true);
  }, 60_000);

  it('the shared PDF holds the name only when names are unlocked and the box is ticked', async () => {
    await openReport(reportPaths[0]!, 'accept');
    await unlockVault(page);
    await page.locator('article.report').waitFor();
    const box = page.getByLabel("Include the patient's name and date of birth");
    await expect.poll(() => box.isEnabled()).toBe(true);
    const sharedText = async (n: number): Promise<string> => {
      await page.getByRole('button', { name: 'Share as PDF' }).click();
      await expect.poll(async () => ((await page.evaluate(() => (window as unknown as { __shared: unknown[] }).__shared)) as SharedFile[]).length).toBe(n);
      const shared = ((await page.evaluate(() => (window as unknown as { __shared: unknown[] }).__shared)) as SharedFile[])[n - 1]!;
      const file = join(outDir, `shared-${n}.pdf`);
      writeFileSync(file, Buffer.from(shared.base64, 'base64'));
      expect(shared.name).not.toMatch(/\s/);
      return pdfFacts(file).text;
    };
    const unticked = await sharedText(1);
    await box.check();
    const name = ((await page.locator('article.report .who strong:not(.code)').textContent()) ?? '').trim();
    expect(name).toMatch(/\S+ \S+/);
    expect(unticked).not.toContain(name);
    expect(unticked).not.toContain(name.split(' ').pop()!);
    const ticked = await sharedText(2);
    expect(ticked).toContain(name);
    await box.uncheck();
  }, 90_000);
});
