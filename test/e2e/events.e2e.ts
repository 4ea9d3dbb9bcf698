// Events (interventions) amended and deleted as visits are: open, amend with a reason (audited with the
// old and new values), delete with undo; a true "amended" mark that a delete and undo does not set.
import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { setUpDevice, tableRows, unlockVault } from './app-helpers';
import { join } from 'node:path';
import { sharedChromium } from '../support/shared-browser';
import { Taps } from './taps';
import { screenshotDir, newAppContext, reflowProblems, rootFontPx, waitForSettledPage, screenshot, seriousAxeViolations, setTextScale, smallPhone, tablet, waitForOfflineWorker } from './harness';

const chromium = sharedChromium();


type Audit = { table: string; recordId: string | null; action: string; note: string | null; before: Record<string, unknown> | null; after: Record<string, unknown> | null };

const eventsSection = (page: Page) => page.locator('section', { has: page.getByRole('heading', { name: 'Events', exact: true }) });
const visitsSection = (page: Page) => page.locator('section', { has: page.getByRole('heading', { name: 'Assessments', exact: true }) });

async function addPatientWithHistory(page: Page): Promise<string> {
  await page.goto('/patients/new');
  await page.getByLabel('Birth year').fill('1958');
  await page.getByLabel('Left').check();
  await page.getByRole('button', { name: 'Add patient' }).click();
  await page.getByText('No measurements yet').waitFor();
  const path = new URL(page.url()).pathname;
  // Two events: an injection typed with the wrong date, and a casting to delete and bring back.
  for (const [kind, day, extra] of [
    ['botulinum-toxin-injection', '2025-02-03', true],
    ['serial-casting', '2025-01-10', false],
  ] as const) {
    await eventsSection(page).getByRole('button', { name: 'Add an event' }).click();
    const form = eventsSection(page).locator('form');
    await form.getByLabel('What').selectOption(kind);
    await form.getByLabel('Date').fill(day);
    if (extra) {
      await form.getByLabel('Muscles injected').fill('gastrocnemius, soleus');
      await form.getByLabel('Dose (as written)').fill('200 units in total');
    }
    await form.getByRole('button', { name: 'Save event' }).click();
    await form.waitFor({ state: 'detached' });
  }
  // One visit, to delete and bring back.
  await page.getByRole('link', { name: 'New assessment' }).click();
  const mas = page.locator('section', { has: page.getByRole('heading', { name: 'Modified Ashworth', exact: true }) });
  await mas.getByRole('button', { name: 'Add a muscle group' }).click();
  await mas.getByLabel('Muscle group').selectOption('knee-extensors');
  await mas.getByRole('radio', { name: '1', exact: true }).click();
  await page.getByRole('button', { name: 'Save assessment' }).click();
  await page.getByRole('button', { name: 'Save visit' }).click();
  await page.getByText('Assessment saved.').waitFor();
  return path;
}

