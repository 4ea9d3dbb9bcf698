// The report for the referring clinician: reached from the patient page, offline; pseudonymous by
// default and named only when chosen with names unlocked; axe-clean at 360 px and 1024 px; printed
// to A4 PDF (Chromium's own print path) with the app chrome gone, and its pages rendered to images.
import { execFileSync } from 'node:child_process';
import { existsSync, mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { sharedPatientPage } from '../support/shared-browser';
import { unlockVault } from './app-helpers';
import { reflowProblems, rootFontPx, screenshot, screenshotDir, seriousAxeViolations, setTextScale, smallPhone, tablet, waitForSettledPage } from './harness';

const app = sharedPatientPage({ offlineWorker: true });

/** Pages in a PDF written by Chromium (page objects are plain, not in object streams). */
function pdfPageCount(pdf: Buffer): number {
  return (pdf.toString('latin1').match(/\/Type\s*\/Page(?![s\w])/g) ?? []).length;
}

describe('report for the referring clinician', () => {
  it('opens from the patient page offline, shows the code (no name), every measure with a verdict and the cautions; axe-clean at 1024 px', async () => {
    await app.context.setOffline(true);
    await app.page.goto(app.patientPath);
    await app.page.getByRole('link', { name: 'Report for the referrer' }).click();
    const report = app.page.locator('article.report');
    await report.waitFor();
    await waitForSettledPage(app.page, 'report');
    // The default scope is the latest injection, else the latest event (every demo patient has one).
    expect(await app.page.getByRole('combobox', { name: 'Report on' }).inputValue()).toMatch(/^event:/);
    expect(await report.locator('.who').textContent()).toMatch(/Patient [2-9A-Z]{4}-[2-9A-Z]{4}\s*$/);
    const rows = report.locator('table.measures tbody');
    expect(await rows.count()).toBeGreaterThan(0);
    // Each compared row carries a sentence and an MDC, and each MDC a numbered note that exists.
    for (const sup of await report.locator('sup a').all()) {
      const target = (await sup.getAttribute('href')) as string;
      expect(await report.locator(target).count()).toBe(1);
    }
    expect(await report.locator('svg.spark').count()).toBe(await rows.count());
    expect(await report.locator('.cautions').textContent()).toMatch(/not a diagnostic device.*licensed clinicians.*local protocols and data-protection law/s);
    await expect.poll(() => app.page.getByText(/Save as PDF/).count()).toBeGreaterThan(0);
    await screenshot(app.page, 'report-tablet');
    expect(await seriousAxeViolations(app.page)).toEqual([]);
    await app.context.setOffline(false);
  }, 120_000);

  it('at 360 px the report reflows (no sideways scroll) and axe finds nothing serious', async () => {
    await app.page.setViewportSize(smallPhone);
    await app.page.locator('article.report').waitFor();
    await waitForSettledPage(app.page, 'report at 360 px');
    expect(await reflowProblems(app.page)).toEqual([]);
    await screenshot(app.page, 'report-360');
    const top = await app.page.evaluate(() => (document.querySelector('article.report') as HTMLElement).getBoundingClientRect().top + window.scrollY);
    await app.page.screenshot({ path: join(screenshotDir, 'report-360-measures.png'), fullPage: true, clip: { x: 0, y: top, width: 360, height: 1000 } });
    expect(await seriousAxeViolations(app.page)).toEqual([]);
    // 200 % text at 360 px still reflows (WCAG 2.2 1.4.4 and 1.4.10).
    await setTextScale(app.page, 2);
    await expect.poll(() => rootFontPx(app.page)).toBe(32);
    await waitForSettledPage(app.page, 'report at 360 px, 200 % text');
    expect(await reflowProblems(app.page)).toEqual([]);
    await screenshot(app.page, 'report-360-text-200');
    await setTextScale(app.page, 1);
    await app.page.setViewportSize(tablet);
  }, 60_000);

  it('print media hides the app header and the controls; a period can be chosen', async () => {
    await app.page.getByRole('combobox', { name: 'Report on' }).selectOption('period');
    await app.page.getByRole('textbox', { name: 'From' }).waitFor();
    expect(await app.page.locator('article.report .scope').textContent()).toMatch(/Change from/);
    await app.page.getByRole('combobox', { name: 'Report on' }).selectOption({ index: 0 });
    await app.page.emulateMedia({ media: 'print' });
    expect(await app.page.locator('header.top').isVisible()).toBe(false);
    expect(await app.page.getByRole('button', { name: 'Print or save as PDF' }).isVisible()).toBe(false);
    expect(await app.page.locator('article.report').isVisible()).toBe(true);
    await screenshot(app.page, 'report-print-media');
    // null, not 'screen': a forced screen medium would also apply to page.pdf() below.
    await app.page.emulateMedia({ media: null });
  }, 60_000);

  it('prints every demo patient to A4 PDF; prints the page counts; at most two pages each; pages rendered to images', async () => {
    await app.page.goto('/patients');
    await app.page.locator('a.row').first().waitFor();
    const paths = [...new Set(await app.page.locator('a.row').evaluateAll((as) => as.map((a) => (a as HTMLAnchorElement).getAttribute('href') as string)))];
    const counts: string[] = [];
    const pdfDir = join('test-output', 'report-pdf');
    mkdirSync(pdfDir, { recursive: true });
    let first = '';
    const pageCounts: number[] = [];
    for (const path of paths) {
      await app.page.goto(`${path}/report`);
      await app.page.locator('article.report').waitFor();
      await waitForSettledPage(app.page, `report of ${path}`);
      const rows = await app.page.locator('table.measures tbody').count();
      const pdf = await app.page.pdf({ format: 'A4', printBackground: true, preferCSSPageSize: true });
      const pages = pdfPageCount(pdf);
      counts.push(`${path.slice(-6)}: ${rows} measures → ${pages} A4 page${pages === 1 ? '' : 's'} (${Math.round(pdf.length / 1024)} KiB)`);
      const file = join(pdfDir, `report-${path.slice(-6)}.pdf`);
      writeFileSync(file, pdf);
      if (!first || pages > 2) first = file; // render the first, or one that overflows
      pageCounts.push(pages);
    }
    console.log(counts.join('\n'));
    // Rendering the PDF's pages needs poppler's pdftoppm; where it is missing the PDF stays for a viewer.
    if (existsSync('/usr/bin/pdftoppm')) {
      mkdirSync(screenshotDir, { recursive: true });
      execFileSync('/usr/bin/pdftoppm', ['-r', '80', '-png', first, join(screenshotDir, 'report-pdf-page')]);
      console.log(`PDF pages of ${first} rendered to ${screenshotDir}/report-pdf-page-*.png`);
    }
    expect(Math.min(...pageCounts)).toBeGreaterThanOrEqual(1);
    expect(Math.max(...pageCounts), counts.join('; ')).toBeLessThanOrEqual(2);
  }, 300_000);

  it('names the patient only when chosen with names unlocked, and drops the name when unticked', async () => {
    await app.page.goto(app.patientPath);
    await unlockVault(app.page);
    await app.page.getByRole('link', { name: 'Report for the referrer' }).click();
    const box = app.page.getByLabel("Include the patient's name and date of birth");
    await expect.poll(() => box.isEnabled()).toBe(true);
    const who = app.page.locator('article.report .who');
    const coded = ((await who.textContent()) ?? '').trim();
    await box.check();
    await expect.poll(async () => ((await who.textContent()) ?? '').trim()).not.toBe(coded);
    expect(await who.textContent()).toMatch(/· \S+ \S+/);
    await screenshot(app.page, 'report-named');
    await box.uncheck();
    await expect.poll(async () => ((await who.textContent()) ?? '').trim()).toBe(coded);
  }, 120_000);
});
