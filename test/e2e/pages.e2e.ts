// Every therapist and auditor page, one test per page and size: no serious or critical axe-core
// violation, nothing wider than the screen, and at 360 px with text at 200 % (WCAG 2.2 1.4.4 and
// 1.4.10) no sideways overflow and no control cut off. Screenshots are written for a person to look at.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sharedPatientPage } from '../support/shared-browser';
import { phone, reflowProblems, rootFontPx, screenshot, seriousAxeViolations, setTextScale, smallPhone, tablet, waitForSettledPage } from './harness';

const app = sharedPatientPage();

const pages: ReadonlyArray<readonly [name: string, path: () => string]> = [
  ['home', () => '/'],
  ['caseload', () => '/patients'],
  ['patient', () => app.patientPath],
  ['assess', () => `${app.patientPath}/assess`],
  ['pendulum-import', () => `${app.patientPath}/pendulum`],
  ['new-patient', () => '/patients/new'],
  ['reliability', () => '/reliability'],
  ['cohort', () => '/cohort'],
  ['settings', () => '/settings'],
  ['programme-editor', () => `${app.patientPath}/programme`],
  ['measure-pendulum', () => `/measure/pendulum?patient=${app.patientPath.split('/').pop()}`],
  ['measure-inclinometer', () => `/measure/inclinometer?patient=${app.patientPath.split('/').pop()}`],
];

async function visit(name: string, path: string): Promise<void> {
  await app.page.goto(path);
  await waitForSettledPage(app.page, `the ${name} page (${path})`);
}

describe('every page at phone and tablet size: axe-core and no sideways overflow', () => {
  for (const [name, path] of pages) {
    for (const [size, viewport] of [
      ['tablet', tablet],
      ['phone', phone],
    ] as const) {
      it(`${name} at ${size} size`, async () => {
        await app.page.setViewportSize(viewport);
        await visit(name, path());
        const layout = (await reflowProblems(app.page)).join('\n');
        await screenshot(app.page, `page-${name}-${size}`);
        const axe = (await seriousAxeViolations(app.page)).map((v) => `${v.id} ${v.help} @ ${v.targets.slice(0, 3).join(' | ')}`);
        expect(axe, `axe-core on ${name} at ${size}`).toEqual([]);
        expect(layout, `layout of ${name} at ${size}`).toBe('');
      });
    }
  }
});

describe('every page at 360 px with text at 200 %', () => {
  beforeAll(async () => {
    await app.page.setViewportSize(smallPhone);
    await setTextScale(app.page, 2);
  });
  afterAll(async () => {
    await setTextScale(app.page, 1);
  });
  for (const [name, path] of pages) {
    it(`${name} reflows with no sideways overflow and no control cut off`, async () => {
      await visit(name, path());
      expect(await rootFontPx(app.page), 'text size really doubled').toBe(32);
      // Measured before the screenshot: a full-page screenshot resizes the viewport for a moment.
      const layout = (await reflowProblems(app.page)).join('\n');
      await screenshot(app.page, `page-${name}-360-text200`);
      expect(layout, `layout of ${name} at 360 px, 200 % text`).toBe('');
    });
  }
});
