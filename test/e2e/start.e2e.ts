// Where the app opens and how names are unlocked: a set-up clinician device opens on the caseload; the
// first screen before set-up stays; names unlock from any page in a dialog, and the page stays as it was.
import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { sharedChromium } from '../support/shared-browser';
import { setUpDevice, TEST_PASSPHRASE } from './app-helpers';
import { newAppContext, reflowProblems, screenshot, seriousAxeViolations, smallPhone, tablet } from './harness';

const chromium = sharedChromium();

const path = (page: Page) => new URL(page.url()).pathname;

describe('the first screen and unlocking in place', () => {
  for (const [size, viewport] of [
    ['360', smallPhone],
    ['1024', tablet],
  ] as const) {
    it(`opens on the caseload once set up, and unlocks names on the page where they are needed (${size} px)`, async () => {
      const context = await newAppContext(chromium.browser, { viewport });
      const page = await context.newPage();
      // Before set-up the first screen asks who the device is for, and stays after a reload.
      await page.goto('/');
      await page.getByRole('button', { name: 'Set up for a therapist' }).waitFor();
      await page.reload();
      await page.getByRole('button', { name: 'Set up for a therapist' }).waitFor();
      expect(path(page)).toBe('/');
      // Setting up happens here and stays here (the empty caseload's "Get started").
      await setUpDevice(page, { demo: false });
      expect(path(page)).toBe('/');
      // In the app (a full page load would lock the names again).
      await page.getByRole('link', { name: 'Start an empty caseload' }).click();
      await page.getByLabel('Birth year').fill('1967');
      await page.getByLabel('First name').fill('Ottilie');
      await page.getByLabel('Family name').fill('Brenneck');
      await page.getByRole('button', { name: 'Add patient' }).click();
      await page.getByRole('heading', { name: /· Ottilie/ }).waitFor();
      const patientPath = path(page);

      // Launching the app again (a full load of its start address): the caseload, locked.
      await page.goto('/');
      await page.getByRole('heading', { name: 'Caseload', level: 1 }).waitFor();
      expect(path(page)).toBe('/patients');
      // The Home link still shows Home (the start is decided once, at launch).
      await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Home' }).click();
      await page.getByRole('heading', { name: 'Your caseload' }).waitFor();
      expect(path(page)).toBe('/');

      // Unlock from the patient page, with an event half typed: same page, the text kept, the name shown.
      await page.goto(patientPath);
      await page.getByRole('button', { name: 'Add an event' }).click();
      await page.getByLabel('Summary').fill('left calf, typed before unlocking');
      expect(await page.getByRole('heading', { name: /Ottilie/ }).count()).toBe(0);
      await page.getByRole('banner').getByRole('button', { name: /Locked/ }).click();
      const dialog = page.getByRole('dialog', { name: 'Unlock names and notes' });
      await dialog.getByLabel('Passphrase', { exact: true }).fill('not the passphrase');
      await dialog.getByRole('button', { name: 'Unlock' }).click();
      await dialog.getByRole('alert').waitFor();
      expect(await page.evaluate(() => document.activeElement?.id)).toBe('unlock-passphrase');
      expect(await seriousAxeViolations(page)).toEqual([]);
      expect(await reflowProblems(page)).toEqual([]);
      await page.screenshot({ path: `test-output/screenshots/unlock-dialog-${size}.png` });
      await dialog.getByLabel('Passphrase', { exact: true }).fill(TEST_PASSPHRASE);
      await dialog.getByRole('button', { name: 'Unlock' }).click();
      await dialog.waitFor({ state: 'detached' });
      await page.getByRole('heading', { name: /· Ottilie/ }).waitFor();
      expect(path(page)).toBe(patientPath);
      await expect(page.getByLabel('Summary').inputValue()).resolves.toBe('left calf, typed before unlocking');

      // A page's own "unlock" link (here: adding a patient) opens the same dialog instead of leaving.
      await page.getByRole('banner').getByRole('button', { name: 'Lock' }).click();
      await page.goto('/patients/new');
      await page.getByLabel('Birth year').fill('1972');
      await page.getByRole('link', { name: 'Unlock' }).click();
      await dialog.getByLabel('Passphrase', { exact: true }).fill(TEST_PASSPHRASE);
      await dialog.getByRole('button', { name: 'Unlock' }).click();
      await page.getByLabel('First name').waitFor();
      expect(path(page)).toBe('/patients/new');
      await expect(page.getByLabel('Birth year').inputValue()).resolves.toBe('1972');
      await screenshot(page, `unlock-in-place-${size}`);
      await context.close();
    });
  }
});
