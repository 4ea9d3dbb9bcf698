import { formatUuidV7, TABLE_NAMES, type RecordTables, type TableName } from '../domain';
import { DEMO_TEAM } from './demo-people';
import { SeededRandom } from './seeded-random';

export type DemoTables = { [K in TableName]: RecordTables[K][] };

export const DAY_MS = 86_400_000;

export const clamp = (x: number, lo: number, hi: number): number => Math.min(hi, Math.max(lo, x));

/** What every step of the demo generator shares: the seeded source, the tables it fills, and time and id helpers. */
export interface DemoContext {
  readonly rng: SeededRandom;
  readonly tables: DemoTables;
  readonly endMs: number;
  readonly iso: (ms: number) => string;
  /** `YYYY-MM-DD` of an instant (UTC). */
  readonly day: (ms: number) => string;
  /** A UUIDv7 at that instant, its random bits from the seeded source. */
  readonly idAt: (ms: number) => string;
  readonly stamps: (ms: number, deviceId: string, clinicianId: string) => { createdAt: string; updatedAt: string; deviceId: string; clinicianId: string; deleted: false };
}

export function demoContext(seed: number, endMs: number): DemoContext {
  const rng = new SeededRandom(seed);
  const tables = Object.fromEntries(TABLE_NAMES.map((t) => [t, []])) as unknown as DemoTables;
  const iso = (ms: number) => new Date(ms).toISOString();
  return {
    rng,
    tables,
    endMs,
    iso,
    day: (ms) => iso(ms).slice(0, 10),
    idAt: (ms) => formatUuidV7(ms, rng.int(0, 0xfff), rng.bytes(8)),
    stamps: (ms, deviceId, clinicianId) => ({ createdAt: iso(ms), updatedAt: iso(ms), deviceId, clinicianId, deleted: false }),
  };
}

/** The team and its devices, set up a little before the first patient. */
export function demoTeam(ctx: DemoContext): { deviceIds: string[]; clinicianIds: string[] } {
  const { tables, idAt, stamps } = ctx;
  const setupMs = ctx.endMs - 400 * DAY_MS;
  const deviceIds = [idAt(setupMs), idAt(setupMs + 60_000)];
  const clinicianIds = DEMO_TEAM.map((_, i) => idAt(setupMs + 120_000 + i * 60_000));
  deviceIds.forEach((id, i) =>
    tables.devices.push({ id, ...stamps(setupMs + i * 60_000, deviceIds[0]!, clinicianIds[0]!), name: `Team tablet ${'AB'[i]} (demo)`, platform: 'demo' }),
  );
  DEMO_TEAM.forEach((c, i) =>
    tables.clinicians.push({ id: clinicianIds[i]!, ...stamps(setupMs + 120_000 + i * 60_000, deviceIds[0]!, clinicianIds[0]!), displayName: c.displayName, profession: c.profession, registration: null }),
  );
  return { deviceIds, clinicianIds };
}
