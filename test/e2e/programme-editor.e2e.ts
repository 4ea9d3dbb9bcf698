// The therapist's programme page as a whole (editor, hand-over, report import, adherence) on a
// 360 × 740 phone with 200 % text and on a 1024 px tablet, offline: it reflows, passes axe, and a
// mistyped dose is refused in plain words naming the exercise and field (the field's name from the
// catalogue; before, the therapist read valibot's "Invalid type: Expected number but received NaN"),
// with the typing kept.
import { describe, expect, it } from 'vitest';
import { join } from 'node:path';
import { setUpDevice, tableRows } from './app-helpers';
import { newAppContext, reflowProblems, screenshotDir, seriousAxeViolations, setTextScale, smallPhone, tablet, waitForOfflineWorker, waitForSettledPage } from './harness';
import { sharedChromium } from '../support/shared-browser';

const chromium = sharedChromium();

describe('the programme page on a phone and a tablet', () => {
  it('reflows at 360 px with 200 % text, passes axe at both sizes, and refuses a mistyped dose naming the exercise and field', async () => {
    const context = await newAppContext(chromium.browser, { viewport: tablet });
    const t = await context.newPage();
    await t.goto('/');
    await waitForOfflineWorker(t);
    await context.setOffline(true);
    await setUpDevice(t, { demo: true });
    const [demoProgramme] = await tableRows<{ patientId: string }>(t, 'homeProgrammes');
    expect(demoProgramme, 'a demo patient with a programme').toBeDefined();
    await t.goto(`/patients/${demoProgramme!.patientId}/programme`);
    await t.getByRole('heading', { name: 'The programme' }).waitFor();
    await t.locator('form[aria-busy="false"]').waitFor();
    await waitForSettledPage(t, 'the programme page at 1024 px');
    expect(await seriousAxeViolations(t)).toEqual([]);
    expect((await reflowProblems(t)).join('\n'), 'programme page at 1024 px').toBe('');
    await t.screenshot({ path: join(screenshotDir, 'programme-page-1024.png') });

    await t.setViewportSize(smallPhone);
    await setTextScale(t, 2);
    await waitForSettledPage(t, 'the programme page at 360 px and 200 % text');
    expect((await reflowProblems(t)).join('\n'), 'programme page at 360 px with 200 % text').toBe('');
    expect(await seriousAxeViolations(t)).toEqual([]);
    await t.screenshot({ path: join(screenshotDir, 'programme-page-360-200-top.png') });

    // A dose typed wrongly: refused, in the form's words, and nothing typed is lost.
    const second = t.getByRole('group', { name: 'Exercise 2' });
    await second.getByLabel('Repetitions').fill('eight');
    await t.getByRole('button', { name: 'Save the programme' }).click();
    const error = t.getByRole('alert').filter({ hasText: 'Exercise 2, repetitions: must be a whole number' });
    await error.waitFor();
    expect(await second.getByLabel('Repetitions').inputValue()).toBe('eight');
    await error.scrollIntoViewIfNeeded();
    await t.screenshot({ path: join(screenshotDir, 'programme-page-360-200-error.png') });
    expect((await reflowProblems(t)).join('\n'), 'the refusal at 360 px with 200 % text').toBe('');

    await t.getByRole('heading', { name: "Import a report from the patient's phone" }).scrollIntoViewIfNeeded();
    await t.screenshot({ path: join(screenshotDir, 'programme-page-360-200-import.png') });
    await context.close();
  });
});
