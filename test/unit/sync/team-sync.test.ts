import { randomBytes } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp, migrate, TeamService, type SqlClient } from '../../../src/server';
import { openTemplatePglite } from '../server/pglite-template';
import { issueEnrolmentCode, joinTeam, readTeamLink, syncNow } from '../../../src/lib/sync';
import { parseEnrolmentCode } from '../../../src/lib/sync/enrolment-code';
import { unwrapTeamKey, wrapTeamKey, newTeamKey } from '../../../src/lib/sync/team-key';
import { toWire, fromWire } from '../../../src/lib/sync/wire-codec';
import { freshStore, seedPatient, steppingClock } from '../store/store-helpers';
import { tableRows } from '../../../src/lib/store/table-rows';
import { TEAM_BASES_TABLE } from '../../../src/lib/store';

const rb = (n: number) => new Uint8Array(randomBytes(n));
type Store = Awaited<ReturnType<typeof freshStore>>;
/** The assessment's notes in clear (undefined when the record is absent). */
async function notesOf(store: Store, id: string): Promise<string | null | undefined> {
  const row = await store.assessments.get(id);
  return row ? (await store.context.codecs.assessments.fromRow(row)).notes : undefined;
}

describe('team key hand-off and wire sealing', () => {
  it('the team key opens only with the full code; a sealed identity carries no clear text and opens only with the key', async () => {
    const key = await newTeamKey(rb);
    const code = parseEnrolmentCode('ABCDE-FGHJK-MNPQ-RSTV-WXYZ-0123');
    const envelope = await wrapTeamKey(key, code, rb, 1000);
    expect(Buffer.from((await unwrapTeamKey(envelope, code)).raw)).toEqual(Buffer.from(key.raw));
    await expect(unwrapTeamKey(envelope, { ...code, key: 'ABCDEFGHJKMNPQR0' })).rejects.toThrow(/does not open/);
    await expect(unwrapTeamKey(envelope, { ...code, auth: 'ZZZZZZZZZZ' })).rejects.toThrow(/does not open/);
    const identity = {
      id: '01941f29-8780-746f-8a6e-98ff128ca047',
      createdAt: '2025-01-01T00:00:00.000Z',
      updatedAt: '2025-01-01T00:00:00.000Z',
      deviceId: '01941f29-8780-746f-8a6e-98ff128ca048',
      clinicianId: '01941f29-8780-746f-8a6e-98ff128ca049',
      deleted: false,
      patientId: '01941f29-8780-746f-8a6e-98ff128ca04a',
      familyName: 'Quillfeather',
      givenName: 'Orla',
      dateOfBirth: '1961-04-09',
      contact: '+00 000 0000',
    };
    const wire = await toWire('identities', identity, key, rb);
    expect(JSON.stringify(wire)).not.toMatch(/Quillfeather|Orla|1961-04-09|000 0000/);
    expect(await fromWire('identities', wire, key)).toEqual(identity);
    await expect(fromWire('identities', wire, await newTeamKey(rb))).rejects.toThrow(/does not open/);
    await expect(fromWire('identities', wire, null)).rejects.toThrow(/no team key/);
  });
});

