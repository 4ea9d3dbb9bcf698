// Streamed backup inside Chromium (real IndexedDB, Web Crypto, Blob storage), for the bench
// (`npm run bench -- backup-stream`). Bundled by test/e2e/bundle-for-page.ts.
import Dexie from 'dexie';
import { ordinalValue } from '../../../src/lib/domain';
import { exportBackupText, openStore, type KinnoteStore } from '../../../src/lib/store';
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
export async function streamedBackup(): Promise<{ seconds: number; bytes: number; records: number }> {
  const store = await open();
  const start = performance.now();
  const parts: Blob[] = [];
  let pending: string[] = [];
  let pendingLength = 0;
  const out = await streamBackup(store, {
    protectedContent: 'omit',
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

Object.assign(globalThis as object, { fillLargeCaseload, wholeBackup, streamedBackup });
