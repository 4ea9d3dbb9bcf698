// The home programme hand-off in the browser: a therapist's tablet and a patient's own phone as
// two separate browser contexts (separate IndexedDB), both offline after their first load. The
// programme goes over as QR codes (photos of them) with a code, the report comes back as a file;
// wrong, tampered, foreign and repeated files are refused or change nothing.
import { beforeAll, describe, expect, it } from 'vitest';
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Download, Page } from 'playwright-core';
import { setUpDevice } from './app-helpers';
import { newAppContext, reflowProblems, rootFontPx, screenshot, seriousAxeViolations, setTextScale, smallPhone, tablet, waitForOfflineWorker, waitForSettledPage } from './harness';
import { sharedChromium } from '../support/shared-browser';

const work = join('test-output', 'programme-e2e');
const chromium = sharedChromium();
beforeAll(async () => {
  mkdirSync(work, { recursive: true });
});

async function savedDownload(page: Page, click: () => Promise<void>, name: string): Promise<string> {
  const [download] = (await Promise.all([page.waitForEvent('download'), click()])) as [Download, void];
  const path = join(work, name);
  await download.saveAs(path);
  return path;
}

/** 200 % text size, as a person with low vision sets it (root font size; the app's rem-based layout follows). */
async function lookAt(page: Page, name: string): Promise<void> {
  // Text at 200 % (the browser's text-size setting) at 360 px: nothing wider than the phone, no control cut off.
  await setTextScale(page, 2);
  await waitForSettledPage(page, `the patient's ${name} screen`);
  expect(await rootFontPx(page), 'text size really doubled').toBe(32);
  expect((await reflowProblems(page)).join('\n'), `${name} at 360 px with 200 % text`).toBe('');
  await screenshot(page, `programme-patient-${name}`);
  expect(await seriousAxeViolations(page), name).toEqual([]);
}

/** Every record in the app's IndexedDB, by store name (run in the page). */
async function dumpDatabase(page: Page): Promise<Record<string, unknown[]>> {
  return page.evaluate(
    () =>
      new Promise<Record<string, unknown[]>>((done, fail) => {
        const open = indexedDB.open('kinnote');
        open.onerror = () => fail(open.error);
        open.onsuccess = () => {
          const db = open.result;
          const names = Array.from(db.objectStoreNames);
          const tx = db.transaction(names, 'readonly');
          const out: Record<string, unknown[]> = {};
          for (const name of names) {
            const request = tx.objectStore(name).getAll();
            request.onsuccess = () => (out[name] = request.result as unknown[]);
          }
          tx.oncomplete = () => {
            db.close();
            done(out);
          };
          tx.onerror = () => fail(tx.error);
        };
      }),
  );
}

async function writeProgramme(page: Page, patientPath: string, exercises: { name: string; hold: string; reps: string; timesPerDay?: string; daysPerWeek?: string; note?: string }[]): Promise<void> {
  await page.goto(`${patientPath}/programme`);
  await page.getByRole('heading', { name: /Home programme for/ }).waitFor();
  await page.getByLabel('Title').fill('Stretches at home');
  // Starts today (the demo may hold an older programme of this patient, which this rewrites).
  await page.getByLabel('Starts on').fill(new Date().toISOString().slice(0, 10));
  await page.getByLabel('Ends on (optional)').fill('');
  for (;;) {
    const remove = page.getByRole('button', { name: /^Remove exercise/ });
    if ((await remove.count()) === 0) break;
    await remove.last().click();
  }
  for (const [i, e] of exercises.entries()) {
    if (i > 0) await page.getByRole('button', { name: 'Add an exercise' }).click();
    const box = page.getByRole('group', { name: `Exercise ${i + 1}` });
    await box.getByLabel('What to do, in your words').fill(e.name);
    // Every field set (an exercise kept from the demo programme keeps its values otherwise).
    await box.getByLabel('Hold (seconds)').fill(e.hold);
    await box.getByLabel('Repetitions').fill(e.reps);
    await box.getByLabel('Sets').fill('');
    await box.getByLabel('Minutes each time').fill('');
    await box.getByLabel('Overnight').setChecked(false);
    await box.getByLabel('Times a day').fill(e.timesPerDay ?? '');
    await box.getByLabel('Days a week').fill(e.daysPerWeek ?? '');
    await box.getByLabel('Note (optional)').fill(e.note ?? '');
  }
  await page.getByRole('button', { name: 'Save the programme' }).click();
  await page.locator('form.plan [role="alert"], form.plan [role="status"]').first().waitFor();
  expect(await page.locator('form.plan [role="alert"]').allTextContents()).toEqual([]);
  await page.getByText('Programme saved.').waitFor();
}