describe('devices in step through the team server (PGlite, in process)', () => {
  let db: SqlClient;
  let service: TeamService;
  let deps: { fetch: typeof fetch; randomBytes: typeof rb };
  beforeAll(async () => {
    db = await openTemplatePglite();
    await migrate(db);
    service = new TeamService(db);
    const app = createApp(service, { enrolLimit: 100 });
    deps = {
      randomBytes: rb,
      fetch: (async (url: string, init?: RequestInit) => {
        return app.request(String(url).replace('http://team.test', ''), init);
      }) as typeof fetch,
    };
  }, 300_000); // the first PGlite template on a machine runs initdb in WebAssembly: slow on a loaded machine
  afterAll(async () => {
    await db.close();
  });

  it('A records, B sees it with names and notes; the auditor sees measurements without identities or notes; a conflict is settled alike and listed', async () => {
    const team = await service.createTeam('Riverside team');
    const a = await freshStore({ now: steppingClock(Date.UTC(2025, 2, 1, 9)) });
    await joinTeam(a, { serverUrl: 'http://team.test', code: team.code, label: 'tablet A' }, deps);
    const clinicianCode = await issueEnrolmentCode(a, 'clinician', 600_000, deps);
    const auditorCode = await issueEnrolmentCode(a, 'auditor', 600_000, deps);
    // Clocks a few minutes apart (B later than A): within the 10 minutes an import accepts.
    const b = await freshStore({ now: steppingClock(Date.UTC(2025, 2, 1, 9, 5)) });
    await joinTeam(b, { serverUrl: 'http://team.test', code: clinicianCode.code, label: 'tablet B' }, deps);
    const auditor = await freshStore({ now: steppingClock(Date.UTC(2025, 2, 1, 9, 7)) });
    await joinTeam(auditor, { serverUrl: 'http://team.test', code: auditorCode.code, label: 'audit laptop' }, deps);

    const { patient, assessment } = await seedPatient(a);
    await a.identities.create({ patientId: patient.id, familyName: 'Quillfeather', givenName: 'Orla', dateOfBirth: '1961-04-09', contact: null });
    expect((await syncNow(a, deps)).pushed).toBeGreaterThan(0);
    await syncNow(b, deps);
    expect(await notesOf(b, assessment.id)).toBe('Invented note: stiffer in the cold');
    const identityB = await b.identities.forPatient(patient.id);
    expect(identityB?.familyName).toBe('Quillfeather');

    await syncNow(auditor, deps);
    expect(await auditor.db.table('identities').count()).toBe(0);
    expect((await auditor.assessments.get(assessment.id))?.notesSealed).toBeNull();
    expect((await tableRows(auditor.db, 'observations').all()).length).toBe(1);

    // The server's tables hold no name, birth date or note in clear.
    const dump = (await db.query<{ body: string }>('SELECT body FROM records')).map((r) => r.body).join('\n');
    expect(dump).not.toMatch(/Quillfeather|Orla|1961-04-09|stiffer in the cold/);

    // Both edit the same assessment; B's edit is later, so it wins everywhere and the conflict is listed.
    await a.assessments.update(assessment.id, { notes: 'A: edited offline' });
    await b.assessments.update(assessment.id, { notes: 'B: edited offline, later' });
    await syncNow(a, deps);
    await syncNow(b, deps);
    await syncNow(a, deps);
    expect(await notesOf(a, assessment.id)).toBe('B: edited offline, later');
    expect(await notesOf(b, assessment.id)).toBe('B: edited offline, later');
    const listed = [...(await readTeamLink(a))!.conflicts, ...(await readTeamLink(b))!.conflicts];
    expect(listed.some((c) => c.recordId === assessment.id)).toBe(true);
  });
});

describe('ordinary edits through the team server are no conflicts (PGlite, in process)', () => {
  let db: SqlClient;
  let deps: { fetch: typeof fetch; randomBytes: typeof rb };
  beforeAll(async () => {
    db = await openTemplatePglite();
    await migrate(db);
    const app = createApp(new TeamService(db), { enrolLimit: 100 });
    deps = { randomBytes: rb, fetch: (async (url: string, init?: RequestInit) => app.request(String(url).replace('http://team.test', ''), init)) as typeof fetch };
  }, 300_000);
  afterAll(async () => {
    await db.close();
  });

  it('B edits what it pulled, A edits what it pulled back: nothing is listed; edits of one version on both devices are, once per record', async () => {
    const team = await new TeamService(db).createTeam('Edit team');
    const a = await freshStore({ now: steppingClock(Date.UTC(2025, 2, 1, 9)) });
    await joinTeam(a, { serverUrl: 'http://team.test', code: team.code, label: 'tablet A' }, deps);
    const b = await freshStore({ now: steppingClock(Date.UTC(2025, 2, 1, 9, 3)) });
    await joinTeam(b, { serverUrl: 'http://team.test', code: (await issueEnrolmentCode(a, 'clinician', 600_000, deps)).code, label: 'tablet B' }, deps);
    const { assessment } = await seedPatient(a);
    await syncNow(a, deps);
    await syncNow(b, deps);
    await b.assessments.update(assessment.id, { notes: 'B: second look' });
    await syncNow(b, deps);
    const pulledByA = await syncNow(a, deps);
    expect(pulledByA.conflicts).toEqual([]);
    expect(await notesOf(a, assessment.id)).toBe('B: second look');
    await a.assessments.update(assessment.id, { notes: 'A: third look' });
    // The assessment, its audit entry and the audit entry of the import that brought B's edit: nothing pulled is pushed back.
    expect((await syncNow(a, deps)).pushed).toBe(3);
    await syncNow(b, deps);
    expect(await notesOf(b, assessment.id)).toBe('A: third look');
    expect((await readTeamLink(a))!.conflicts).toEqual([]);
    expect((await readTeamLink(b))!.conflicts).toEqual([]);
    expect((await db.query('SELECT 1 FROM conflicts')).length).toBe(0);

    // Now both edit the version they share: one real conflict, listed on both devices.
    await a.assessments.update(assessment.id, { notes: 'A: offline' });
    await b.assessments.update(assessment.id, { notes: 'B: offline, later' });
    await syncNow(a, deps);
    await syncNow(b, deps);
    await syncNow(a, deps);
    expect(await notesOf(a, assessment.id)).toBe('B: offline, later');
    expect(await notesOf(b, assessment.id)).toBe('B: offline, later');
    for (const device of [a, b]) {
      const listed = (await readTeamLink(device))!.conflicts.filter((c) => c.recordId === assessment.id);
      expect(listed.length, JSON.stringify(listed)).toBe(1);
    }
    // Again, B syncing first: whichever copy is newer, the conflict is listed once per device (from the
    // server), not a second time when a pull brings the server's copy.
    await a.assessments.update(assessment.id, { notes: 'A: offline again' });
    await b.assessments.update(assessment.id, { notes: 'B: offline again, later' });
    await syncNow(b, deps);
    await syncNow(a, deps);
    await syncNow(b, deps);
    expect(await notesOf(a, assessment.id)).toBe(await notesOf(b, assessment.id));
    for (const device of [a, b]) {
      const listed = (await readTeamLink(device))!.conflicts.filter((c) => c.recordId === assessment.id);
      expect(listed.length, JSON.stringify(listed)).toBe(2);
    }
  });
});

