// Three devices of one team in the browser against a real team server process on 127.0.0.1 (PGlite
// in a temporary folder): two clinicians' tablets (A, the team's first admin, and B) and an
// auditor's laptop (C), each a separate browser context with its own IndexedDB. Each joins through
// Settings → Team; A and B record offline, reconnect and converge; a record edited on both while
// offline settles by the documented rule (the later change wins everywhere) and is listed; the
// auditor gets codes and measurements but never a name, birth date or note; a revoked device is refused.
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runCli, ServerProcess } from '../server-load/server-process';
import { newPostgresDatabase, pgDump, secretsIn } from '../unit/server/pg-dump';
import { newPgliteDataDir } from '../unit/server/pglite-template';
import { sharedChromium } from '../support/shared-browser';
import { setUpDevice, tableRows } from './app-helpers';
import { newAppContext, screenshotDir, seriousAxeViolations, smallPhone, tablet, waitForOfflineWorker } from './harness';

// Invented people (names, birth dates and notes made up for this test).
const PEOPLE = {
  a: { given: 'Orlaith', family: 'Quillfeather', dob: '1961-04-09', note: 'Invented note A: heel cord tight on the stairs' },
  b: { given: 'Tobiah', family: 'Marrowgate', dob: '1958-11-23', note: 'Invented note B: wrist eased after the splint' },
} as const;
const SECRETS = Object.values(PEOPLE).flatMap((p) => [p.given, p.family, p.dob, p.note]);

// PGlite by default; with KINNOTE_E2E_TEAM_DATABASE_URL (a PostgreSQL server, e.g. the throwaway
// cluster's URL) the same test runs on a new database there and ends with a pg_dump scan.
const POSTGRES = process.env.KINNOTE_E2E_TEAM_DATABASE_URL;
const chromium = sharedChromium();
let server: ServerProcess;
let dataDir: string;
let databaseUrl = '';
let initCode: string;
beforeAll(async () => {
  dataDir = mkdtempSync(join(tmpdir(), 'kinnote-e2e-team-'));
  if (POSTGRES) databaseUrl = await newPostgresDatabase(POSTGRES, 'kinnote_e2e');
  // A migrated PGlite folder from the template (initdb in WebAssembly would add 35–45 s here).
  else await newPgliteDataDir(dataDir);
  const env = { ...process.env, DATABASE_URL: databaseUrl };
  initCode = (JSON.parse(await runCli(['team-server', 'init', '--name', 'Riverside test team', '--data', dataDir], env)) as { code: string }).code;
  server = new ServerProcess(['--port', '0', '--host', '127.0.0.1', '--data', dataDir], env);
  await server.start();
});
afterAll(async () => {
  await server?.stop();
  if (dataDir) rmSync(dataDir, { recursive: true, force: true });
});

/**
 * The built page's Content-Security-Policy lets it call only the team server origin configured at
 * build time (KINNOTE_TEAM_SERVER_ORIGIN); this test's server listens on a port picked at run time,
 * so its contexts bypass the policy (security-policy.e2e.ts tests the policy itself).
 */
async function device(viewport: { width: number; height: number }): Promise<{ context: BrowserContext; page: Page }> {
  const context = await newAppContext(chromium.browser, { viewport, bypassCSP: true });
  const page = await context.newPage();
  await setUpDevice(page, { demo: false });
  await waitForOfflineWorker(page);
  return { context, page };
}

async function openSettings(page: Page): Promise<void> {
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Settings' }).click();
  await page.getByRole('heading', { name: 'Settings', level: 1 }).waitFor();
}

const teamSection = (page: Page) => page.locator('section', { has: page.getByRole('heading', { name: 'Team', exact: true }) });

interface Link {
  token: string;
  deviceId: string;
  lastSyncedAt: string | null;
  conflicts: { table: string; recordId: string; winner: string; reason: string }[];
}
async function teamLink(page: Page): Promise<Link | null> {
  const rows = await tableRows<{ key: string; value: Link | null }>(page, 'meta');
  return rows.find((r) => r.key === 'local:team-link')?.value ?? null;
}

