// Load and fault runs against a real team-server process on 127.0.0.1 (used by `npm run bench`
// with the full sizes and by test/unit/server/load.test.ts with small ones). Simulated devices are
// plain HTTP clients with their own record maps: they share none of the app's sync code.
import { createHash } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { canonicalJson } from '../../src/lib/store';
import { newPgliteDataDir } from '../unit/server/pglite-template';
import { runCli, ServerProcess } from './server-process';
import { DEMO, randomAuth, simulatedObservations } from '../unit/server/team-fixture';

export interface LoadOptions {
  readonly devices: number;
  readonly recordsPerDevice: number;
  readonly batchSize: number;
  /** SIGKILL the server this many times during the pushes (0: none). */
  readonly kills: number;
  /** PostgreSQL connection string, or undefined for PGlite in a temporary folder. */
  readonly databaseUrl?: string | undefined;
}

export interface LoadResult {
  readonly store: 'pglite' | 'postgres';
  readonly pushed: number;
  readonly distinctOnServer: number;
  readonly checksums: readonly string[];
  readonly pushRecordsPerSecond: number;
  readonly pushP95Ms: number;
  readonly pullP95Ms: number;
  readonly kills: number;
  /** Batches found partly written after a kill (must be 0). */
  readonly partialBatches: number;
  readonly retries: number;
  /** The bench process's peak resident memory (bytes). */
  readonly peakRssBytes: number;
}

/**
 * An order-independent checksum of a set of records kept in constant memory: the count and the sum,
 * modulo 2^256, of each record's SHA-256 (an additive multiset hash, "AdHash" in Bellare & Micciancio,
 * "A new paradigm for collision-free hashing", EUROCRYPT 1997). A record received twice, or lost, or
 * changed, changes the sum. The bench's 50 devices each receive all 100,000 records: keeping every
 * device's records as text (the earlier way) ran the bench process out of memory at 4 GB.
 */
export class StreamedChecksum {
  private count = 0;
  private sum = 0n;
  add(canonicalText: string): void {
    this.count++;
    this.sum = (this.sum + BigInt('0x' + createHash('sha256').update(canonicalText).digest('hex'))) & ((1n << 256n) - 1n);
  }
  digest(): string {
    return `${this.count}:${this.sum.toString(16)}`;
  }
}

const p95 = (list: number[]) => {
  const sorted = [...list].sort((a, b) => a - b);
  return sorted.length === 0 ? NaN : sorted[Math.min(sorted.length - 1, Math.ceil(0.95 * sorted.length) - 1)]!;
};

