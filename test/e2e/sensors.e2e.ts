// The phone-sensor pages in Chromium, fed synthetic devicemotion events dispatched on window at about
// 60 Hz (page.evaluate), generated from the physical pendulum simulation through the simulated phone.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { analyseMotionRecording, parseMotionCsv } from '../../src/lib/sensors';
import { phonePendulumCases, simulatePhonePendulum } from '../reference/sensors/phone-pendulum-simulator';
import { axisAngle, multiply, SHIN_SCREEN_OUT, staticDeviceMotion, NO_ERRORS } from '../reference/sensors/device-motion-simulator';
import { sharedChromium } from '../support/shared-browser';
import { playMotion, releaseMotion, swapMotionTable, waitForMotionEvents } from './motion-player';
import { newAppContext, screenshot, seriousAxeViolations, smallPhone, tablet } from './harness';
import { openFirstPatient, openOverviewGroups, setUpDevice } from './app-helpers';

const chromium = sharedChromium();

const RATE_HZ = 100;
// Issue 13: the independent phone simulator (test/reference/sensors/phone-pendulum-simulator.ts) in the
// browsers' axis order (rotationRate alpha about x, beta about y, gamma about z) with a hand-held start
// (tremor, sway, gyro bias and noise). A moderate extension-type leg, phone on the outer side of the
// right shin, rolled and tilted; no dropped events (the table is replayed by time).
const CASE = { ...phonePendulumCases(7, 4242)[2], leg: 'right' as const, side: 'outer' as const, placement: 'upright' as const, rateHz: RATE_HZ, holdS: 2, drops: [] };
const swing = simulatePhonePendulum(CASE);
const HOLD_ROWS = Math.round(CASE.holdS * RATE_HZ);
const r = swing.recording;
/** Rows [alpha, beta, gamma, x, y, z] at 100 Hz; row HOLD_ROWS is the release. */
const TABLE = Array.from(r.timeMs, (_, i) => [r.rateAlphaDps[i], r.rateBetaDps[i], r.rateGammaDps[i], r.accXMs2[i], r.accYMs2[i], r.accZMs2[i]]);

/**
 * Starts dispatching devicemotion events every 16 ms. Before `release()` the held rows play in a loop
 * by time (the leg held by hand: tremor, sway, sensor noise); after it, the row follows the time since
 * release, so the physics matches the events' own time stamps whatever the timer jitter.
 */
