// Two tabs on the same patient in one browser (two pages of one context: one IndexedDB, one
// BroadcastChannel, separate sessionStorage): a stale programme form is refused and the other tab's
// edit survives; two tabs writing the first programme give one; each tab keeps its own draft; text
// typed while a save runs stays in the form and in the draft.
import { beforeAll, describe, expect, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { setUpDevice, tableRows } from './app-helpers';
import { join } from 'node:path';
import { newAppContext, screenshot, screenshotDir, seriousAxeViolations, smallPhone } from './harness';
import { sharedChromium } from '../support/shared-browser';

interface ProgrammeRowLike {
  id: string;
  patientId: string;
  deleted: boolean;
  updatedAt: string;
  title: string;
  items: { name: string }[];
}
interface DraftRowLike {
  id: string;
  form: string;
  tabId: string;
  content: { form: { title: string; exercises: { name: string }[] }; basedOn: string | null };
}

const chromium = sharedChromium();
let context: BrowserContext;
let tabA: Page;
let tabB: Page;
let programmePath = '';

const screenshotPath = (name: string) => join(screenshotDir, `${name}.png`);
const CONFLICT = /changed in another tab or device: reload/;

async function openProgramme(page: Page): Promise<void> {
  await page.goto(programmePath);
  // The form is live once its drafts were read.
  await page.locator('form.plan[aria-busy="false"]').waitFor();
}
const titleField = (page: Page) => page.getByLabel('Title', { exact: true });
const firstExercise = (page: Page) => page.getByLabel('What to do, in your words').first();
const saveButton = (page: Page) => page.getByRole('button', { name: 'Save the programme' });
/** Waits for the outcome of a save and expects success (a refusal's text shows in the failure). */
async function expectSaved(page: Page): Promise<void> {
  const outcome = page.locator('form.plan').locator('p.ok, p.error');
  await outcome.first().waitFor();
  expect(await outcome.first().textContent()).toMatch(/^Programme saved/);
}
const liveProgrammes = async (page: Page) => (await tableRows<ProgrammeRowLike>(page, 'homeProgrammes')).filter((p) => !p.deleted);
const programmeDrafts = async (page: Page) => (await tableRows<DraftRowLike>(page, 'drafts')).filter((d) => d.form === 'programme');
/** Waits until the tab's typing reached IndexedDB (the keeper writes at most 250 ms after a change). */
async function draftWithTitle(page: Page, title: string): Promise<DraftRowLike> {
  await expect.poll(async () => (await programmeDrafts(page)).filter((d) => d.content.form.title === title).length, { timeout: 10_000 }).toBe(1);
  return (await programmeDrafts(page)).find((d) => d.content.form.title === title)!;
}

/**
 * Holds a write transaction on one of the app's tables until `release(page)`, so that a save into
 * that table waits (as on a busy device) while the test types.
 */
async function holdTable(page: Page, table: string): Promise<void> {
  await page.evaluate(
    (name) =>
      new Promise<void>((resolve, reject) => {
        const open = indexedDB.open('kinnote');
        open.onerror = () => reject(open.error);
        open.onsuccess = () => {
          const w = window as unknown as { releaseHeldTable?: boolean };
          w.releaseHeldTable = false;
          const tx = open.result.transaction([name], 'readwrite');
          const store = tx.objectStore(name);
          const spin = () => {
            if (!w.releaseHeldTable) store.count().onsuccess = spin;
          };
          spin();
          tx.oncomplete = () => open.result.close();
          resolve();
        };
      }),
    table,
  );
}
const release = (page: Page) => page.evaluate(() => void ((window as unknown as { releaseHeldTable?: boolean }).releaseHeldTable = true));

beforeAll(async () => {
  context = await newAppContext(chromium.browser, { viewport: smallPhone });
  tabA = await context.newPage();
  await setUpDevice(tabA, { demo: false });
  await tabA.goto('/patients/new');
  await tabA.getByLabel('Birth year').fill('1958');
  await tabA.getByLabel('Left').check();
  await tabA.getByRole('button', { name: 'Add patient' }).click();
  await tabA.waitForURL(/\/patients\/[0-9a-f-]{36}$/);
  programmePath = `${new URL(tabA.url()).pathname}/programme`;
  tabB = await context.newPage();
});


describe('two tabs on the same patient', () => {
  it('two tabs writing the first programme give one programme; the other tab keeps its typing', async () => {
    await openProgramme(tabA);
    await openProgramme(tabB);
    await titleField(tabA).fill('First from tab A');
    await firstExercise(tabA).fill('Calf stretch against the wall');
    await tabA.getByLabel('Repetitions').first().fill('10');
    await titleField(tabB).fill('First from tab B');
    await firstExercise(tabB).fill('Hamstring stretch on the bed');
    await tabB.getByLabel('Repetitions').first().fill('5');
    // Each tab has its own draft.
    const draftA = await draftWithTitle(tabA, 'First from tab A');
    const draftB = await draftWithTitle(tabB, 'First from tab B');
    expect(draftA.id).not.toBe(draftB.id);

    await saveButton(tabA).click();
    await expectSaved(tabA);
    await saveButton(tabB).click();
    await tabB.getByRole('alert').filter({ hasText: CONFLICT }).waitFor();

    const programmes = await liveProgrammes(tabA);
    expect(programmes.map((p) => [p.title, p.items.map((i) => i.name)])).toEqual([['First from tab A', ['Calf stretch against the wall']]]);
    // A's save removed A's draft only; B's typing is still in its form and in its draft.
    expect((await programmeDrafts(tabA)).map((d) => d.content.form.title)).toEqual(['First from tab B']);
    expect(await titleField(tabB).inputValue()).toBe('First from tab B');
  });

  it('a stale form saved in tab B is refused with the reload message, and tab A\'s edit survives', async () => {
    // B takes the saved programme (its draft was made before the programme existed).
    await tabB.getByRole('button', { name: 'Reload the programme' }).click();
    await expect.poll(() => titleField(tabB).inputValue()).toBe('First from tab A');
    expect(await programmeDrafts(tabB)).toEqual([]);
    await openProgramme(tabA);

    // Both tabs read the same version; B starts typing, then A edits and saves.
    await titleField(tabB).fill('Stale edit from tab B');
    await draftWithTitle(tabB, 'Stale edit from tab B');
    await titleField(tabA).fill('Edited in tab A');
    await saveButton(tabA).click();
    await expectSaved(tabA);
    // B hears of the write (BroadcastChannel) and says so before any save.
    await tabB.getByText('This programme was changed in another tab or on another device.').waitFor();

    await saveButton(tabB).click();
    const refusal = tabB.getByRole('alert').filter({ hasText: CONFLICT });
    await refusal.waitFor();
    expect(await refusal.textContent()).toMatch(/^Not saved: changed in another tab or device: reload/);
    expect((await liveProgrammes(tabA)).map((p) => p.title)).toEqual(['Edited in tab A']);
    // B's typing is not lost: still in its form and in its own draft.
    expect(await titleField(tabB).inputValue()).toBe('Stale edit from tab B');
    expect((await programmeDrafts(tabA)).map((d) => d.content.form.title)).toEqual(['Stale edit from tab B']);

    await screenshot(tabB, 'two-tabs-stale-refused-360-full');
    await refusal.scrollIntoViewIfNeeded();
    await tabB.screenshot({ path: screenshotPath('two-tabs-stale-refused-360') });
    expect(await seriousAxeViolations(tabB)).toEqual([]);

    // A draft restored after a reload of B still refers to the old version, so it is refused too.
    await openProgramme(tabB);
    await tabB.getByText(/Draft restored/).waitFor();
    expect(await titleField(tabB).inputValue()).toBe('Stale edit from tab B');
    await saveButton(tabB).click();
    await tabB.getByRole('alert').filter({ hasText: CONFLICT }).waitFor();
    expect((await liveProgrammes(tabA)).map((p) => p.title)).toEqual(['Edited in tab A']);

    await tabB.getByRole('button', { name: 'Reload the programme' }).click();
    await expect.poll(() => titleField(tabB).inputValue()).toBe('Edited in tab A');
  });

  it('text typed while a save runs stays in the form and in the draft, and the saved version is what Save was pressed on', async () => {
    await openProgramme(tabA);
    await titleField(tabA).fill('Pressed Save on this');
    await draftWithTitle(tabA, 'Pressed Save on this');
    await holdTable(tabA, 'homeProgrammes');
    await saveButton(tabA).click();
    await expect.poll(() => saveButton(tabA).isDisabled()).toBe(true);
    await titleField(tabA).fill('Typed while it was saving');
    await release(tabA);
    await tabA.getByText(/What you typed while it was saving is still in the form/).waitFor();

    expect(await titleField(tabA).inputValue()).toBe('Typed while it was saving');
    expect((await liveProgrammes(tabA)).map((p) => p.title)).toEqual(['Pressed Save on this']);
    const kept = await draftWithTitle(tabA, 'Typed while it was saving');
    // The new draft is based on the version just saved, so saving it is not refused as stale.
    expect(kept.content.basedOn).toBe((await liveProgrammes(tabA))[0]!.updatedAt);

    await openProgramme(tabA);
    await tabA.getByText(/Draft restored/).waitFor();
    expect(await titleField(tabA).inputValue()).toBe('Typed while it was saving');
    await saveButton(tabA).click();
    await expectSaved(tabA);
    expect((await liveProgrammes(tabA)).map((p) => p.title)).toEqual(['Typed while it was saving']);
    expect(await programmeDrafts(tabA)).toEqual([]);
  });

  it('in the assessment form, values changed while the save runs stay in the form as a draft; the saved assessment has the values Save was pressed on', async () => {
    const minutes = () => tabA.getByLabel('Minutes since medication');
    const assessments = async () => (await tableRows<{ deleted: boolean; conditions: { minutesSinceMedication: number | null } }>(tabA, 'assessments')).filter((a) => !a.deleted);
    const assessmentDrafts = async () => (await tableRows<{ form: string; content: { draft: { minutesSinceMedication: string } } }>(tabA, 'drafts')).filter((d) => d.form === 'assessment');
    await tabA.goto(programmePath.replace(/\/programme$/, '/assess'));
    await tabA.locator('form.assessment[aria-busy="false"]').waitFor();
    const mas = tabA.locator('section', { has: tabA.getByRole('heading', { name: 'Modified Ashworth' }) });
    await mas.getByRole('button', { name: 'Add a muscle group' }).click();
    await mas.getByRole('radio', { name: '1+', exact: true }).check();
    await minutes().fill('30');
    await expect.poll(async () => (await assessmentDrafts()).map((d) => d.content.draft.minutesSinceMedication)).toEqual(['30']);

    await holdTable(tabA, 'assessments');
    await tabA.getByRole('button', { name: 'Save assessment' }).click();
    await tabA.getByRole('button', { name: 'Save visit' }).click();
    await tabA.getByRole('button', { name: 'Saving…' }).waitFor();
    await minutes().fill('45');
    await release(tabA);
    await tabA.getByText(/You changed the form while it was saving/).waitFor();

    expect((await assessments()).map((a) => a.conditions.minutesSinceMedication)).toEqual([30]);
    expect(await minutes().inputValue()).toBe('45');
    await expect.poll(async () => (await assessmentDrafts()).map((d) => d.content.draft.minutesSinceMedication)).toEqual(['45']);
    await tabA.reload();
    await tabA.getByText(/Draft restored/).waitFor();
    expect(await minutes().inputValue()).toBe('45');
    tabA.once('dialog', (d) => void d.accept());
    await tabA.getByRole('button', { name: 'Discard draft' }).click();
    await expect.poll(assessmentDrafts).toEqual([]);
  });
});
