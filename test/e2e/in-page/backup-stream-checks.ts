// Streamed backup inside Chromium (real IndexedDB, Web Crypto, Blob storage), for the bench
// (`npm run bench -- backup-stream`). Bundled by test/e2e/bundle-for-page.ts.
import { sha256 } from '@noble/hashes/sha2.js';
import { bytesToHex } from '@noble/hashes/utils.js';
import Dexie from 'dexie';
import { createSHA256 } from 'hash-wasm';
import { ordinalValue } from '../../../src/lib/domain';
import { TABLE_NAMES } from '../../../src/lib/domain';
import { canonicalJson, exportBackupText, openStore, tableRows, type KinnoteStore } from '../../../src/lib/store';
import { toPortable } from '../../../src/lib/store/backup-bundle';
import { streamBackup } from '../../../src/lib/store/backup-stream';

const NAME = 'kinnote-backup-stream-bench';

/**
 * An invented caseload in the proportions of the issue's large one (per patient: 6 assessments, 30
 * observations), written through the repositories' bulk writes (validated, stamped, audited).
 */
export async function fillLargeCaseload(patients: number): Promise<{ records: number; seconds: number }> {
  const start = performance.now();
  await Dexie.delete(NAME);
  const store = await openStore({ name: NAME, kdfIterations: 1000, idleTimeoutMs: null });
  await store.ensureActor({ deviceName: 'Chromium', platform: 'test', clinicianName: 'Bench Clinician', profession: 'physiotherapist' });
  await store.vault.setup('correct horse battery staple');
  const sites = ['elbow-flexors', 'knee-extensors', 'ankle-plantarflexors', 'wrist-flexors', 'hip-adductors'];
  for (let first = 0; first < patients; first += 500) {
    const made = await store.patients.createMany(
      Array.from({ length: Math.min(500, patients - first) }, (_, j) => ({ code: code(first + j), birthYear: 1940 + ((first + j) % 60), condition: 'stroke' as const, affectedSides: ['left' as const], status: 'active' as const })),
    );
    const assessments = await store.assessments.createMany(
      made.flatMap((p, j) =>
        Array.from({ length: 6 }, (_, k) => ({
          patientId: p.id,
          assessorId: store.actor!.clinicianId,
          performedAt: new Date(Date.UTC(2025, 0, 1 + k * 37 + ((first + j) % 30), 9 + (j % 8))).toISOString(),
          setting: k % 2 === 0 ? ('home' as const) : ('clinic' as const),
          conditions: { position: null, minutesSinceMedication: null, painNrs: (j + k) % 11 },
          notes: null,
        })),
      ),
    );
    await store.observations.createMany(
      assessments.flatMap((a, j) =>
        sites.map((siteCode, s) => ({
          patientId: a.patientId,
          assessmentId: a.id,
          takenAt: a.performedAt,
          measureCode: 'mas',
          siteCode,
          side: s % 2 === 0 ? ('left' as const) : ('right' as const),
          mode: null,
          instrument: null,
          value: ordinalValue('mas', ['0', '1', '1+', '2', '3'][(j * 7 + s) % 5] as string),
          traceId: null,
        })),
      ),
    );
  }
  let records = 0;
  for (const table of store.db.tables) records += await table.count();
  store.close();
  return { records, seconds: (performance.now() - start) / 1000 };
}

function code(i: number): string {
  const alphabet = '23456789ABCDEFGHJKMNPQRSTVWXYZ';
  let s = '';
  for (let k = 0, n = i + 30 ** 7; k < 8; k++, n = Math.floor(n / 30)) s = alphabet[n % 30] + s;
  return `${s.slice(0, 4)}-${s.slice(4)}`;
}

async function open(): Promise<KinnoteStore> {
  return openStore({ name: NAME, kdfIterations: 1000, idleTimeoutMs: null });
}

/** The present path: the whole bundle built in memory, then one string, kept as a Blob. */
export async function wholeBackup(): Promise<{ seconds: number; bytes: number }> {
  const store = await open();
  const start = performance.now();
  const text = await exportBackupText(store, { protectedContent: 'omit' });
  const blob = new Blob([text], { type: 'application/json' });
  const seconds = (performance.now() - start) / 1000;
  store.close();
  return { seconds, bytes: blob.size };
}

/** The streamed path: pieces hashed as they go and kept as Blob parts (Chromium keeps large blobs on disk). */
export async function streamedBackup(pageSize?: number): Promise<{ seconds: number; bytes: number; records: number }> {
  const store = await open();
  const start = performance.now();
  const parts: Blob[] = [];
  let pending: string[] = [];
  let pendingLength = 0;
  const out = await streamBackup(store, {
    protectedContent: 'omit',
    pageSize,
    write: (piece) => {
      pending.push(piece);
      pendingLength += piece.length;
      if (pendingLength > 4_000_000) {
        parts.push(new Blob(pending));
        pending = [];
        pendingLength = 0;
      }
    },
  });
  const blob = new Blob([out.head, ...parts, ...pending, out.tail], { type: 'application/json' });
  const seconds = (performance.now() - start) / 1000;
  store.close();
  return { seconds, bytes: blob.size, records: out.records };
}