export async function runLoad(options: LoadOptions): Promise<LoadResult> {
  const dataDir = mkdtempSync(join(tmpdir(), 'kinnote-team-load-'));
  // PGlite: start from the migrated template instead of running initdb in the server process.
  if (!options.databaseUrl) await newPgliteDataDir(dataDir);
  const env = { ...process.env, DATABASE_URL: options.databaseUrl ?? '' };
  const common = ['--data', dataDir];
  const init = JSON.parse(await runCli(['team-server', 'init', '--name', `Load team ${Date.now()}`, ...common], env)) as { code: string };
  const server = new ServerProcess(['--port', '0', '--enrol-limit', '100000', ...common], env);
  await server.start();
  let alive = true;
  let restarting: Promise<void> = Promise.resolve();
  // Every request retries on a connection error (the server was killed) once the restart is done.
  let retries = 0;
  const request = async (method: string, path: string, token: string | null, body?: unknown): Promise<Record<string, unknown>> => {
    for (;;) {
      await restarting;
      try {
        const res = await fetch(server.url + path, {
          method,
          headers: { 'content-type': 'application/json', ...(token ? { authorization: `Bearer ${token}` } : {}) },
          ...(body === undefined ? {} : { body: JSON.stringify(body) }),
        });
        const json = (await res.json()) as Record<string, unknown>;
        if (res.status !== 200) throw new Error(`${method} ${path}: ${res.status} ${JSON.stringify(json).slice(0, 300)}`);
        return json;
      } catch (error) {
        if ((error as Error).message.startsWith(`${method} ${path}:`)) throw error;
        retries++;
        await new Promise((ok) => setTimeout(ok, 20));
      }
    }
  };
  try {
    const admin = (await request('POST', '/v1/enrol', null, { auth: init.code.replace(/-/g, '').slice(0, 10), label: 'admin' })).token as string;
    // Each device keeps only a streamed checksum of what it pulled (its own records come back in its
    // pulls too); `expected` is the same checksum of every generated record, computed apart.
    const expected = new StreamedChecksum();
    const devices: { token: string; batches: Record<string, unknown>[][]; received: StreamedChecksum; cursor: number }[] = [];
    for (let i = 0; i < options.devices; i++) {
      const auth = randomAuth();
      await request('POST', '/v1/codes', admin, { auth, role: 'clinician', ttlMs: 3_600_000, keyEnvelope: '{"v":1}' });
      const token = (await request('POST', '/v1/enrol', null, { auth, label: `device ${i}` })).token as string;
      const obs = simulatedObservations(options.recordsPerDevice, 1000 + i, DEMO.devices[0]!.id);
      const batches: Record<string, unknown>[][] = [];
      for (let k = 0; k < obs.length; k += options.batchSize) batches.push(obs.slice(k, k + options.batchSize) as unknown as Record<string, unknown>[]);
      for (const o of obs) expected.add(canonicalJson(o));
      devices.push({ token, batches, received: new StreamedChecksum(), cursor: 0 });
    }
    const pushMs: number[] = [];
    const pullMs: number[] = [];
    const inFlight = new Set<Record<string, unknown>[]>();
    let partialBatches = 0;
    let kills = 0;
    const totalBatches = devices.reduce((n, d) => n + d.batches.length, 0);
    let sentBatches = 0;

    const pullAll = async (d: { token: string; received: StreamedChecksum }, cursor: number): Promise<number> => {
      for (;;) {
        const t0 = performance.now();
        const page = await request('GET', `/v1/pull?cursor=${cursor}&limit=1000`, d.token);
        pullMs.push(performance.now() - t0);
        for (const r of page.records as { record: { id: string } }[]) d.received.add(canonicalJson(r.record));
        cursor = page.cursor as number;
        if (!page.more) return cursor;
      }
    };

    const killer = (async () => {
      for (let k = 0; k < options.kills; k++) {
        const target = Math.floor(((k + 1) * totalBatches) / (options.kills + 2));
        while (sentBatches < target) await new Promise((ok) => setTimeout(ok, 5));
        const snapshot = [...inFlight];
        let release!: () => void;
        restarting = new Promise((ok) => (release = ok));
        alive = false;
        await server.kill();
        kills++;
        await server.start();
        alive = true;
        release();
        // No partial batch: every batch that was in flight at the kill is on the server whole or not at all.
        const present = new Set<string>();
        const all = await request('GET', `/v1/pull?cursor=0&limit=2000`, admin);
        let cursor = all.cursor as number;
        for (const r of all.records as { record: { id: string } }[]) present.add(r.record.id);
        let more = all.more as boolean;
        while (more) {
          const page = await request('GET', `/v1/pull?cursor=${cursor}&limit=2000`, admin);
          for (const r of page.records as { record: { id: string } }[]) present.add(r.record.id);
          cursor = page.cursor as number;
          more = page.more as boolean;
        }
        for (const batch of snapshot) {
          const n = batch.filter((r) => present.has(r.id as string)).length;
          if (n !== 0 && n !== batch.length) partialBatches++;
        }
      }
    })();

    const started = performance.now();
    await Promise.all(
      devices.map(async (d) => {
        for (const batch of d.batches) {
          inFlight.add(batch);
          sentBatches++;
          const t0 = performance.now();
          await request('POST', '/v1/push', d.token, { records: batch.map((record) => ({ table: 'observations', record })) });
          if (alive) pushMs.push(performance.now() - t0);
          inFlight.delete(batch);
          d.cursor = await pullAll(d, d.cursor);
        }
      }),
    );
    const pushSeconds = (performance.now() - started) / 1000;
    await killer;
    // Everyone pulls what arrived after their last pull.
    await Promise.all(devices.map(async (d) => (d.cursor = await pullAll(d, d.cursor))));
    const checksums = devices.map((d) => d.received.digest());
    const serverView = { token: admin, received: new StreamedChecksum() };
    await pullAll(serverView, 0);
    const serverDigest = serverView.received.digest();
    const pushed = devices.reduce((n, d) => n + d.batches.reduce((m, b) => m + b.length, 0), 0);
    return {
      store: options.databaseUrl ? 'postgres' : 'pglite',
      pushed,
      // Rows the server hands out (one per record version; a duplicate would also change the checksum).
      distinctOnServer: Number(serverDigest.split(':')[0]),
      // Every device's, the server's, and the generated records' own: all must be equal.
      checksums: [...checksums, serverDigest, expected.digest()],
      pushRecordsPerSecond: pushed / pushSeconds,
      pushP95Ms: p95(pushMs),
      pullP95Ms: p95(pullMs),
      kills,
      partialBatches,
      retries,
      peakRssBytes: process.resourceUsage().maxRSS * 1024,
    };
  } finally {
    await server.stop();
    rmSync(dataDir, { recursive: true, force: true });
  }
}
