// The auditor's path, offline: filters with a live count, the cohort summary and charts, and
// de-identified CSV and FHIR files that carry no identity of the (invented) demo patients.
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import Papa from 'papaparse';
import { sharedChromium } from '../support/shared-browser';
import { generateDemoScenario } from '../../src/lib/demo';
import { inkedCanvasShare, setUpDevice } from './app-helpers';
import { newAppContext, screenshot, seriousAxeViolations, tablet, waitForOfflineWorker } from './harness';

const chromium = sharedChromium();

describe('cohort audit in the browser', () => {
  it('goes from opening the app to a de-identified CSV and FHIR bundle for a filtered cohort, offline', async () => {
    const context = await newAppContext(chromium.browser, { viewport: tablet, acceptDownloads: true });
    const page = await context.newPage();
    await setUpDevice(page);
    await waitForOfflineWorker(page);
    await context.setOffline(true);
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Cohort audit' }).click();
    await page.getByRole('heading', { name: 'Cohort audit' }).waitFor();

    const count = page.locator('p.count');
    await count.getByText(/patients? ·/).waitFor();
    const everyone = parseInt((await count.locator('strong').textContent()) ?? '', 10);
    expect(everyone).toBeGreaterThan(0);
    // A narrower filter gives a smaller (live) count: only the left side.
    await page.getByRole('combobox', { name: /^Side/ }).selectOption('left');
    await expect.poll(async () => parseInt((await count.locator('strong').textContent()) ?? '', 10)).toBeLessThanOrEqual(everyone);
    await page.getByRole('combobox', { name: /^Side/ }).selectOption('');
    // A site of one measure, then another measure: the site resets; no developer error, the count stays.
    await page.getByRole('combobox', { name: /^Site/ }).selectOption('ankle-plantarflexors');
    await page.getByRole('combobox', { name: /^Measure/ }).selectOption('rom');
    await expect.poll(async () => page.getByRole('combobox', { name: /^Site/ }).inputValue()).toBe('');
    expect(await count.textContent()).not.toMatch(/not a site|filters\./);
    await page.getByRole('combobox', { name: /^Measure/ }).selectOption('mas');
    await count.getByText(/patients? ·/).waitFor();
    await page.getByRole('combobox', { name: /^Event/ }).selectOption('botulinum-toxin-injection');
    await page.getByRole('heading', { name: 'Change in this cohort' }).waitFor();
    const rows = page.locator('section table tbody tr');
    expect(await rows.count()).toBeGreaterThan(0);
    expect(await page.locator('section table').textContent()).toMatch(/Modified Ashworth/);
    expect(await inkedCanvasShare(page, '.charts')).toBeGreaterThan(0.005);
    await screenshot(page, 'cohort-tablet');
    expect(await seriousAxeViolations(page)).toEqual([]);

    await page.getByRole('button', { name: 'Export' }).click();
    const long = page.getByRole('link', { name: /long/i });
    await long.first().waitFor({ timeout: 30_000 });
    const texts: Record<string, string> = {};
    for (const link of await page.locator('ul.files a').all()) {
      const [download] = await Promise.all([page.waitForEvent('download'), link.click()]);
      texts[download.suggestedFilename()] = readFileSync((await download.path()) as string, 'utf8');
    }
    const names = Object.keys(texts);
    expect(names.some((n) => n.endsWith('.json'))).toBe(true);
    expect(names.filter((n) => n.endsWith('.csv')).length).toBe(3);
    // File names say the day and the filters: kinnote-cohort-YYYY-MM-DD-mas-botulinum-toxin-injection-long.csv
    for (const n of names) expect(n).toMatch(/^kinnote-cohort-\d{4}-\d{2}-\d{2}-mas-botulinum-toxin-injection-(long|wide|summary|fhir)\.(csv|json)$/);
    expect(await page.locator('ul.files').textContent()).not.toMatch(/\b1 rows\b/);

    // The FHIR bundle is a Bundle of Observations; the long CSV parses back.
    const fhir = JSON.parse(texts[names.find((n) => n.endsWith('.json')) as string] as string) as { resourceType: string; entry: Array<{ resource: { resourceType: string } }> };
    expect(fhir.resourceType).toBe('Bundle');
    expect(fhir.entry.some((e) => e.resource.resourceType === 'Observation')).toBe(true);
    const longCsv = texts[names.find((n) => /long/.test(n)) as string] as string;
    const parsed = Papa.parse(longCsv.replace(/^\ufeff/, ''), { header: true, skipEmptyLines: true });
    expect(parsed.errors).toEqual([]);
    expect(parsed.data.length).toBeGreaterThan(0);

    // Re-identification guard: no identity value of the demo (same seed and end date as the app) in any file.
    const scenario = generateDemoScenario({ seed: 20261201, endDate: new Date().toISOString().slice(0, 10) });
    const secrets = [
      ...scenario.tables.identities.flatMap((i) => [i.givenName, i.familyName, i.dateOfBirth, i.contact]),
      ...scenario.tables.patients.map((p) => p.code),
    ].filter((v): v is string => typeof v === 'string' && v.length >= 3);
    expect(secrets.length).toBeGreaterThan(20);
    for (const [name, text] of Object.entries(texts)) {
      for (const secret of secrets) expect(text.includes(secret), `${secret} in ${name}`).toBe(false);
    }
    await context.close();
  });
});
