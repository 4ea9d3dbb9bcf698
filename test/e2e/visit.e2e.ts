// The visit as the unit of work: a first home visit built by hand, then a follow-up laid out from it
// (carry forward), counted in taps on a phone and a tablet, offline; error summary and Enter.
import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { join } from 'node:path';
import { setUpDevice, tableRows } from './app-helpers';
import { sharedChromium } from '../support/shared-browser';
import { Taps } from './taps';
import { newAppContext, phone, screenshot, screenshotDir, seriousAxeViolations, tablet, waitForOfflineWorker } from './harness';

const chromium = sharedChromium();


const section = (page: Page, heading: string) => page.locator('section', { has: page.getByRole('heading', { name: heading, exact: true }) });

async function addPatient(page: Page): Promise<string> {
  await page.goto('/patients/new');
  await page.getByLabel('Birth year').fill('1961');
  await page.getByLabel('Left').check();
  await page.getByRole('button', { name: 'Add patient' }).click();
  await page.getByRole('heading', { name: 'Change since baseline' }).or(page.getByText('No measurements yet')).first().waitFor();
  return new URL(page.url()).pathname;
}

/** From the app's first screen (the caseload, once the device is set up) to the visit form of the only patient. */
async function openVisit(page: Page, t: Taps): Promise<void> {
  await page.goto('/');
  await page.getByRole('heading', { name: 'Caseload', level: 1 }).waitFor();
  await t.tap(page.locator('a.row').first());
  await t.tap(page.getByRole('link', { name: 'New assessment' }));
  await page.getByRole('heading', { name: /New assessment/ }).waitFor();
}

/** The typical home visit entered by hand: 4 Modified Ashworth muscles, one Tardieu pair, one ROM, spasm frequency and severity. */
async function firstVisitByHand(page: Page, t: Taps): Promise<void> {
  const mas = section(page, 'Modified Ashworth');
  const muscles: Array<[string, string, string]> = [
    ['ankle-plantarflexors', 'Left', '1+'],
    ['knee-extensors', 'Left', '1'],
    ['knee-flexors', 'Left', '2'],
    ['hip-adductors', 'Left', '1'],
  ];
  for (const [site, , grade] of muscles) {
    await t.tap(mas.getByRole('button', { name: 'Add a muscle group' }));
    const row = mas.locator('.entry').last();
    // Focus moves to the new row's muscle group (not left on the button).
    await expect.poll(() => page.evaluate(() => document.activeElement?.tagName)).toBe('SELECT');
    await t.choose(row.getByLabel('Muscle group'), site);
    // Left is already chosen for a new row: no tap needed.
    await t.tap(row.getByRole('radio', { name: grade, exact: true }));
  }
  const tardieu = section(page, 'Modified Tardieu');
  await t.tap(tardieu.getByRole('button', { name: 'Add a Tardieu test' }));
  await t.choose(tardieu.getByLabel('Muscle group'), 'knee-extensors');
  await t.type(tardieu.getByLabel('R1, fast (°)'), '70');
  await t.type(tardieu.getByLabel('R2, slow (°)'), '115');
  await t.tap(tardieu.getByRole('radio', { name: '2', exact: true }));
  const rom = section(page, 'Range of motion');
  await t.tap(rom.getByRole('button', { name: 'Add a joint motion' }));
  await t.choose(rom.getByLabel('Joint motion'), 'knee-flexion');
  await t.type(rom.getByLabel('Angle (°)'), '118');
  const spasms = section(page, 'Spasms');
  await t.tap(spasms.getByRole('group', { name: 'Penn spasm frequency' }).getByRole('radio', { name: '2', exact: true }));
  await t.tap(spasms.getByRole('group', { name: /Spasm severity/ }).getByRole('radio', { name: '5', exact: true }));
}

