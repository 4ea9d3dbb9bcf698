// Every therapist and auditor page, one test per page and size: no serious or critical axe-core
// violation, nothing wider than the screen, and at 360 px with text at 200 % (WCAG 2.2 1.4.4 and
// 1.4.10) no sideways overflow and no control cut off. Screenshots are written for a person to look at.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { openFirstPatient, setUpDevice } from './app-helpers';
import { launchChromium, newAppContext, phone, reflowProblems, rootFontPx, screenshot, seriousAxeViolations, setTextScale, smallPhone, tablet, waitForSettledPage } from './harness';

let browser: Browser;
let context: BrowserContext;
let page: Page;
let patientPath = '';

beforeAll(async () => {
  browser = await launchChromium();
  context = await newAppContext(browser, { viewport: tablet });
  page = await context.newPage();
  await setUpDevice(page);
  patientPath = await openFirstPatient(page);
}, 120_000);
afterAll(async () => {
  await context?.close();
  await browser?.close();
});

const pages: ReadonlyArray<readonly [name: string, path: () => string]> = [
  ['home', () => '/'],
  ['caseload', () => '/patients'],
  ['patient', () => patientPath],
  ['assess', () => `${patientPath}/assess`],
  ['pendulum-import', () => `${patientPath}/pendulum`],
  ['new-patient', () => '/patients/new'],
  ['reliability', () => '/reliability'],
  ['cohort', () => '/cohort'],
  ['settings', () => '/settings'],
  ['programme-editor', () => `${patientPath}/programme`],
  ['measure-pendulum', () => `/measure/pendulum?patient=${patientPath.split('/').pop()}`],
  ['measure-inclinometer', () => `/measure/inclinometer?patient=${patientPath.split('/').pop()}`],
];

async function visit(name: string, path: string): Promise<void> {
  await page.goto(path);
  await waitForSettledPage(page, `the ${name} page (${path})`);
}

describe('every page at phone and tablet size: axe-core and no sideways overflow', () => {
  for (const [name, path] of pages) {
    for (const [size, viewport] of [
      ['tablet', tablet],
      ['phone', phone],
    ] as const) {
      it(`${name} at ${size} size`, async () => {
        await page.setViewportSize(viewport);
        await visit(name, path());
        const layout = (await reflowProblems(page)).join('\n');
        await screenshot(page, `page-${name}-${size}`);
        const axe = (await seriousAxeViolations(page)).map((v) => `${v.id} ${v.help} @ ${v.targets.slice(0, 3).join(' | ')}`);
        expect(axe, `axe-core on ${name} at ${size}`).toEqual([]);
        expect(layout, `layout of ${name} at ${size}`).toBe('');
      });
    }
  }
});

describe('every page at 360 px with text at 200 %', () => {
  beforeAll(async () => {
    await page.setViewportSize(smallPhone);
    await setTextScale(page, 2);
  });
  afterAll(async () => {
    await setTextScale(page, 1);
  });
  for (const [name, path] of pages) {
    it(`${name} reflows with no sideways overflow and no control cut off`, async () => {
      await visit(name, path());
      expect(await rootFontPx(page), 'text size really doubled').toBe(32);
      // Measured before the screenshot: a full-page screenshot resizes the viewport for a moment.
      const layout = (await reflowProblems(page)).join('\n');
      await screenshot(page, `page-${name}-360-text200`);
      expect(layout, `layout of ${name} at 360 px, 200 % text`).toBe('');
    });
  }
});