/**
 * Where the streamed backup's time goes: the same steps as streamBackup's loop (pages of 2,000 by id,
 * redact, bundle form, one canonical serialisation per page, encode and hash), each timed alone (s).
 */
export async function streamedBackupParts(): Promise<Record<string, number>> {
  const store = await open();
  const parts = { read: 0, redact: 0, serialise: 0, hashNoble: 0, bytes: 0 };
  const perTable: Record<string, number> = {};
  const encoder = new TextEncoder();
  const noble = sha256.create();
  let t = performance.now();
  const lap = (key: keyof typeof parts) => {
    const now = performance.now();
    parts[key] += (now - t) / 1000;
    t = now;
  };
  for (const table of [...TABLE_NAMES].sort()) {
    let after: string | null = null;
    for (;;) {
      t = performance.now();
      const rows = (await store.db.transaction('r', table, () => tableRows(store.db, table).page(after, 2000))) as { id: string }[];
      const readNow = performance.now();
      perTable[table] = (perTable[table] ?? 0) + (readNow - t) / 1000;
      lap('read');
      if (rows.length === 0) break;
      after = rows[rows.length - 1]!.id;
      const codec = store.context.codecs[table];
      const records = rows.map((row) => codec.redact(row as never)).filter((r) => r !== null).map((r) => toPortable(table, r as object));
      lap('redact');
      const text = canonicalJson(records);
      lap('serialise');
      const bytes = encoder.encode(text);
      noble.update(bytes);
      lap('hashNoble');
      parts.bytes += bytes.length;
    }
  }
  // The same observation blocks read three ways: Dexie in one toArray, raw IndexedDB getAll, and 4 pages in flight at once.
  t = performance.now();
  await store.db.table('observations').toArray();
  const dexieAll = (performance.now() - t) / 1000;
  const idb = store.db.backendDB();
  t = performance.now();
  await new Promise((resolve, reject) => {
    const request = idb.transaction('observations', 'readonly').objectStore('observations').getAll();
    request.onsuccess = resolve;
    request.onerror = reject;
  });
  const rawAll = (performance.now() - t) / 1000;
  store.close();
  return { ...parts, dexieAll, rawAll, ...Object.fromEntries(Object.entries(perTable).map(([k, v]) => [`read:${k}`, v])) };
}

/**
 * SHA-256 speeds on the same backup-like text in pieces of ~0.5 MB (the streamed backup's page size),
 * in MB/s: @noble/hashes (pure JavaScript), hash-wasm (WebAssembly), and Web Crypto's one-shot digest
 * (native, not incremental: the reference ceiling). Every digest must agree, else the figures are refused.
 */
export async function hashSpeeds(megabytes: number): Promise<Record<string, number>> {
  const piece = JSON.stringify(Array.from({ length: 1000 }, (_, i) => ({ id: `0193a5c2-${i}`, measureCode: 'mas', siteCode: 'knee-extensors', value: (i * 7919) % 97, takenAt: '2025-06-01T09:00:00.000Z' })));
  const pieces = Array.from({ length: Math.ceil((megabytes * 1e6) / piece.length) }, () => piece);
  const mb = (pieces.length * piece.length) / 1e6;
  const encoder = new TextEncoder();
  const out: Record<string, number> = {};
  const digests = new Set<string>();
  const time = async (name: string, run: () => Promise<string> | string) => {
    const start = performance.now();
    digests.add(await run());
    out[name] = mb / ((performance.now() - start) / 1000);
  };
  for (let round = 0; round < 3; round++) {
    await time(`noble#${round}`, () => {
      const h = sha256.create();
      for (const p of pieces) h.update(encoder.encode(p));
      return bytesToHex(h.digest());
    });
    await time(`wasm-string#${round}`, async () => {
      const h = await createSHA256();
      for (const p of pieces) h.update(p);
      return h.digest('hex');
    });
    await time(`wasm-bytes#${round}`, async () => {
      const h = await createSHA256();
      for (const p of pieces) h.update(encoder.encode(p));
      return h.digest('hex');
    });
    await time(`webcrypto-one-shot#${round}`, async () => {
      const bytes = await new Blob(pieces).arrayBuffer();
      return bytesToHex(new Uint8Array(await crypto.subtle.digest('SHA-256', bytes)));
    });
  }
  if (digests.size !== 1) throw new Error(`hash speeds: the digests disagree (${[...digests].join(', ')})`);
  return out;
}

Object.assign(globalThis as object, { fillLargeCaseload, wholeBackup, streamedBackup, hashSpeeds, streamedBackupParts });
