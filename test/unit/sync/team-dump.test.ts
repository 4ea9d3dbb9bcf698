// "The server never sees a name", proved on a real PostgreSQL: a clinician device that holds the
// invented demo caseload joins a team and syncs; then pg_dump of the team's database is scanned for
// every name, date of birth, contact and note of those patients (zero hits), and a string planted
// in the database in clear is found by the same scan (the positive control). Runs when
// TEAM_SERVER_TEST_DATABASE_URL names a PostgreSQL server (.ci/run starts a throwaway cluster).
import { randomBytes } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { joinTeam, syncNow } from '../../../src/lib/sync';
import { loadDemoCaseload } from '../../../src/lib/store/demo-caseload';
import { createApp, migrate, openPostgres, TeamService } from '../../../src/server';
import { newPostgresDatabase, pgDump, secretsIn } from '../server/pg-dump';
import { freshStore, steppingClock } from '../store/store-helpers';

const BASE = process.env.TEAM_SERVER_TEST_DATABASE_URL;

describe.runIf(BASE)('pg_dump of a synced team database (PostgreSQL)', () => {
  it('holds no name, date of birth, contact or note of the demo patients; a planted name is found', { timeout: 300_000 }, async () => {
    const url = await newPostgresDatabase(BASE!, 'kinnote_dump');
    const db = await openPostgres(url, 5);
    try {
      await migrate(db);
      const service = new TeamService(db);
      const app = createApp(service, { enrolLimit: 100 });
      const deps = {
        randomBytes: (n: number) => new Uint8Array(randomBytes(n)),
        fetch: (async (target: string, init?: RequestInit) => app.request(String(target).replace('http://team.test', ''), init)) as typeof fetch,
      };
      const team = await service.createTeam('Dump team');
      // The demo runs to 2025-06-30: the device's clock is later, or the import refuses "future" stamps.
      const device = await freshStore({ now: steppingClock(Date.UTC(2025, 6, 1)) });
      await joinTeam(device, { serverUrl: 'http://team.test', code: team.code, label: 'tablet' }, deps);
      await loadDemoCaseload(device, { seed: 11, patientCount: 6 });
      const report = await syncNow(device, deps);
      expect(report.pushed).toBeGreaterThan(100);

      // Every protected value on the device, opened with its vault.
      const secrets = new Set<string>();
      for (const row of await device.identities.list()) {
        const person = await device.context.codecs.identities.fromRow(row);
        for (const v of [person.givenName, person.familyName, person.dateOfBirth, person.contact]) if (v) secrets.add(v);
      }
      for (const table of ['assessments', 'events'] as const) {
        for (const row of (await device.db.table(table).toArray()) as never[]) {
          const notes = (await device.context.codecs[table].fromRow(row)).notes;
          if (notes) secrets.add(notes);
        }
      }
      const list = [...secrets];
      expect(list.filter((s) => /^\d{4}-\d{2}-\d{2}$/.test(s)).length, 'dates of birth among the secrets').toBeGreaterThanOrEqual(6);
      expect(list.length).toBeGreaterThan(18);

      const first = pgDump(url);
      expect(first).toMatch(/COPY public\.records/);
      expect((await db.query<{ n: string }>('SELECT count(*) AS n FROM records'))[0]!.n).toBe(String(report.pushed));
      expect(secretsIn(first, list)).toEqual([]);

      // Positive control: one family name written in clear (as a team's name) is found by the same scan.
      const planted = list.find((s) => /^[A-Z][a-z]+$/.test(s))!;
      await db.query('INSERT INTO teams (id, name) VALUES ($1, $2)', ['planted-control', planted]);
      expect(secretsIn(pgDump(url), list)).toEqual([planted]);
    } finally {
      await db.close();
    }
  });
});