describe('a device upgraded to schema 14 while in a team (PGlite, in process)', () => {
  it('lists no conflict for a teammate\'s later edit, nor for its own edit of a pulled record', { timeout: 300_000 }, async () => {
    const db = await openTemplatePglite();
    await migrate(db);
    try {
      const app = createApp(new TeamService(db), { enrolLimit: 100 });
      const deps = { randomBytes: rb, fetch: (async (url: string, init?: RequestInit) => app.request(String(url).replace('http://team.test', ''), init)) as typeof fetch };
      const team = await new TeamService(db).createTeam('Upgrade team');
      const a = await freshStore({ now: steppingClock(Date.UTC(2025, 2, 1, 9)) });
      await joinTeam(a, { serverUrl: 'http://team.test', code: team.code, label: 'tablet A' }, deps);
      const b = await freshStore({ now: steppingClock(Date.UTC(2025, 2, 1, 9, 30)) });
      await joinTeam(b, { serverUrl: 'http://team.test', code: (await issueEnrolmentCode(a, 'clinician', 600_000, deps)).code, label: 'tablet B' }, deps);
      const first = await seedPatient(a);
      const second = await seedPatient(a, 'QW3E-7RTY');
      await syncNow(a, deps);
      await syncNow(b, deps);
      // B as it is right after the upgrade to schema 14: in the team, synced, and no bases at all.
      await b.db.table(TEAM_BASES_TABLE).clear();
      // A edits one assessment; B edits the other (which it had pulled before the upgrade).
      await a.assessments.update(first.assessment.id, { notes: 'A: after the upgrade' });
      await syncNow(a, deps);
      await b.assessments.update(second.assessment.id, { notes: 'B: after the upgrade' });
      await syncNow(b, deps);
      await syncNow(a, deps);
      expect(await notesOf(b, first.assessment.id)).toBe('A: after the upgrade');
      expect(await notesOf(a, second.assessment.id)).toBe('B: after the upgrade');
      // Before the fix: B listed A's edit (taken from the team) and the server listed B's edit.
      expect((await readTeamLink(b))!.conflicts).toEqual([]);
      expect((await readTeamLink(a))!.conflicts).toEqual([]);
      expect((await db.query('SELECT 1 FROM conflicts')).length).toBe(0);
    } finally {
      await db.close();
    }
  });
});