async function joinTeamIn(page: Page, code: string, label: string): Promise<void> {
  await openSettings(page);
  const team = teamSection(page);
  await team.getByLabel('Team server address').fill(server.url);
  await team.getByLabel('Enrolment code').fill(code);
  await team.getByLabel("This device's name").fill(label);
  await team.getByRole('button', { name: 'Join team' }).click();
  await team.getByText(/Riverside test team · this device is/).waitFor({ timeout: 60_000 });
}

/** Settings → Team → Sync now, and waits until that sync has finished (its time stamp moved on). */
async function syncNow(page: Page, who: string): Promise<void> {
  await openSettings(page);
  const team = teamSection(page);
  const button = team.getByRole('button', { name: 'Sync now' });
  // A sync started by itself (on open, back online, after a save) first runs to its end.
  await expect.poll(() => button.isEnabled(), { timeout: 90_000, message: `${who}: waiting for the running sync to end` }).toBe(true);
  const before = (await teamLink(page))?.lastSyncedAt ?? '';
  await button.click();
  await expect
    .poll(async () => ((await teamLink(page))?.lastSyncedAt ?? '') > before && (await button.isEnabled()), {
      timeout: 90_000,
      message: `${who}: waiting for Sync now to finish; status: ${await team.getByRole('status').first().textContent()}`,
    })
    .toBe(true);
}

/** Adds a patient with a name and birth date; returns the patient's pseudonymous code. */
async function addPatient(page: Page, person: (typeof PEOPLE)[keyof typeof PEOPLE]): Promise<string> {
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Caseload' }).click();
  await page.getByRole('link', { name: 'Add a patient' }).first().click();
  await page.getByRole('heading', { name: 'Add a patient' }).waitFor();
  const code = (await page.locator('form strong.code').textContent())!.trim();
  await page.getByLabel('Birth year').fill(person.dob.slice(0, 4));
  await page.getByLabel('First name').fill(person.given);
  await page.getByLabel('Family name').fill(person.family);
  await page.getByLabel('Date of birth').fill(person.dob);
  await page.getByRole('button', { name: 'Add patient' }).click();
  await page.getByRole('link', { name: 'New assessment' }).waitFor();
  return code;
}

/** A new assessment with one Modified Ashworth grade and a note, on the open patient page. */
async function addAssessment(page: Page, note: string): Promise<void> {
  await page.getByRole('link', { name: 'New assessment' }).click();
  await page.getByRole('heading', { name: /New assessment/ }).waitFor();
  const mas = page.locator('section', { has: page.getByRole('heading', { name: 'Modified Ashworth' }) });
  await mas.getByRole('button', { name: 'Add a muscle group' }).click();
  await mas.getByLabel('Muscle group').selectOption('elbow-flexors');
  await mas.getByRole('radio', { name: 'Right' }).check();
  await mas.getByRole('radio', { name: '1+', exact: true }).check();
  await page.getByRole('textbox', { name: 'Notes', exact: true }).fill(note);
  await page.getByRole('button', { name: 'Save assessment' }).click();
  await page.getByRole('button', { name: 'Save visit' }).click();
  await page.getByText('Assessment saved.').waitFor();
}

async function openPatient(page: Page, code: string): Promise<void> {
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Caseload' }).click();
  await page.locator('a.row', { hasText: code }).click();
  await page.getByRole('link', { name: 'New assessment' }).waitFor();
}

const assessmentItems = (page: Page) => page.locator('section[aria-labelledby="assessments-title"] ol.timeline > li', { has: page.locator('time') });