/** The follow-up: the same tests laid out with last time's values; one tap per grade. */
async function followUpVisit(page: Page, t: Taps): Promise<void> {
  const mas = section(page, 'Modified Ashworth');
  await expect(mas.locator('.entry').count()).resolves.toBe(4);
  await mas.getByText('Last time 1+').waitFor();
  for (const [i, grade] of ['1', '1', '1+', '0'].entries()) await t.tap(mas.locator('.entry').nth(i).getByRole('radio', { name: grade, exact: true }));
  const tardieu = section(page, 'Modified Tardieu');
  await tardieu.getByText('Last time R1 70° · R2 115° · quality 2').waitFor();
  await t.type(tardieu.getByLabel('R1, fast (°)'), '75');
  await t.type(tardieu.getByLabel('R2, slow (°)'), '116');
  await t.tap(tardieu.getByRole('radio', { name: '2', exact: true }));
  const rom = section(page, 'Range of motion');
  await rom.getByText('Last time 118°').waitFor();
  await t.type(rom.getByLabel('Angle (°)'), '121');
  const spasms = section(page, 'Spasms');
  await t.tap(spasms.getByRole('group', { name: 'Penn spasm frequency' }).getByRole('radio', { name: '1', exact: true }));
  await t.tap(spasms.getByRole('group', { name: /Spasm severity/ }).getByRole('radio', { name: '4', exact: true }));
}

type StoredObservation = { assessmentId: string; measureCode: string; siteCode: string; side: string; mode: string | null; deleted: boolean };
const key = (o: StoredObservation) => `${o.measureCode}|${o.siteCode}|${o.side}|${o.mode ?? ''}`;