describe('a device whose clock is 25 minutes behind its team (PGlite, in process)', () => {
  it('takes its teammates\' records, stamps its own by the server\'s clock, and its edit wins as the later one', { timeout: 300_000 }, async () => {
    const db = await openTemplatePglite();
    await migrate(db);
    try {
      // The server and tablet A keep real time; tablet B's clock runs 25 minutes slow and drifts
      // (jitter of up to ±300 ms on every reading), as a tablet that never set its clock.
      const service = new TeamService(db);
      const app = createApp(service, { enrolLimit: 100 });
      const deps = { randomBytes: rb, fetch: (async (url: string, init?: RequestInit) => app.request(String(url).replace('http://team.test', ''), init)) as typeof fetch };
      const behindMs = 25 * 60_000;
      const a = await freshStore({ now: () => Date.now() });
      const b = await freshStore({ now: () => Date.now() - behindMs + Math.round((Math.random() - 0.5) * 600) });
      const team = await service.createTeam('Clock team');
      await joinTeam(a, { serverUrl: 'http://team.test', code: team.code, label: 'tablet A' }, deps);
      await joinTeam(b, { serverUrl: 'http://team.test', code: (await issueEnrolmentCode(a, 'clinician', 600_000, deps)).code, label: 'tablet B (slow clock)' }, deps);
      expect(Math.abs(b.clock.offsetMs - behindMs)).toBeLessThan(5000);
      expect(a.clock.offsetMs).toBe(0); // within the noise tolerance: A's own clock is kept

      // A's records are stamped 25 minutes after B's own clock: B takes them (the check uses team time).
      const { assessment } = await seedPatient(a);
      await syncNow(a, deps);
      await syncNow(b, deps);
      expect(await notesOf(b, assessment.id)).toBe('Invented note: stiffer in the cold');

      // B's edit comes after A's in real time, and is stamped so: it wins on both, listed nowhere.
      await b.assessments.update(assessment.id, { notes: 'B: later look' });
      const edited = await b.assessments.get(assessment.id);
      expect(Math.abs(Date.parse(edited!.updatedAt) - Date.now())).toBeLessThan(10_000);
      const created = await b.patients.create({ code: 'QW3E-7RTY', birthYear: 1950, condition: 'stroke', affectedSides: ['right'], status: 'active' });
      expect(Math.abs(Date.parse(created.createdAt) - Date.now())).toBeLessThan(10_000);
      await syncNow(b, deps);
      await syncNow(a, deps);
      expect(await notesOf(a, assessment.id)).toBe('B: later look');
      expect(await a.patients.get(created.id)).toBeDefined();
      expect((await readTeamLink(a))!.conflicts).toEqual([]);
      expect((await readTeamLink(b))!.conflicts).toEqual([]);
      // The offset is kept on the device: a reopened store stamps by it without the network.
      expect(await b.db.table('meta').get('local:clock-offset')).toMatchObject({ value: b.clock.offsetMs });
    } finally {
      await db.close();
    }
  });
});

describe('a device whose clock ran 2 hours fast before its first sync (PGlite, in process)', () => {
  it('its earlier records reach the team on team time, content unchanged, and the move is audited', { timeout: 300_000 }, async () => {
    const db = await openTemplatePglite();
    await migrate(db);
    try {
      const service = new TeamService(db);
      const app = createApp(service, { enrolLimit: 100 });
      const deps = { randomBytes: rb, fetch: (async (url: string, init?: RequestInit) => app.request(String(url).replace('http://team.test', ''), init)) as typeof fetch };
      // Tablet B was set up and used with its clock 2 hours fast (±300 ms jitter per reading): its
      // device, clinician, patient, assessment and observation are all stamped 2 hours ahead.
      const aheadMs = 2 * 3600_000;
      const a = await freshStore({ now: () => Date.now() });
      const b = await freshStore({ now: () => Date.now() + aheadMs + Math.round((Math.random() - 0.5) * 600) });
      const madeAt = Date.now();
      const { patient, assessment, observation } = await seedPatient(b);
      const before = await b.observations.get(observation.id);
      expect(Date.parse(before!.updatedAt) - madeAt).toBeGreaterThan(aheadMs - 60_000);

      const team = await service.createTeam('Fast clock team');
      await joinTeam(a, { serverUrl: 'http://team.test', code: team.code, label: 'tablet A' }, deps);
      await joinTeam(b, { serverUrl: 'http://team.test', code: (await issueEnrolmentCode(a, 'clinician', 600_000, deps)).code, label: 'tablet B (fast clock)' }, deps);
      // Before the fix this sync failed on every try: "… is later than the team server's clock allows".
      const first = await syncNow(b, deps);
      expect(first.pushed).toBeGreaterThanOrEqual(5); // device, clinician, patient, assessment, observation (and audit entries)
      await syncNow(a, deps);

      // A has B's records, stamped when they were made in real time, with their content as written.
      const onA = await a.observations.get(observation.id);
      expect(onA).toBeDefined();
      expect(Math.abs(Date.parse(onA!.updatedAt) - madeAt)).toBeLessThan(60_000);
      expect(onA!.value).toEqual(before!.value);
      expect(onA!.takenAt).toBe(before!.takenAt); // the clinical time is not touched
      expect(await notesOf(a, assessment.id)).toBe('Invented note: stiffer in the cold');
      expect((await a.patients.get(patient.id))!.code).toBe('K7QM-3XHD');
      // B holds the same version it pushed (nothing left waiting, nothing listed as a conflict).
      expect((await b.observations.get(observation.id))!.updatedAt).toBe(onA!.updatedAt);
      expect((await syncNow(b, deps)).pushed).toBe(0);
      expect((await readTeamLink(a))!.conflicts).toEqual([]);
      expect((await readTeamLink(b))!.conflicts).toEqual([]);

      // The move is in B's audit log (and so in A's after the sync): old and new stamps, the offset.
      for (const store of [b, a]) {
        const entries = (await store.db.table('audit').toArray()) as { table: string; note: string | null; before: { stamps?: { id: string; updatedAt: string }[] } | null; after: { stamps?: { id: string; updatedAt: string }[]; offsetMs?: number } | null }[];
        const moves = entries.filter((e) => e.table === '*' && e.after?.stamps !== undefined);
        expect(moves.length).toBe(1);
        const was = moves[0]!.before!.stamps!.find((m) => m.id === observation.id);
        const now = moves[0]!.after!.stamps!.find((m) => m.id === observation.id);
        expect(was!.updatedAt).toBe(before!.updatedAt);
        expect(now!.updatedAt).toBe(onA!.updatedAt);
        expect(Math.abs(moves[0]!.after!.offsetMs! + aheadMs)).toBeLessThan(5000);
        expect(moves[0]!.note).toMatch(/120 min ahead/);
      }
    } finally {
      await db.close();
    }
  });
});