describe('events are amended and deleted like visits', () => {
  it('corrects a mistyped injection date with a reason (audited old → new, marked amended), deletes and undoes, at 360 px', async () => {
    const context = await newAppContext(chromium.browser, { viewport: smallPhone });
    const page = await context.newPage();
    page.on('dialog', (d) => void d.accept());
    await setUpDevice(page, { demo: false });
    await waitForOfflineWorker(page);
    const path = await addPatientWithHistory(page);
    await context.setOffline(true);

    // Counted from the caseload, the app's first screen on a set-up device.
    await page.goto('/patients');
    const t = new Taps('fill');
    await t.tap(page.locator('a.row').first());
    const events = eventsSection(page);
    await t.tap(events.getByRole('button', { name: /Open or amend the botulinum toxin injection of/ }));
    const editor = events.getByRole('group', { name: 'Amend this event' });
    await t.type(editor.getByLabel('Date'), '2025-03-02');
    // Without a reason nothing is saved: the message names it and focus moves to the reason.
    await editor.getByRole('button', { name: 'Save amendment' }).click();
    await editor.getByRole('alert').filter({ hasText: 'Say why the event is amended' }).waitFor();
    expect(await page.evaluate(() => document.activeElement?.closest('label')?.textContent?.trim())).toMatch(/^Reason for the amendment/);
    expect((await tableRows<Audit>(page, 'audit')).filter((e) => e.note?.startsWith('amended: '))).toHaveLength(0);
    expect(await seriousAxeViolations(page)).toEqual([]);
    await screenshot(page, 'event-amend-360');
    await t.type(editor.getByLabel('Reason for the amendment'), 'date typed as February, injected in March');
    await t.tap(editor.getByRole('button', { name: 'Save amendment' }));
    await events.getByText('Amendment saved; the audit keeps the old values and the reason.').waitFor();
    console.log(`[event taps] correct a mistyped event date with a reason, from the caseload: ${t.taps} taps + ${t.digits} digits and the reason typed`);
    expect(t.taps).toBeLessThanOrEqual(6);

    const injection = events.locator('li', { hasText: 'Botulinum toxin injection' });
    await expect.poll(() => injection.locator('time').getAttribute('datetime')).toBe('2025-03-02');
    expect(await injection.innerText()).toMatch(/· amended/);
    const audit = (await tableRows<Audit>(page, 'audit')).filter((e) => e.note === 'amended: date typed as February, injected in March');
    expect(audit.map((e) => `${e.action} ${e.table}`)).toEqual(['update events']);
    expect(audit[0]!.before!.occurredOn).toBe('2025-02-03');
    expect(audit[0]!.after!.occurredOn).toBe('2025-03-02');
    // Reopened, the editor lists the amendment with its old and new date.
    await injection.getByRole('button', { name: /Open or amend/ }).click();
    await editor.getByText(/date typed as February, injected in March \(date 2025-02-03 → 2025-03-02\)/).waitFor();
    await setTextScale(page, 2);
    await expect.poll(() => rootFontPx(page)).toBe(32);
    await waitForSettledPage(page, 'the patient page at 200 % text');
    expect(await reflowProblems(page)).toEqual([]);
    // The screen as a person sees it (a full-page capture resizes the page, which loses the text size setting).
    await editor.getByText('Amended before:').scrollIntoViewIfNeeded();
    await page.screenshot({ path: join(screenshotDir, 'event-amend-history-360-text-200.png') });
    await setTextScale(page, 1);
    await editor.getByRole('button', { name: 'Cancel' }).click();

    // Delete with undo: the casting comes back, and is not marked amended.
    const casting = () => events.locator('li', { hasText: 'Serial casting' });
    await casting().getByRole('button', { name: /Open or amend/ }).click();
    await editor.getByRole('button', { name: 'Delete event' }).click();
    await events.getByText(/Deleted the serial casting of/).waitFor();
    await expect.poll(() => casting().count()).toBe(0);
    await events.getByRole('button', { name: 'Undo' }).click();
    await casting().waitFor();
    expect(await casting().innerText()).not.toMatch(/amended/);
    const castingAudit = (await tableRows<Audit>(page, 'audit')).filter((e) => e.table === 'events' && e.action !== 'create' && e.note === null);
    expect(castingAudit.map((e) => e.action)).toEqual(['delete', 'restore']);

    // A visit deleted and brought back is not "amended" (the old mark said "changed since saved").
    const visits = visitsSection(page);
    await visits.getByRole('button', { name: /Delete the assessment of/ }).click();
    await visits.getByRole('button', { name: 'Undo' }).click();
    await visits.getByRole('link', { name: /Open or amend the visit of/ }).waitFor();
    expect(await visits.locator('li').first().innerText()).not.toMatch(/amended|changed since saved/);
    expect(new URL(page.url()).pathname).toBe(path);

    // Visit notes are amended the same way (names unlocked in place): the audit says they changed, never what they say.
    await unlockVault(page);
    await visits.getByRole('link', { name: /Open or amend the visit of/ }).click();
    await page.locator('textarea#notes').fill('Invented: calf tight after the drive');
    await page.getByLabel('Reason for the amendment').fill('note left out at the visit');
    await page.getByRole('button', { name: 'Save the amendment' }).click();
    await page.getByRole('button', { name: 'Save the amended visit' }).click();
    await page.getByText('Amendment saved; the audit keeps the old values and the reason.').waitFor();
    await expect.poll(() => visits.locator('li').first().innerText()).toMatch(/· amended/);
    const noteAudit = (await tableRows<Audit>(page, 'audit')).filter((e) => e.note === 'amended: note left out at the visit');
    expect(noteAudit.map((e) => `${e.action} ${e.table}`)).toEqual(['update assessments']);
    expect(noteAudit[0]!.before!.notesSealed).toBeNull();
    expect(noteAudit[0]!.after!.notesSealed).toBe('[sealed]');
    expect(JSON.stringify(await tableRows(page, 'audit'))).not.toMatch(/calf tight/);
    await visits.getByRole('link', { name: /Open or amend the visit of/ }).click();
    await expect.poll(() => page.locator('textarea#notes').inputValue()).toBe('Invented: calf tight after the drive');
    await context.close();
  });

  it('shows the event editor without axe or reflow problems at 1024 px', async () => {
    const context = await newAppContext(chromium.browser, { viewport: tablet });
    const page = await context.newPage();
    await setUpDevice(page, { demo: false });
    await addPatientWithHistory(page);
    await eventsSection(page).getByRole('button', { name: /Open or amend the botulinum toxin injection of/ }).click();
    await eventsSection(page).getByRole('group', { name: 'Amend this event' }).waitFor();
    expect(await seriousAxeViolations(page)).toEqual([]);
    expect(await reflowProblems(page)).toEqual([]);
    await screenshot(page, 'event-amend-1024');
    await context.close();
  });
});