describe('pendulum test with the phone', () => {
  it('records synthetic device motion, stops by itself at rest, analyses it and exports the raw recording', async () => {
    const context = await newAppContext(chromium.browser, { viewport: smallPhone, acceptDownloads: true });
    const page = await context.newPage();
    await page.goto('/measure/pendulum');
    await page.getByRole('heading', { level: 1, name: /pendulum test with the phone/i }).waitFor();
    for (const caution of [/strap the phone on firmly/i, /support and guard the leg/i, /local protocol/i, /feels pain/i]) {
      expect(await page.getByText(caution).count()).toBeGreaterThan(0);
    }
    await playMotion(page, TABLE, HOLD_ROWS);
    await page.getByRole('button', { name: 'Start' }).click();
    await page.getByText('Recording: let go of the leg now.').waitFor({ timeout: 10_000 });
    await releaseMotion(page);
    await page.getByText(/^Stopped: \d+ samples recorded\.$/).waitFor({ timeout: 20_000 });
    const ri = Number(await page.locator('[data-index="relaxation-index"]').textContent());
    const rest = Number((await page.locator('[data-index="resting-angle"]').textContent())?.replace('°', ''));
    // Truth from the simulated trajectory; issue 13's goal figures (R2 within 0.10, rest within 2° plus
    // the phone's tilt on the shank).
    expect(Math.abs(ri - swing.truth.r2)).toBeLessThan(0.1);
    expect(Math.abs(rest - swing.truth.restDeg)).toBeLessThan(2 + CASE.tiltDeg);
    expect(await page.locator('figure canvas').count()).toBeGreaterThan(0);
    await screenshot(page, 'sensors-pendulum-result-360');

    const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: /export raw recording/i }).click()]);
    const text = readFileSync((await download.path()) as string, 'utf8');
    expect(text.split('\r\n')[0]).toBe('time_ms,rate_alpha_dps,rate_beta_dps,rate_gamma_dps,acc_x_ms2,acc_y_ms2,acc_z_ms2');
    // The exported file, analysed in Node by the same code as `kinnote motion`, gives the page's numbers.
    const again = analyseMotionRecording(parseMotionCsv(text, 'export.csv')).analysis.indices;
    expect(again.relaxationIndex.toFixed(2)).toBe(ri.toFixed(2));
    expect(await seriousAxeViolations(page)).toEqual([]);
    await page.setViewportSize(tablet);
    await screenshot(page, 'sensors-pendulum-result-1024');
    await context.close();
  });

  it('saves the indices of a hand-held phone pendulum test to a patient, and the patient page shows the relaxation index', async () => {
    const context = await newAppContext(chromium.browser, { viewport: smallPhone });
    const page = await context.newPage();
    await setUpDevice(page);
    const patientPath = await openFirstPatient(page);
    await page.goto(`/measure/pendulum?patient=${patientPath.split('/').pop() ?? ''}`);
    await playMotion(page, TABLE, HOLD_ROWS);
    await page.getByRole('button', { name: 'Start' }).click();
    await page.getByText('Recording: let go of the leg now.').waitFor({ timeout: 10_000 });
    await releaseMotion(page);
    await page.getByText(/^Stopped: \d+ samples recorded\.$/).waitFor({ timeout: 20_000 });
    const shown = (await page.locator('[data-index="relaxation-index"]').textContent()) ?? '';
    expect(Math.abs(Number(shown) - swing.truth.r2)).toBeLessThan(0.1);
    // The same result as from a file: the knee is chosen under the result, then the patient's page opens.
    await page.getByRole('button', { name: 'Save to the record' }).click();
    await page.getByText('Choose which knee was tested.').waitFor();
    await page.getByRole('radio', { name: 'Right' }).check();
    await page.getByRole('button', { name: 'Save to the record' }).click();
    await page.getByText('Assessment saved.').waitFor({ timeout: 20_000 });
    await page.goto(patientPath);
    // The overview table's row of the measure (one cell per visit; the pendulum indices are grouped).
    await openOverviewGroups(page);
    const row = page.locator('table.overview tbody tr:not(.group)').filter({ hasText: /relaxation index \(R2\)/i });
    await row.first().waitFor();
    const text = (await row.first().textContent()) ?? '';
    const values = Array.from(text.matchAll(/\d+\.\d+/g), (m) => Number(m[0]));
    // The saved R2 is in the row (as shown there, to its own rounding), and it is the simulated leg's.
    expect(values.some((v) => Math.abs(v - swing.truth.r2) < 0.1 && Math.abs(v - Number(shown)) < 0.01)).toBe(true);
    await context.close();
  });

  it('says clearly when no motion sensor sends data (a desktop computer)', async () => {
    const context = await newAppContext(chromium.browser, { viewport: tablet });
    const page = await context.newPage();
    await page.goto('/measure/pendulum');
    await page.getByRole('button', { name: 'Start' }).click();
    await page.getByRole('alert').filter({ hasText: /no motion sensor is sending data/i }).waitFor({ timeout: 20_000 });
    expect(await page.getByRole('button', { name: 'Record again' }).count()).toBe(1);
    expect(await seriousAxeViolations(page)).toEqual([]);
    await screenshot(page, 'sensors-pendulum-no-sensor-1024');
    await context.close();
  });

  it('asks for motion permission inside the tap (iOS style) and explains a refusal', async () => {
    const context = await newAppContext(chromium.browser);
    await context.addInitScript(() => {
      const w = window as unknown as { __askedInGesture: boolean | null; DeviceMotionEvent: { requestPermission?: () => Promise<string> } };
      w.__askedInGesture = null;
      w.DeviceMotionEvent.requestPermission = () => {
        w.__askedInGesture = navigator.userActivation.isActive;
        return Promise.resolve('denied');
      };
    });
    const page = await context.newPage();
    await page.goto('/measure/pendulum');
    await page.getByRole('button', { name: 'Start' }).click();
    await page.getByRole('alert').filter({ hasText: /motion access was refused/i }).waitFor();
    expect(await page.evaluate(() => (window as unknown as { __askedInGesture: boolean | null }).__askedInGesture)).toBe(true);
    await context.close();
  });

  it('keeps what was recorded when the page goes to the background mid-recording', async () => {
    const context = await newAppContext(chromium.browser);
    const page = await context.newPage();
    await page.goto('/measure/pendulum');
    await playMotion(page, TABLE, HOLD_ROWS);
    await page.getByRole('button', { name: 'Start' }).click();
    await page.getByText('Recording: let go of the leg now.').waitFor({ timeout: 10_000 });
    await releaseMotion(page);
    // About 0.6 s of swing at the 16 ms event interval.
    await waitForMotionEvents(page, 38, 'the first part of the swing');
    await page.evaluate(() => {
      Object.defineProperty(document, 'visibilityState', { value: 'hidden', configurable: true });
      document.dispatchEvent(new Event('visibilitychange'));
    });
    await page.getByRole('alert').filter({ hasText: /went to the background.*kept/i }).waitFor();
    const status = (await page.getByText(/^Stopped: \d+ samples recorded\.$/).textContent()) ?? '';
    expect(Number(/(\d+) samples/.exec(status)?.[1])).toBeGreaterThan(150);
    expect(await page.getByRole('button', { name: /export raw recording/i }).count()).toBe(1);
    await context.close();
  });
});