describe('kinnote cohort --server', () => {
  it('reads the whole team from the server with a device token, and writes no name or note', { timeout: 400_000 }, async () => {
    const { mkdtempSync, readdirSync, readFileSync } = await import('node:fs');
    const { tmpdir } = await import('node:os');
    const { join } = await import('node:path');
    const { runCli } = await import('../../../src/cli/main');
    const { loadDemoCaseload } = await import('../../../src/lib/store/demo-caseload');
    const { startTeamServer } = await import('../../../src/server');
    const db = await openTemplatePglite();
    await migrate(db);
    const server = await startTeamServer(db, { port: 0, host: '127.0.0.1' });
    try {
      const realDeps = { fetch: globalThis.fetch, randomBytes: rb };
      const team = await server.service.createTeam('Cohort team');
      // The demo runs to 2025-06-30: the store's clock must be later, or the import refuses its "future" stamps.
      const a = await freshStore({ now: steppingClock(Date.UTC(2025, 6, 1)) });
      await joinTeam(a, { serverUrl: server.url, code: team.code, label: 'tablet A' }, realDeps);
      await loadDemoCaseload(a, { seed: 3, patientCount: 3 });
      await syncNow(a, realDeps);
      const auditorCode = await issueEnrolmentCode(a, 'auditor', 600_000, realDeps);
      const enrolled = await service_enrol(server.url, auditorCode.code);
      const out = mkdtempSync(join(tmpdir(), 'kinnote-cohort-server-'));
      let stderr = '';
      const run = (env: Record<string, string>) => runCli(['cohort', '--server', server.url, '--out', out], { stdout: () => undefined, stderr: (t) => (stderr += t), env, cwd: out });
      expect(await run({})).toBe(1);
      expect(stderr).toMatch(/KINNOTE_TOKEN/);
      expect(await run({ KINNOTE_TOKEN: enrolled })).toBe(0);
      const written = readdirSync(out).map((f) => readFileSync(join(out, f), 'utf8')).join('\n');
      const identities = (await a.identities.list()).length;
      expect(identities).toBeGreaterThan(0);
      const long = readFileSync(join(out, 'kinnote-cohort-long.csv'), 'utf8').trim().split('\n');
      expect(long.length - 1).toBe((await a.observations.list()).length);
      for (const row of await a.identities.list()) {
        const person = await a.context.codecs.identities.fromRow(row);
        expect(written).not.toContain(person.familyName);
      }
    } finally {
      await server.close();
      await db.close();
    }
  });
});

async function service_enrol(url: string, code: string): Promise<string> {
  const auth = parseEnrolmentCode(code).auth;
  const res = await fetch(`${url}/v1/enrol`, { method: 'POST', body: JSON.stringify({ auth, label: 'cohort laptop' }) });
  return ((await res.json()) as { token: string }).token;
}
