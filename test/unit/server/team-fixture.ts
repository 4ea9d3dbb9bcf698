import { randomBytes } from 'node:crypto';
import { createUuidV7Generator, type Observation } from '../../../src/lib/domain';
import { generateDemoScenario } from '../../../src/lib/demo';
import { canonicalJson } from '../../../src/lib/store';
import { createApp, migrate, openPostgres, TeamService, type SqlClient } from '../../../src/server';
import { openTemplatePglite } from './pglite-template';

/** The stores the server tests run on: PGlite always; PostgreSQL when .ci/run (or you) set TEAM_SERVER_TEST_DATABASE_URL. */
export const BACKENDS: readonly ('pglite' | 'postgres')[] = process.env.TEAM_SERVER_TEST_DATABASE_URL ? ['pglite', 'postgres'] : ['pglite'];

/** A fresh, migrated database: PGlite in memory (from the template), or a new database on the test PostgreSQL server. */
export async function openBackend(kind: 'pglite' | 'postgres'): Promise<SqlClient> {
  let db: SqlClient;
  if (kind === 'pglite') db = await openTemplatePglite();
  else {
    const base = process.env.TEAM_SERVER_TEST_DATABASE_URL!;
    const admin = await openPostgres(base, 1);
    const name = `kinnote_test_${randomBytes(6).toString('hex')}`;
    await admin.exec(`CREATE DATABASE ${name}`);
    await admin.close();
    const url = new URL(base);
    url.pathname = `/${name}`;
    db = await openPostgres(url.toString(), 20);
  }
  await migrate(db);
  return db;
}

export interface Harness {
  readonly db: SqlClient;
  readonly service: TeamService;
  call(method: string, path: string, token: string | null, body?: unknown, address?: string): Promise<{ status: number; json: Record<string, unknown> }>;
}

export function harness(db: SqlClient, options: { enrolLimit?: number } = {}): Harness {
  const service = new TeamService(db);
  const app = createApp(service, options);
  return {
    db,
    service,
    async call(method, path, token, body, address = `10.1.${randomBytes(1)[0]}.${randomBytes(1)[0]}`) {
      const headers: Record<string, string> = { 'content-type': 'application/json', 'x-kinnote-test-address': address };
      if (token) headers.authorization = `Bearer ${token}`;
      const response = await app.request(path, { method, headers, ...(body === undefined ? {} : { body: JSON.stringify(body) }) });
      return { status: response.status, json: (await response.json()) as Record<string, unknown> };
    },
  };
}

/** Creates a team and enrols its first admin; returns the admin's token. */
export async function teamWithAdmin(h: Harness, name = 'Test team'): Promise<{ teamId: string; adminToken: string }> {
  const team = await h.service.createTeam(name);
  const enrolled = await h.call('POST', '/v1/enrol', null, { auth: team.code.replace(/-/g, '').slice(0, 10), label: 'admin tablet' });
  if (enrolled.status !== 200) throw new Error(`enrol failed: ${JSON.stringify(enrolled.json)}`);
  return { teamId: team.teamId, adminToken: enrolled.json.token as string };
}

const ALPHABET = '0123456789ABCDEFGHJKMNPQRSTVWXYZ';
export const randomAuth = () => Array.from(randomBytes(10), (b) => ALPHABET[b & 31]).join('');

/** An admin issues a code for `role` and a device enrols with it; returns its token. */
export async function enrolDevice(h: Harness, adminToken: string, role: 'clinician' | 'auditor' | 'admin', label = `${role} device`): Promise<{ token: string; deviceId: string }> {
  const auth = randomAuth();
  const issued = await h.call('POST', '/v1/codes', adminToken, { auth, role, ttlMs: 600_000, keyEnvelope: role === 'auditor' ? null : '{"v":1}' });
  if (issued.status !== 200) throw new Error(`issue failed: ${JSON.stringify(issued.json)}`);
  const enrolled = await h.call('POST', '/v1/enrol', null, { auth, label });
  if (enrolled.status !== 200) throw new Error(`enrol failed: ${JSON.stringify(enrolled.json)}`);
  return { token: enrolled.json.token as string, deviceId: enrolled.json.deviceId as string };
}

const scenario = generateDemoScenario({ seed: 7, patientCount: 4 });
/** The invented demo scenario (seed 7, 4 patients): names, dates of birth and notes to look for in a dump. */
export const DEMO = scenario.tables;
const angleTemplate = scenario.tables.observations.find((o) => o.value.kind === 'angle')!;

/**
 * Messy simulated observations, not from the app's own writer: ids from a clock that jumps and
 * repeats milliseconds, angles with jitter and occasional gaps (skipped ids), updatedAt with clock skew.
 */
export function simulatedObservations(count: number, seed: number, deviceId: string): Observation[] {
  let state = seed >>> 0 || 1;
  const rand = () => ((state = (Math.imul(state, 1664525) + 1013904223) >>> 0) / 2 ** 32);
  let t = Date.UTC(2025, 0, 1) + seed * 1000;
  const newId = createUuidV7Generator(() => (t += rand() < 0.3 ? 0 : Math.floor(rand() * 5000)), (n) => randomBytes(n));
  const out: Observation[] = [];
  for (let i = 0; i < count; i++) {
    if (rand() < 0.02) newId(); // a gap: an id drawn and never used
    const id = newId();
    const skewMs = Math.floor((rand() - 0.5) * 120_000);
    const at = new Date(t + skewMs).toISOString();
    const base = angleTemplate.value.kind === 'angle' ? angleTemplate.value.angleDeg : 0;
    const angleDeg = Math.round((base + (rand() - 0.5) * 10 + (rand() < 0.05 ? 3 : 0)) * 10) / 10;
    out.push({ ...angleTemplate, id, deviceId, createdAt: at, updatedAt: at, value: { kind: 'angle', angleDeg } });
  }
  return out;
}

/** SHA-free order-independent fingerprint: the sorted canonical texts joined (tests compare them directly). */
export function fingerprint(records: Iterable<{ table: string; record: { id: string } }>): string {
  return [...records].map((r) => `${r.table}/${canonicalJson(r.record)}`).sort().join('\n');
}