describe('phone inclinometer', () => {
  it('measures a joint angle by the two-position method with a steadiness check, shown large', async () => {
    const toTable = (o: Float64Array) => {
      const s = staticDeviceMotion(o, 0.5, { rateHz: RATE_HZ, errors: { ...NO_ERRORS, accNoiseMs2: 0.03, gyroNoiseDps: 0.1 }, seed: 3 });
      return Array.from(s.timeMs, (_, i) => [s.rateAlphaDps[i], s.rateBetaDps[i], s.rateGammaDps[i], s.accXMs2[i], s.accYMs2[i], s.accZMs2[i]]);
    };
    // Phone flat on the shin (screen out), segment horizontal; then the knee bent by 72° (rotation about the world's left axis).
    const startOrientation = SHIN_SCREEN_OUT;
    const endOrientation = multiply(axisAngle(0, 1, 0, 72), SHIN_SCREEN_OUT);
    const context = await newAppContext(chromium.browser, { viewport: smallPhone });
    const page = await context.newPage();
    await page.goto('/measure/inclinometer');
    await playMotion(page, toTable(startOrientation), 0);
    await releaseMotion(page);
    await page.getByRole('button', { name: 'Start sensors' }).click();
    await page.getByText('Steady', { exact: true }).waitFor({ timeout: 20_000 });
    expect(Number((await page.locator('[data-value="segment"]').textContent())?.replace('°', ''))).toBeCloseTo(90, 0);
    await page.getByRole('button', { name: 'Set zero' }).click();
    await swapMotionTable(page, toTable(endOrientation));
    // The steadiness window (about 1 s) must refill with the new position: 80 events at 16 ms.
    await waitForMotionEvents(page, 80, 'the leg held still in the end position');
    await page.getByText('Steady', { exact: true }).waitFor({ timeout: 20_000 });
    await page.getByRole('button', { name: 'Measure end position' }).click();
    const shown = Number((await page.getByLabel('Joint angle').textContent())?.replace('°', ''));
    expect(Math.abs(shown - 72)).toBeLessThan(1);
    expect(await seriousAxeViolations(page)).toEqual([]);
    await screenshot(page, 'sensors-inclinometer-360');
    await page.setViewportSize(tablet);
    await screenshot(page, 'sensors-inclinometer-1024');
    await context.close();
  });

  it('saves the phone reading to a patient: range of motion with instrument "phone sensor", shown on the patient page', async () => {
    const toTable = (o: Float64Array) => {
      const st = staticDeviceMotion(o, 0.5, { rateHz: RATE_HZ, errors: { ...NO_ERRORS, accNoiseMs2: 0.03, gyroNoiseDps: 0.1 }, seed: 5 });
      return Array.from(st.timeMs, (_, i) => [st.rateAlphaDps[i], st.rateBetaDps[i], st.rateGammaDps[i], st.accXMs2[i], st.accYMs2[i], st.accZMs2[i]]);
    };
    const context = await newAppContext(chromium.browser, { viewport: smallPhone });
    const page = await context.newPage();
    await setUpDevice(page);
    const patientPath = await openFirstPatient(page);
    await page.getByRole('link', { name: 'Phone inclinometer' }).click();
    await page.getByRole('button', { name: 'Start sensors' }).waitFor();
    await playMotion(page, toTable(SHIN_SCREEN_OUT), 0);
    await releaseMotion(page);
    await page.getByRole('button', { name: 'Start sensors' }).click();
    await page.getByText('Steady', { exact: true }).waitFor({ timeout: 20_000 });
    await page.getByRole('button', { name: 'Set zero' }).click();
    await swapMotionTable(page, toTable(multiply(axisAngle(0, 1, 0, 95), SHIN_SCREEN_OUT)));
    // The steadiness window (about 1 s) must refill with the new position: 80 events at 16 ms.
    await waitForMotionEvents(page, 80, 'the leg held still in the end position');
    await page.getByText('Steady', { exact: true }).waitFor({ timeout: 20_000 });
    await page.getByRole('button', { name: 'Measure end position' }).click();
    await page.getByRole('combobox', { name: /Motion/ }).selectOption('knee-flexion');
    await page.getByRole('radio', { name: 'Right' }).check();
    const angle = Number((await page.getByLabel('Joint angle').textContent())?.replace('°', ''));
    expect(Math.abs(angle - 95)).toBeLessThan(1);
    await page.getByRole('button', { name: 'Save to the record' }).click();
    await page.getByText('Assessment saved.').waitFor({ timeout: 20_000 });
    await page.goto(patientPath);
    await openOverviewGroups(page);
    const row = page.locator('table.overview tbody tr:not(.group)').filter({ hasText: 'Right knee flexion (passive)' }).filter({ hasText: 'Range of motion' });
    await row.waitFor();
    expect(await row.textContent()).toContain(`${angle}°`);
    await context.close();
  });
});
