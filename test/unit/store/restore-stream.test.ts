// Pass 1 of the streamed restore (verifyBackupStream) against outside oracles: node:crypto's SHA-256 for
// the body hashed in pieces cut at random places (surrogate pairs included), JSON.parse of the whole file
// for the records' ids, and the whole-file import (importBackup) for which files are refused and why.
import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { TABLE_NAMES } from '../../../src/lib/domain';
import { canonicalJson, exportBackupText, importBackup, StoreError } from '../../../src/lib/store';
import { verifyBackupStream } from '../../../src/lib/store/restore-stream';
import { freshStore, seedPatient, steppingClock } from './store-helpers';

const NOW = Date.UTC(2025, 5, 1, 12);

async function backupText(patients: number) {
  const step = steppingClock();
  let frozen: number | null = null;
  const store = await freshStore({ now: () => frozen ?? step() });
  for (let i = 0; i < patients; i++) {
    const { patient } = await seedPatient(store, `K7Q${String.fromCharCode(65 + i)}-3XHD`);
    // Names outside the Basic Multilingual Plane (surrogate pairs in JavaScript) and accents.
    await store.identities.create({ patientId: patient.id, familyName: `Ŝtrela😀${i}`, givenName: 'Ré𝄞', dateOfBirth: null, contact: null });
  }
  frozen = NOW;
  const text = await exportBackupText(store, { protectedContent: 'include' });
  store.close();
  return text;
}

/** A seeded generator (mulberry32), so a failure names a reproducible split. */
function random(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** The text cut at random places (pieces of 1 to `max` characters: surrogate pairs get split too). */
async function* pieces(text: string, seed: number, max: number) {
  const next = random(seed);
  for (let i = 0; i < text.length; ) {
    const n = 1 + Math.floor(next() * max);
    yield text.slice(i, i + n);
    i += n;
  }
}

/** A file with the body changed and a correct checksum (node:crypto), as a careless tool would write it. */
type Body = { tables: Record<string, Record<string, unknown>[]> };
function rewritten(text: string, change: (bundle: Body) => void): string {
  const { checksum: _old, ...body } = JSON.parse(text) as Body & { checksum: unknown };
  change(body);
  const value = createHash('sha256').update(canonicalJson(body)).digest('hex');
  return `${canonicalJson({ ...body, checksum: { algorithm: 'SHA-256', value } })}\n`;
}

async function refusal(run: Promise<unknown>): Promise<StoreError> {
  const error = await run.then(
    () => null,
    (e: unknown) => e,
  );
  expect(error).toBeInstanceOf(StoreError);
  return error as StoreError;
}

describe('streamed restore, pass 1: checking a backup read in pieces', () => {
  it('hashes the body like node:crypto and finds every record, whatever the cuts', async () => {
    const text = await backupText(4);
    const whole = JSON.parse(text) as { checksum: { value: string }; tables: Record<string, { id: string }[]> };
    const body = `{${text.slice(text.indexOf('},') + 2).trimEnd()}`;
    const oracle = createHash('sha256').update(body, 'utf8').digest('hex');
    expect(oracle).toBe(whole.checksum.value);
    for (const [seed, max] of [[1, 1], [2, 3], [3, 17], [4, 257], [5, 100_000]] as const) {
      const checked = await verifyBackupStream(pieces(text, seed, max), { now: () => NOW });
      expect(checked.checksum, `seed ${seed}`).toBe(oracle);
      for (const table of TABLE_NAMES) expect(checked.ids.get(table), `${table}, seed ${seed}`).toEqual(whole.tables[table]!.map((r) => r.id));
      expect(checked.records).toBe(TABLE_NAMES.reduce((n, t) => n + whole.tables[t]!.length, 0));
    }
  });

  it('refuses a record the whole-file import refuses, naming the same table, row and field', async () => {
    const text = rewritten(await backupText(2), (b) => {
      b.tables.observations![1]!.measureCode = 'no-such-measure';
    });
    const streamed = await refusal(verifyBackupStream(pieces(text, 7, 50), { now: () => NOW }));
    const fresh = await freshStore();
    const whole = await refusal(importBackup(fresh, text));
    fresh.close();
    expect(streamed.code).toBe('InvalidBundle');
    expect(streamed.issues).toEqual(whole.issues);
    expect(streamed.message).toMatch(/tables\.observations\[1\]/);
  });

  it('refuses a duplicate id and a reference to a patient that is nowhere', async () => {
    const dup = rewritten(await backupText(2), (b) => {
      b.tables.patients![1]!.id = b.tables.patients![0]!.id;
    });
    const error = await refusal(verifyBackupStream(pieces(dup, 8, 999), { now: () => NOW }));
    expect(error.message).toMatch(/appears twice in this table/);
    const orphan = rewritten(await backupText(2), (b) => {
      b.tables.observations![0]!.patientId = '01900000-0000-7000-8000-000000000000';
    });
    const missing = await refusal(verifyBackupStream(pieces(orphan, 9, 999), { now: () => NOW }));
    expect(missing.message).toMatch(/refers to patients 01900000-0000-7000-8000-000000000000, which is neither in this backup nor on this device/);
    // The same reference is accepted when the store restored into holds that patient.
    const ok = await verifyBackupStream(pieces(orphan, 9, 999), { now: () => NOW, outside: async (_t, ids) => new Set(ids) });
    expect(ok.ids.get('observations')).toHaveLength(2);
  });

  it('refuses a changed character (TamperedBundle), a cut-short file and text after the end', async () => {
    const text = await backupText(2);
    const at = text.indexOf('Ŝtrela');
    const tampered = `${text.slice(0, at)}S${text.slice(at + 1)}`;
    expect((await refusal(verifyBackupStream(pieces(tampered, 10, 64), { now: () => NOW }))).code).toBe('TamperedBundle');
    const short = text.slice(0, Math.floor(text.length * 0.7));
    expect((await refusal(verifyBackupStream(pieces(short, 11, 64), { now: () => NOW }))).message).toMatch(/not complete/);
    expect((await refusal(verifyBackupStream(pieces(`${text}{}`, 12, 64), { now: () => NOW }))).message).toMatch(/after its end/);
    // A re-indented file is still a backup (the whole-file import reads it), but not in the form read in pieces.
    const indented = JSON.stringify(JSON.parse(text), null, 2);
    expect((await refusal(verifyBackupStream(pieces(indented, 13, 64), { now: () => NOW }))).message).toMatch(/does not start the way/);
    expect((await refusal(verifyBackupStream(pieces('{"format":"kinnote-backup"}', 13, 64), { now: () => NOW }))).message).toMatch(/ends before its checksum/);
  });

  it('stops with Aborted when cancelled', async () => {
    const text = await backupText(2);
    const cancel = new AbortController();
    let seen = 0;
    const run = verifyBackupStream(pieces(text, 14, 100), {
      now: () => NOW,
      signal: cancel.signal,
      onProgress: (p) => {
        seen = p.read;
        if (p.read > 500) cancel.abort();
      },
    });
    expect((await refusal(run)).code).toBe('Aborted');
    expect(seen).toBeLessThan(text.length);
  });
});