describe('a team of three devices through the team server', () => {
  it('joins in Settings, converges after offline work, settles and lists a conflict, keeps identities from the auditor, refuses a revoked device', async () => {
    // One after another: three first loads at once on a loaded 2-core machine miss the offline worker's wait.
    const A = await device(smallPhone);
    const B = await device(tablet);
    const C = await device(tablet);

    // A joins with the first admin's code and draws one code for B (clinician) and one for C (auditor).
    await joinTeamIn(A.page, initCode, 'Tablet A');
    let previous: string | null = null;
    const codeFor = async (role: string) => {
      const team = teamSection(A.page);
      await team.getByLabel("New device's role").selectOption(role);
      await team.getByRole('button', { name: /Make a one-time code/ }).click();
      const shown = team.locator('strong.code');
      await expect.poll(async () => (await shown.count()) > 0 && (await shown.textContent()) !== previous, { timeout: 30_000 }).toBe(true);
      previous = (await shown.textContent())!;
      return previous;
    };
    const clinicianCode = await codeFor('clinician');
    const auditorCode = await codeFor('auditor');
    await joinTeamIn(B.page, clinicianCode, 'Tablet B');
    await joinTeamIn(C.page, auditorCode, 'Audit laptop');
    expect(await teamSection(C.page).textContent()).toMatch(/auditor \(measurements and codes only, no names or notes\)/);

    // Both clinicians record offline: a new patient with a name and birth date, and a visit with a note.
    await A.context.setOffline(true);
    await B.context.setOffline(true);
    const codeA = await addPatient(A.page, PEOPLE.a);
    await addAssessment(A.page, PEOPLE.a.note);
    const codeB = await addPatient(B.page, PEOPLE.b);
    await addAssessment(B.page, PEOPLE.b.note);
    // Offline, the work waits on the device and says so.
    await openSettings(A.page);
    await expect.poll(async () => teamSection(A.page).getByRole('status').first().textContent(), { timeout: 30_000 }).toMatch(/change(s)? waiting/);

    await A.context.setOffline(false);
    await B.context.setOffline(false);
    await syncNow(A.page, 'A');
    await syncNow(B.page, 'B');
    await syncNow(A.page, 'A again');
    for (const [who, page] of [['A', A.page], ['B', B.page]] as const) {
      await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Caseload' }).click();
      const rows = page.locator('a.row');
      await expect.poll(() => rows.count(), { message: `${who}'s caseload` }).toBe(2);
      // The names travel sealed and open on both clinicians' devices (the caseload shows first names).
      for (const p of [codeA, codeB, PEOPLE.a.given, PEOPLE.b.given]) await expect.poll(() => page.locator('main').textContent(), { message: `${p} on ${who}` }).toContain(p);
    }
    await openPatient(B.page, codeA);
    expect(await assessmentItems(B.page).count()).toBe(1);

    // Same record on both, offline: A deletes A's visit; later B deletes it and brings it back (Undo).
    // Rule (DEVELOPERS.md): the later change wins everywhere, the other is listed as a conflict.
    await A.context.setOffline(true);
    await B.context.setOffline(true);
    await openPatient(A.page, codeA);
    A.page.once('dialog', (d) => void d.accept());
    await assessmentItems(A.page).first().getByRole('button', { name: /^Delete the assessment of/ }).click();
    await expect.poll(() => assessmentItems(A.page).count()).toBe(0);
    B.page.once('dialog', (d) => void d.accept());
    await assessmentItems(B.page).first().getByRole('button', { name: /^Delete the assessment of/ }).click();
    await B.page.getByRole('button', { name: 'Undo' }).click();
    await expect.poll(() => assessmentItems(B.page).count()).toBe(1);
    await A.context.setOffline(false);
    await B.context.setOffline(false);
    await syncNow(A.page, 'A');
    await syncNow(B.page, 'B');
    await syncNow(A.page, 'A again');
    for (const [who, page] of [['A', A.page], ['B', B.page]] as const) {
      await openPatient(page, codeA);
      await expect.poll(() => assessmentItems(page).count(), { message: `${who}: the later change (B's undo) wins` }).toBe(1);
      await openSettings(page);
      const team = teamSection(page);
      expect(await team.getByRole('status').first().textContent(), who).toMatch(/\d+ conflicts? to look at/);
      await team.getByText('Conflicts', { exact: true }).click();
      const listed = await team.locator('ul.conflicts li').allTextContents();
      expect(listed.join('\n'), who).toMatch(/assessments .*later change/);
      // Only the record edited on both (the visit and its measurement): a version pulled and pushed
      // back, sealed anew, is no conflict.
      for (const line of listed) expect(line, who).toMatch(/^(assessments|observations) /);
      // With base versions each record edited on both devices is listed once (before: three lines per record).
      const ids = (await teamLink(page))!.conflicts.map((c) => `${c.table}/${c.recordId}`);
      expect(new Set(ids).size, `${who}: ${ids.join(', ')}`).toBe(ids.length);
    }

    // The Team section at 360 px (A) and 1024 px (B), looked at, and checked with axe.
    await teamSection(A.page).screenshot({ path: join(screenshotDir, 'team-section-360.png') });
    await teamSection(B.page).screenshot({ path: join(screenshotDir, 'team-section-1024.png') });
    expect(await seriousAxeViolations(A.page)).toEqual([]);
    expect(await seriousAxeViolations(B.page)).toEqual([]);

    // The auditor: both patients by code, the measurements, never a name, birth date or note.
    await syncNow(C.page, 'C');
    await C.page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Caseload' }).click();
    await expect.poll(() => C.page.locator('a.row').count(), { message: "the auditor's caseload" }).toBe(2);
    await openPatient(C.page, codeA);
    await expect.poll(() => C.page.locator('table.overview').textContent()).toMatch(/Modified Ashworth/);
    const stored = JSON.stringify({
      identities: await tableRows(C.page, 'identities'),
      patients: await tableRows(C.page, 'patients'),
      assessments: await tableRows(C.page, 'assessments'),
      observations: await tableRows(C.page, 'observations'),
      audit: await tableRows(C.page, 'audit'),
    });
    expect(JSON.parse(stored).identities).toEqual([]);
    expect(JSON.parse(stored).observations.length).toBe(2);
    expect(stored).toContain(codeA);
    const seen = `${stored}\n${await C.page.locator('body').textContent()}`;
    for (const secret of SECRETS) expect(seen.includes(secret), `${secret} on the auditor's device`).toBe(false);

    // What the server holds for the team (everything an admin can pull) has no name, birth date or note.
    const admin = (await teamLink(A.page))!;
    const pulled = await (await fetch(`${server.url}/v1/pull?cursor=0&limit=2000`, { headers: { authorization: `Bearer ${admin.token}` } })).text();
    expect(pulled).toContain(codeA);
    for (const secret of SECRETS) expect(pulled.includes(secret), `${secret} on the server`).toBe(false);
    if (databaseUrl) {
      const dump = pgDump(databaseUrl);
      expect(dump).toContain(codeA);
      expect(secretsIn(dump, SECRETS), 'in pg_dump of the team database').toEqual([]);
    }

    // A lost laptop: the admin revokes it in Settings → Team (list, confirm), and its next sync is refused.
    await openSettings(A.page);
    const devicesList = teamSection(A.page).locator('details.devices');
    await devicesList.getByText('Team devices', { exact: true }).click();
    const laptop = devicesList.locator('li', { hasText: 'Audit laptop' });
    await laptop.getByText(/auditor/).waitFor({ timeout: 30_000 });
    expect(await laptop.textContent()).toMatch(/Enrolled .* · last seen (?!never)/);
    expect(await devicesList.locator('li', { hasText: 'Tablet A' }).textContent()).toMatch(/\(this device\)/);
    expect(await devicesList.locator('li', { hasText: 'Tablet A' }).getByRole('button').count(), 'no revoke button for itself').toBe(0);
    await laptop.getByRole('button', { name: 'Revoke…' }).click();
    await A.page.setViewportSize(tablet);
    await teamSection(A.page).screenshot({ path: join(screenshotDir, 'team-devices-confirm-1024.png') });
    await A.page.setViewportSize(smallPhone);
    await teamSection(A.page).screenshot({ path: join(screenshotDir, 'team-devices-confirm-360.png') });
    expect(await seriousAxeViolations(A.page)).toEqual([]);
    await laptop.getByRole('button', { name: 'Revoke Audit laptop' }).click();
    await devicesList.getByText('Audit laptop is revoked: it can no longer sync.').waitFor({ timeout: 30_000 });
    expect(await laptop.textContent()).toMatch(/auditor · revoked/);
    const kept = (await tableRows(C.page, 'observations')).length;
    await openSettings(C.page);
    await teamSection(C.page).getByRole('button', { name: 'Sync now' }).click();
    await teamSection(C.page).getByText(/A team admin revoked this device: it no longer syncs\. Everything recorded here stays on this device/).waitFor({ timeout: 60_000 });
    await teamSection(C.page).screenshot({ path: join(screenshotDir, 'team-revoked-1024.png') });
    expect((await tableRows(C.page, 'observations')).length, 'the revoked device keeps its records').toBe(kept);
    expect(kept).toBe(2);

    for (const d of [A, B, C]) await d.context.close();
  });
});
