// Steps shared by the browser tests: first-run set-up, the demo caseload, canvas checks.
import type { Page } from 'playwright-core';
import { expect } from 'vitest';

export const TEST_PASSPHRASE = 'correct horse battery staple';

/** Sets up the device on the first screen; with `demo`, also loads the invented demo caseload. */
export async function setUpDevice(page: Page, options: { demo: boolean } = { demo: true }): Promise<void> {
  await page.goto('/');
  // The first screen asks who the device is for; the passphrase form is only on the therapist's side.
  await page.getByRole('button', { name: 'Set up for a therapist' }).click();
  await page.getByLabel('Your name').fill('Robin Testwell');
  await page.getByLabel('Name of this device').fill('Browser test tablet');
  await page.getByLabel('Passphrase for names and notes').fill(TEST_PASSPHRASE);
  await page.getByLabel('Passphrase again').fill(TEST_PASSPHRASE);
  if (options.demo) {
    await page.getByRole('button', { name: 'Set up and load the demo caseload' }).click();
    await page.getByText(/Loaded the demo caseload/).waitFor({ timeout: 60_000 });
  } else {
    await page.getByRole('button', { name: 'Set up with an empty caseload' }).click();
    await page.getByRole('heading', { name: 'Get started' }).waitFor({ timeout: 60_000 });
  }
}

/**
 * Unlocks names and notes from the header's button (the key lives only in memory, so every full page
 * load starts locked): a dialog over the page, which stays where it was.
 */
export async function unlockVault(page: Page): Promise<void> {
  await page.getByRole('banner').getByRole('button', { name: /Locked/ }).click();
  const dialog = page.getByRole('dialog', { name: 'Unlock names and notes' });
  await dialog.getByLabel('Passphrase', { exact: true }).fill(TEST_PASSPHRASE);
  await dialog.getByRole('button', { name: 'Unlock' }).click();
  await dialog.waitFor({ state: 'detached' });
  await page.getByRole('banner').getByRole('button', { name: 'Lock' }).waitFor();
}

/**
 * Opens the first patient of the caseload and returns the patient page's path. With `inApp`, it
 * moves by links (no page load, so an unlocked vault stays unlocked).
 */
export async function openFirstPatient(page: Page, options: { inApp?: boolean } = {}): Promise<string> {
  if (options.inApp) await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Caseload' }).click();
  else await page.goto('/patients');
  await page.locator('a.row').first().click();
  await page.getByRole('heading', { name: 'Change since baseline' }).waitFor();
  return new URL(page.url()).pathname;
}

/** Share of canvas pixels that are not (near) white/transparent, over every canvas inside `selector`. */
export async function inkedCanvasShare(page: Page, selector: string): Promise<number> {
  return page.evaluate((sel) => {
    let inked = 0;
    let total = 0;
    for (const canvas of Array.from(document.querySelectorAll<HTMLCanvasElement>(`${sel} canvas`))) {
      const ctx = canvas.getContext('2d');
      if (!ctx || canvas.width === 0 || canvas.height === 0) continue;
      const data = ctx.getImageData(0, 0, canvas.width, canvas.height).data;
      for (let i = 0; i < data.length; i += 4) {
        total++;
        const alpha = data[i + 3] as number;
        const light = (data[i] as number) > 245 && (data[i + 1] as number) > 245 && (data[i + 2] as number) > 245;
        if (alpha > 16 && !light) inked++;
      }
    }
    return total === 0 ? 0 : inked / total;
  }, selector);
}

/** Counts canvas pixels close to an RGB colour (tolerance per channel), e.g. the MDC band's tint. */
export async function pixelsNear(page: Page, selector: string, rgb: [number, number, number], tolerance = 12): Promise<number> {
  return page.evaluate(
    ({ sel, target, tol }) => {
      let count = 0;
      for (const canvas of Array.from(document.querySelectorAll<HTMLCanvasElement>(`${sel} canvas`))) {
        const ctx = canvas.getContext('2d');
        if (!ctx || canvas.width === 0) continue;
        const data = ctx.getImageData(0, 0, canvas.width, canvas.height).data;
        for (let i = 0; i < data.length; i += 4) {
          if (
            Math.abs((data[i] as number) - target[0]) <= tol &&
            Math.abs((data[i + 1] as number) - target[1]) <= tol &&
            Math.abs((data[i + 2] as number) - target[2]) <= tol &&
            (data[i + 3] as number) > 16
          )
            count++;
        }
      }
      return count;
    },
    { sel: selector, target: rgb, tol: tolerance },
  );
}

/**
 * Every row of one IndexedDB table of the app's database, read in the page (e.g. "drafts"). Stored
 * observations are packed several to a value since schema 16 (`items`): they are unpacked. Only that
 * table: other records may have an `items` field of their own (a home programme's exercises).
 */
export async function tableRows<T = Record<string, unknown>>(page: Page, table: string): Promise<T[]> {
  return page.evaluate(
    (name) =>
      new Promise<T[]>((resolve, reject) => {
        const open = indexedDB.open('kinnote');
        open.onerror = () => reject(open.error);
        open.onsuccess = () => {
          const db = open.result;
          if (!db.objectStoreNames.contains(name)) {
            db.close();
            resolve([]);
            return;
          }
          const request = db.transaction(name, 'readonly').objectStore(name).getAll();
          request.onsuccess = () => {
            db.close();
            const values = request.result as { items?: unknown }[];
            resolve(values.flatMap((v) => (name === 'observations' && Array.isArray(v.items) ? v.items : [v])) as T[]);
          };
          request.onerror = () => reject(request.error);
        };
      }),
    table,
  );
}

/**
 * Marks every test laid out from the patient's last visit "Not tested today", so that a test can
 * add and fill its own rows on a patient with history (the carried rows would otherwise ask for values).
 */
export async function markCarriedTestsNotTested(page: Page): Promise<void> {
  // The carried tests are laid out once the last visit is read: count them only after that.
  await page.locator('form.assessment[aria-busy="false"]').waitFor();
  const buttons = page.getByRole('button', { name: 'Not tested today' });
  const count = await buttons.count();
  for (let i = 0; i < count; i++) {
    const button = buttons.nth(i);
    if ((await button.getAttribute('aria-pressed')) !== 'true') await button.click();
  }
}

/** Unfolds every folded group of the patient overview (a long overview folds its biggest groups). */
export async function openOverviewGroups(page: Page): Promise<void> {
  // The table fills once the patient's records are read: wait for its rows before looking for folds.
  await page.locator('table.overview tbody tr').first().waitFor();
  const folded = page.locator('table.overview button.group-open[aria-expanded="false"]');
  for (let n = await folded.count(); n > 0; n = await folded.count()) {
    await folded.first().click();
    await expect.poll(() => folded.count(), { message: 'waiting for an overview group to unfold' }).toBeLessThan(n);
  }
}