describe('home programme hand-off, offline, between two devices', () => {
  it('hands a programme to the patient phone and brings adherence back; refuses wrong, tampered, foreign and repeated files', async () => {
    // Therapist's tablet: first load online, then offline for good.
    const therapistContext = await newAppContext(chromium.browser, { viewport: tablet });
    const t = await therapistContext.newPage();
    await t.goto('/');
    await waitForOfflineWorker(t);
    await therapistContext.setOffline(true);
    await setUpDevice(t, { demo: true });
    await t.goto('/patients');
    const rows = t.locator('a.row');
    const first = (await rows.nth(0).getAttribute('href'))!;
    const second = (await rows.nth(1).getAttribute('href'))!;
    const patientId = first.split('/').pop()!;
    const otherId = second.split('/').pop()!;

    await writeProgramme(t, first, [
      { name: 'Calf stretch against a wall, back heel down', hold: '30', reps: '3', timesPerDay: '2', note: 'stop if the knee hurts' },
      { name: 'Lie on your front for ten minutes', hold: '600', reps: '1', daysPerWeek: '3' },
    ]);
    const patientCode = (await t.locator('h1 .code').textContent())!.trim();
    await t.getByRole('button', { name: 'Prepare the hand-over' }).click();
    const code = (await t.getByTestId('handover-code').textContent())!.trim();
    expect(code).toMatch(/^[2-9A-HJKMNP-TV-Z]{5}-[2-9A-HJKMNP-TV-Z]{5}$/);
    const programmeFile = await savedDownload(t, () => t.getByRole('button', { name: 'Share or save the file' }).click(), 'programme.json');
    const programmeText = readFileSync(programmeFile, 'utf8');
    expect(programmeText).not.toContain('Calf stretch'); // encrypted
    await t.getByRole('button', { name: 'Show as QR codes' }).click();
    await t.locator('img[data-qr-all]').first().waitFor({ state: 'attached' });
    const qrSources = await t.locator('img[data-qr-all]').evaluateAll((imgs) => imgs.map((i) => (i as HTMLImageElement).src));
    expect(qrSources.length).toBeGreaterThan(1);
    const qrFiles = qrSources.reverse().map((src, i) => {
      const path = join(work, `programme-qr-${i}.png`);
      writeFileSync(path, Buffer.from(src.split(',')[1]!, 'base64'));
      return path;
    });

    // A programme for another patient, to offer to the phone later.
    await writeProgramme(t, second, [{ name: 'Shoulder rolls', hold: '', reps: '10', timesPerDay: '1' }]);
    await t.getByRole('button', { name: 'Prepare the hand-over' }).click();
    const foreignCode = (await t.getByTestId('handover-code').textContent())!.trim();
    const foreignProgramme = await savedDownload(t, () => t.getByRole('button', { name: 'Share or save the file' }).click(), 'foreign-programme.json');

    // The patient's own phone, 360 × 740.
    const phoneContext = await newAppContext(chromium.browser, { viewport: smallPhone });
    const p = await phoneContext.newPage();
    await p.goto('/');
    await waitForOfflineWorker(p);
    await phoneContext.setOffline(true);
    await p.reload();
    // The first screen of a new phone: no therapist menu, no passphrase form.
    expect(await p.getByRole('navigation', { name: 'Main' }).getByRole('link').count()).toBe(0);
    expect(await p.getByLabel(/Passphrase/).count()).toBe(0);
    await p.getByRole('button', { name: 'Receive my programme' }).click();
    await p.getByRole('heading', { name: 'Get my programme' }).waitFor();
    await p.goto('/home-programme');
    await p.getByText('No programme on this phone yet').waitFor();
    expect(await p.getByRole('navigation', { name: 'Main' }).getByRole('link').allTextContents()).toEqual(['Today', 'My week', 'How I feel', 'Send report', 'Reminders']);
    // Therapist pages are not reachable on the patient's phone, even by address.
    for (const path of ['/settings', '/patients', '/cohort']) {
      await p.goto(path);
      await p.waitForURL(/\/home-programme$/);
    }
    await p.getByRole('link', { name: 'Get my programme' }).click();
    await p.getByRole('heading', { name: 'Get my programme' }).waitFor();
    await lookAt(p, 'receive');

    // Photos of the QR codes (in any order), then a wrong code, then the right one.
    await p.locator('#programme-qr-photos').setInputFiles(qrFiles);
    await p.getByText('Ready: QR codes').waitFor({ timeout: 20_000 });
    await p.getByLabel('Code from your therapist').fill('22222-22222');
    await p.getByRole('button', { name: 'Open my programme' }).click();
    await p.getByText(/This code does not open the programme file/).waitFor({ timeout: 20_000 });
    await p.getByLabel('Code from your therapist').fill(code.toLowerCase().replace('-', ' '));
    await p.getByRole('button', { name: 'Open my programme' }).click();
    await p.getByText(/"Stretches at home" is on this phone/).waitFor({ timeout: 20_000 });

    // Another patient's programme, even with its right code, is refused.
    await p.locator('#programme-file').setInputFiles(foreignProgramme);
    await p.getByLabel('Code from your therapist').fill(foreignCode);
    await p.getByRole('button', { name: 'Open my programme' }).click();
    await p.getByText(/follows another person's programme/).waitFor({ timeout: 20_000 });

    // Today: first exercise twice a day (done, partly), second three a week (skipped: pain).
    await p.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Today' }).click();
    await p.getByRole('heading', { name: 'Today' }).waitFor();
    await p.getByText('stop if the knee hurts', { exact: true }).waitFor();
    await p.getByRole('group', { name: 'Time 1 of 2 today' }).getByRole('radio', { name: '✓ Done' }).check();
    await p.getByText('Saved.').waitFor();
    await p.getByRole('group', { name: 'Time 2 of 2 today' }).getByRole('radio', { name: '◐ Partly' }).check();
    const weekly = p.locator('li', { has: p.getByRole('heading', { name: 'Lie on your front for ten minutes' }) });
    await weekly.getByRole('radio', { name: '✗ Skipped' }).check();
    await weekly.getByRole('button', { name: 'Pain' }).click();
    await weekly.getByText('Why? (it helps your therapist): Pain').waitFor();
    expect(await p.getByRole('group', { name: 'Time 1 of 2 today' }).getByRole('radio', { name: '✓ Done' }).isChecked()).toBe(true);
    await lookAt(p, 'today');

    await p.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'How I feel' }).click();
    await p.getByRole('radio', { name: /2 — Now and then/ }).check();
    await p.getByRole('group', { name: /How bad were they/ }).getByRole('radio', { name: '5', exact: true }).check();
    await p.getByRole('button', { name: 'Save' }).click();
    await p.getByText('Saved for today.').waitFor();
    await lookAt(p, 'feel');

    await p.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'My week' }).click();
    await p.getByText(/1 of 2 done \(50 %\)/).waitFor();
    // The phone received the programme today: this week's earlier days say so, not "not in your programme".
    const daysBeforeToday = await p.evaluate(() => (new Date().getDay() + 6) % 7);
    expect(await p.getByText('Before your programme came to this phone').count()).toBe(daysBeforeToday);
    await lookAt(p, 'week');

    await p.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Reminders' }).click();
    await p.getByRole('heading', { name: 'Reminders' }).waitFor();
    // Exact about what a web app cannot do: no reminder when closed or asleep.
    await p.getByTestId('reminder-limits').getByText(/remind you when Kinnote is closed, when the phone is asleep/).waitFor();
    expect(await p.getByText(/in the background/).count()).toBe(0);
    await lookAt(p, 'reminders');

    await p.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Send report' }).click();
    await p.getByRole('button', { name: 'Make my report' }).click();
    const reportCode = (await p.getByTestId('report-code').textContent({ timeout: 20_000 }))!.trim();
    const reportFile = await savedDownload(p, () => p.getByRole('button', { name: 'Share or save the report' }).click(), 'report.json');
    await lookAt(p, 'send');

    // The phone holds this patient's programme and log only: no patient record, no identity, nobody else.
    const db = await dumpDatabase(p);
    expect(db.patients).toEqual([]);
    expect(db.identities).toEqual([]);
    expect(db.assessments).toEqual([]);
    expect(db.observations).toEqual([]);
    for (const table of ['homeProgrammes', 'adherenceEntries', 'selfReports']) {
      const ids = new Set((db[table] as { patientId: string }[]).map((r) => r.patientId));
      expect([...ids], table).toEqual([patientId]);
    }
    const everything = JSON.stringify(db);
    expect(everything).not.toContain(otherId);
    expect(everything).not.toContain('Robin Testwell');
    expect(everything).not.toContain('Shoulder rolls');

    // Back on the therapist's tablet: a tampered report, the report on another patient's page,
    // the right import, and the same report again.
    const reportText = readFileSync(reportFile, 'utf8');
    const envelope = JSON.parse(reportText) as { ciphertext: string };
    const c = envelope.ciphertext;
    const tamperedFile = join(work, 'report-tampered.json');
    writeFileSync(tamperedFile, JSON.stringify({ ...envelope, ciphertext: c.slice(0, 60) + (c[60] === 'Q' ? 'R' : 'Q') + c.slice(61) }));

    await t.goto(`${second}/programme`);
    await t.locator('#report-file').setInputFiles(reportFile);
    await t.getByLabel('Report code').fill(reportCode);
    await t.getByRole('button', { name: 'Import the report' }).click();
    await t.getByText(new RegExp(`This report is from the phone of ${patientCode}`)).waitFor({ timeout: 20_000 });

    await t.goto(`${first}/programme`);
    await t.locator('#report-file').setInputFiles(tamperedFile);
    await t.getByLabel('Report code').fill(reportCode);
    await t.getByRole('button', { name: 'Import the report' }).click();
    await t.getByText(/altered or is incomplete/).waitFor({ timeout: 20_000 });
    const before = await dumpDatabase(t);
    expect((before.adherenceEntries as { patientId: string; programmeId: string }[]).filter((e) => e.patientId === patientId && e.programmeId !== undefined).length).toBe(
      (before.adherenceEntries as { patientId: string }[]).filter((e) => e.patientId === patientId).length,
    );

    await t.locator('#report-file').setInputFiles(reportFile);
    await t.getByRole('button', { name: 'Import the report' }).click();
    // Read in plain words, not as a record count (the day ticked: done and partly; Penn and severity on one day).
    await t.getByText(/^\s*Report from \d{1,2} [A-Z][a-z]{2}: 1 day ticked, 1 spasm rating, 1 session skipped/).waitFor({ timeout: 20_000 });
    expect(await t.getByText(/new record/).count()).toBe(0);
    await t.getByText(/Lie on your front for ten minutes — Pain/).waitFor();
    const afterFirst = await dumpDatabase(t);
    await t.getByRole('button', { name: 'Import the report' }).click();
    await t.getByText('This report was already imported: nothing changed.').waitFor({ timeout: 20_000 });
    const afterSecond = await dumpDatabase(t);
    expect(afterSecond.adherenceEntries).toEqual(afterFirst.adherenceEntries);
    expect(afterSecond.selfReports).toEqual(afterFirst.selfReports);
    expect((afterSecond.audit as unknown[]).length).toBe((afterFirst.audit as unknown[]).length);
    // The tampered and foreign attempts wrote nothing: one import entry only came from the right one.
    expect((afterFirst.adherenceEntries as unknown[]).length - (before.adherenceEntries as unknown[]).length).toBe(1);

    // The patient page shows this week's adherence: 1 of 2 planned sessions done.
    await t.goto(first);
    const summary = t.locator('section', { has: t.getByRole('heading', { name: 'Home programme adherence per week' }) });
    await summary.getByText('50 % (1 of 2)').waitFor();
    await t.getByTestId('home-log-timeline').waitFor();
    await screenshot(t, 'programme-therapist-patient-page');
    await t.goto(`${first}/programme`);
    await t.getByRole('heading', { name: /Home programme for/ }).waitFor();
    expect(await seriousAxeViolations(t)).toEqual([]);
    await screenshot(t, 'programme-therapist');

    // Leaving patient mode on the phone (still offline): it says what goes, and asks first.
    await p.goto('/home-programme');
    await p.getByRole('link', { name: 'Stop using this phone for my programme' }).click();
    const list = p.getByTestId('to-remove');
    await list.getByText('"Stretches at home"').waitFor();
    await list.getByText(/your spasm ratings: 1/).waitFor();
    const remove = p.getByRole('button', { name: 'Remove and leave patient mode' });
    expect(await remove.isDisabled()).toBe(true);
    await lookAt(p, 'leave');
    await p.getByLabel(/I understand/).check();
    await remove.click();
    await p.getByRole('button', { name: 'Receive my programme' }).waitFor({ timeout: 20_000 });
    expect(await p.getByRole('navigation', { name: 'Main' }).getByRole('link').count()).toBe(0);

    await phoneContext.close();
    await therapistContext.close();
  }, 180_000);
});