describe('a follow-up home visit carries the last visit forward', () => {
  for (const [size, viewport] of [
    ['phone', phone],
    ['tablet', tablet],
  ] as const) {
    it(`takes at most 15 taps from opening the app to saved at ${size} size, offline, and continues every series`, async () => {
      const context = await newAppContext(chromium.browser, { viewport });
      const page = await context.newPage();
      await setUpDevice(page, { demo: false });
      await waitForOfflineWorker(page);
      await addPatient(page);
      await context.setOffline(true);

      const before = new Taps();
      await openVisit(page, before);
      await firstVisitByHand(page, before);
      await before.tap(page.getByRole('button', { name: 'Save assessment' }));
      await before.tap(page.getByRole('button', { name: 'Save visit' }));
      await page.getByText('Assessment saved.').waitFor();

      const after = new Taps();
      await openVisit(page, after);
      await followUpVisit(page, after);
      await screenshot(page, `visit-follow-up-${size}`);
      expect(await seriousAxeViolations(page)).toEqual([]);
      await after.tap(page.getByRole('button', { name: 'Save assessment' }));
      // The review before saving, in place: focus on its heading, last time → today for each test.
      const review = page.locator('section.review');
      await review.getByRole('heading', { name: 'Check before saving' }).waitFor();
      expect(await page.evaluate(() => document.activeElement?.id)).toBe('review-heading');
      expect(await review.locator('li').count()).toBe(8);
      // Modified Ashworth moves one grade step at the ankle (1+ → 1), hamstrings (2 → 1+) and hip (1 → 0):
      // each at least the one-step threshold for ordinal grades (common practice); the quadriceps stay at 1.
      const beyondAshworth = await review.locator('li.beyond', { hasText: 'Modified Ashworth' }).locator('.title').allTextContents();
      expect(beyondAshworth.map((t) => t.split(' · ')[0])).toEqual(['Left ankle plantarflexors', 'Left knee flexors (hamstrings)', 'Left hip adductors']);
      await screenshot(page, `visit-review-${size}`);
      // What the person sees at that moment (not the whole page): the review's heading in view, not under the save bar.
      await page.screenshot({ path: join(screenshotDir, `visit-review-view-${size}.png`) });
      const headingBox = await review.getByRole('heading', { name: 'Check before saving' }).boundingBox();
      const barBox = await review.locator('.save-bar').boundingBox();
      const where = JSON.stringify({ headingBox, barBox });
      expect(headingBox && barBox && headingBox.y + headingBox.height <= barBox.y, where).toBe(true);
      expect(headingBox && headingBox.y >= 0 && headingBox.y < (page.viewportSize()?.height ?? 0), where).toBe(true);
      expect(await seriousAxeViolations(page)).toEqual([]);
      await after.tap(review.getByRole('button', { name: 'Save visit' }));
      await page.getByText('Assessment saved.').waitFor();

      console.log(`[visit taps, ${size}] first visit by hand: ${before.taps} taps + ${before.digits} digits; follow-up carried forward: ${after.taps} taps + ${after.digits} digits (from opening the app to saved)`);
      expect(after.taps).toBeLessThanOrEqual(15);
      expect(after.taps).toBeLessThan(before.taps);

      // Every observation of the follow-up continues a series of the first visit: no new series.
      const stored = (await tableRows<StoredObservation>(page, 'observations')).filter((o) => !o.deleted);
      const visits = [...new Set(stored.map((o) => o.assessmentId))].sort();
      expect(visits.length).toBe(2);
      const firstKeys = new Set(stored.filter((o) => o.assessmentId === visits[0]).map(key));
      const second = stored.filter((o) => o.assessmentId === visits[1]);
      expect(second.length).toBe(8);
      for (const o of second) expect(firstKeys.has(key(o))).toBe(true);
      await context.close();
    });
  }

  it('names and marks every field in the error summary, moves focus to the first, and never saves on Enter', async () => {
    const context = await newAppContext(chromium.browser, { viewport: phone });
    const page = await context.newPage();
    await setUpDevice(page, { demo: false });
    await addPatient(page);
    const first = new Taps();
    await openVisit(page, first);
    await firstVisitByHand(page, first);
    await page.getByRole('button', { name: 'Save assessment' }).click();
    await page.getByRole('button', { name: 'Save visit' }).click();
    await page.getByText('Assessment saved.').waitFor();
    await openVisit(page, new Taps());

    // Enter in a number field does not save the visit.
    const tardieu = section(page, 'Modified Tardieu');
    await tardieu.getByLabel('R1, fast (°)').fill('80');
    await tardieu.getByLabel('R1, fast (°)').press('Enter');
    await expect.poll(() => page.getByRole('heading', { name: /New assessment/ }).count()).toBe(1);
    expect(await page.getByText('Assessment saved.').count()).toBe(0);
    expect(await page.getByRole('heading', { name: 'Check before saving' }).count()).toBe(0);

    // One grade chosen shows its definition under the control, without hovering.
    const mas = section(page, 'Modified Ashworth');
    await mas.locator('.entry').nth(0).getByRole('radio', { name: '1+', exact: true }).click();
    await mas.getByText(/1\+: Slightly raised tone: a catch, then/).waitFor();
    await mas.locator('.entry').nth(1).getByRole('button', { name: 'What the grades mean' }).click();
    await mas.locator('.entry').nth(1).getByText('Limb rigid in flexion or extension').waitFor();

    // Mark every other test not tested except the second muscle (the kept protocol keeps the order the tests were added: quadriceps), which stays blank.
    await mas.locator('.entry').nth(2).getByRole('button', { name: 'Not tested today' }).click();
    await mas.locator('.entry').nth(3).getByRole('button', { name: 'Not tested today' }).click();
    await section(page, 'Range of motion').getByRole('button', { name: 'Not tested today' }).click();
    await page.getByRole('button', { name: 'Save assessment' }).click();
    const summary = page.locator('#issue-summary');
    await summary.waitFor();
    // R2 and the quality are missing from the half-filled Tardieu row; the second muscle is blank.
    const items = await summary.getByRole('link').allTextContents();
    expect(items).toEqual([
      'Modified Ashworth, left knee extensors (quadriceps): no value yet: record one, or tap "Not tested today"',
      'Tardieu, left rectus femoris / quadriceps: needed for a Tardieu entry',
      'Tardieu, left rectus femoris / quadriceps: needed for a Tardieu entry',
    ]);
    expect(await summary.getByText('Please check 3 fields marked below.').count()).toBe(1);
    // Focus is on the first marked field, which says it needs attention.
    expect(await page.evaluate(() => (document.activeElement as HTMLInputElement | null)?.name ?? '')).toMatch(/^mas-grade-/);
    await mas.locator('.entry').nth(1).getByText('(needs attention)').waitFor();
    expect(await tardieu.getByLabel('R2, slow (°)').getAttribute('aria-invalid')).toBe('true');
    await screenshot(page, 'visit-error-summary-phone');
    // A link in the summary moves focus to its field.
    await summary.getByRole('link').nth(1).click();
    expect(await page.evaluate(() => document.activeElement?.id)).toBe('tardieu-0-r2Deg');
    await context.close();
  });

  it('opens a saved visit and amends it with a reason, audited with the old and new value', async () => {
    const context = await newAppContext(chromium.browser, { viewport: tablet });
    const page = await context.newPage();
    await setUpDevice(page, { demo: false });
    await addPatient(page);
    await openVisit(page, new Taps());
    await firstVisitByHand(page, new Taps());
    await page.getByRole('button', { name: 'Save assessment' }).click();
    await page.getByRole('button', { name: 'Save visit' }).click();
    await page.getByText('Assessment saved.').waitFor();

    await page.getByRole('link', { name: /Open or amend the visit of/ }).click();
    await page.getByRole('heading', { name: /Amend a visit/ }).waitFor();
    const mas = section(page, 'Modified Ashworth');
    // The saved grades are in the form: hip adductors (catalogue order first) was 1.
    const hip = mas.locator('.entry').nth(0);
    expect(await hip.getByRole('radio', { name: '1', exact: true }).isChecked()).toBe(true);
    expect(await section(page, 'Range of motion').getByLabel('Angle (°)').inputValue()).toBe('118');
    await hip.getByRole('radio', { name: '3', exact: true }).click();
    await page.getByRole('button', { name: 'Save the amendment' }).click();
    await page.locator('#issue-summary').getByRole('link', { name: /Reason for the amendment/ }).waitFor();
    expect(await page.evaluate(() => document.activeElement?.id)).toBe('amendReason');
    await page.getByLabel('Reason for the amendment').fill('grade entered on the wrong side of the scale');
    await screenshot(page, 'visit-amend-tablet');
    await page.getByRole('button', { name: 'Save the amendment' }).click();
    // The patient's only visit: nothing before it to compare with, said plainly (not "new test").
    const review = page.locator('section.review');
    await review.getByText('Nothing earlier to compare with.').waitFor();
    expect(await review.getByText('new test').count()).toBe(0);
    expect(await review.getByText('first visit →').count()).toBe(await review.locator('li').count());
    expect(await mas.getByText('First visit: nothing earlier').count()).toBe(4);
    // The review opens in place; "Back to the form" closes it and returns focus to the Save button.
    await page.getByRole('button', { name: 'Back to the form' }).click();
    expect(await page.evaluate(() => document.activeElement?.textContent)).toBe('Save the amendment');
    expect(await page.getByRole('heading', { name: 'Check before saving' }).count()).toBe(0);
    await page.getByRole('button', { name: 'Save the amendment' }).click();
    await page.getByRole('button', { name: 'Save the amended visit' }).click();
    await page.getByText(/Amendment saved/).waitFor();
    // Still one visit line.
    await expect(page.getByRole('link', { name: /Open or amend the visit of/ }).count()).resolves.toBe(1);

    type Audit = { action: string; table: string; note: string | null; before: { value?: { grade: string } } | null; after: { value?: { grade: string } } | null };
    const amended = (await tableRows<Audit>(page, 'audit')).filter((e) => e.note === 'amended: grade entered on the wrong side of the scale');
    expect(amended.map((e) => `${e.action} ${e.table}`).sort()).toEqual(['update assessments', 'update observations']);
    const grade = amended.find((e) => e.table === 'observations')!;
    expect(grade.before?.value?.grade).toBe('1');
    expect(grade.after?.value?.grade).toBe('3');

    await page.getByRole('link', { name: /Open or amend the visit of/ }).click();
    await page.getByText(/grade entered on the wrong side of the scale/).waitFor();
    await context.close();
  });
});
