import { createHash } from 'node:crypto';
import type { DBCore, DBCoreMutateRequest, Middleware } from 'dexie';
import { beforeAll, describe, expect, it } from 'vitest';
import { canonicalJson, importBackup, serializeBundle, type StoreError } from '../../../src/lib/store';
import type { BackupBundle } from '../../../src/lib/store/backup-bundle';
import { sha256Hex, sha256HexOfBraceAndSlice } from '../../../src/lib/store/crypto-box';
import { exportBackup } from '../../../src/lib/store/export-backup';
import { readLocalRows } from '../../../src/lib/store/import-read-local';
import { planMerge } from '../../../src/lib/store/import-plan';
import { importAudits, writeMerge } from '../../../src/lib/store/import-write';
import { planPhotoImport } from '../../../src/lib/store/import-photos';
import { readBackup } from '../../../src/lib/store/import-backup';
import { tableRows } from '../../../src/lib/store/table-rows';
import { dumpAll, freshStore, seedPatient } from './store-helpers';

// The issue's size: a bad record at row 99,999 of 100,000 observations must leave the store as it was.
const TOTAL = 100_000;

async function resign(bundle: BackupBundle): Promise<BackupBundle> {
  const { checksum: _c, ...body } = bundle;
  return { ...body, checksum: { algorithm: 'SHA-256', value: await sha256Hex(canonicalJson(body)) } };
}

/** TOTAL observations in id order: the seeded one (its audit entry refers to it) and copies of it with new UUIDv7 ids, grades cycling. */
async function largeBundle(): Promise<BackupBundle> {
  const source = await freshStore();
  await seedPatient(source);
  const bundle = await exportBackup(source, { protectedContent: 'omit' });
  source.close();
  const seed = bundle.tables.observations[0]!;
  const grades = [['0', 0], ['1', 1], ['1+', 2], ['2', 3], ['3', 4], ['4', 5]] as const;
  const copies = Array.from({ length: TOTAL - 1 }, (_, i) => {
    const [grade, rank] = grades[i % grades.length]!;
    return { ...seed, id: `01950000-0000-7000-8000-${i.toString(16).padStart(12, '0')}`, side: i % 2 ? 'left' : 'right', value: { kind: 'ordinal', grade, rank } };
  });
  const observations = [...copies, seed].sort((a, b) => ((a.id as string) < (b.id as string) ? -1 : 1));
  return resign({ ...bundle, tables: { ...bundle.tables, observations } });
}

/** Fails, as a full disk does, the write of the observation block that holds `id`. */
function quotaAtBlockOf(id: string): Middleware<DBCore> & { hit: boolean } {
  const fault = {
    stack: 'dbcore' as const,
    name: 'quota-at-block',
    hit: false,
    create(down: DBCore): DBCore {
      return {
        ...down,
        table(name: string) {
          const table = down.table(name);
          if (name !== 'observations') return table;
          return {
            ...table,
            mutate(req: DBCoreMutateRequest) {
              const values = 'values' in req ? (req.values as { items?: { id: string }[] }[]) : [];
              if (values.some((block) => block.items?.some((o) => o.id === id))) {
                fault.hit = true;
                return Promise.reject(new DOMException('The quota has been exceeded.', 'QuotaExceededError'));
              }
              return table.mutate(req);
            },
          };
        },
      };
    },
  };
  return fault;
}

describe('importing a large backup', () => {
  let bundle: BackupBundle;
  beforeAll(async () => {
    bundle = await largeBundle();
  }, 300_000);

  it('a bad record at row 99,999 leaves the store unchanged; the error names the row and field', async () => {
    const last = bundle.tables.observations[TOTAL - 1]!;
    const broken = await resign({
      ...bundle,
      tables: { ...bundle.tables, observations: [...bundle.tables.observations.slice(0, -1), { ...last, siteCode: 'elbow-flexor' }] },
    });
    const target = await freshStore();
    const before = await dumpAll(target);
    const error = (await importBackup(target, serializeBundle(broken)).catch((e: unknown) => e)) as StoreError;
    expect(error.code).toBe('InvalidBundle');
    expect(error.issues).toHaveLength(1);
    expect(error.issues[0]).toMatchObject({ record: `tables.observations[99999] (${last.id as string})`, path: 'siteCode' });
    expect(error.message).toContain(`tables.observations[99999] (${last.id as string}) siteCode`);
    expect(await dumpAll(target)).toEqual(before);
    target.close();
  }, 300_000);

  it('a full disk at the last block leaves the store unchanged; the whole file imports otherwise', async () => {
    const text = serializeBundle(bundle);
    const fault = quotaAtBlockOf(bundle.tables.observations[TOTAL - 1]!.id as string);
    const target = await freshStore({ middleware: [fault] });
    const before = await dumpAll(target);
    const error = (await importBackup(target, text).catch((e: unknown) => e)) as StoreError;
    expect(fault.hit).toBe(true);
    expect(error.code).toBe('QuotaExceeded');
    expect(await dumpAll(target)).toEqual(before);
    target.close();

    const clean = await freshStore();
    const report = await importBackup(clean, text);
    expect(report.counts.observations.inserted).toBe(TOTAL);
    const stored = await tableRows(clean.db, 'observations').all();
    expect(stored.map((o) => o.id)).toEqual(bundle.tables.observations.map((o) => o.id));
    clean.close();
  }, 300_000);
});

describe('the import write step', () => {
  it('a record added between the read and the write steps refuses the whole import (VersionConflict)', async () => {
    const source = await freshStore();
    await seedPatient(source);
    const exported = await exportBackup(source, { protectedContent: 'omit' });
    source.close();
    const target = await freshStore();
    const bundle = await readBackup(exported, { now: target.context.now });
    const local = await readLocalRows(target, bundle.tables);
    const importedBy = { deviceId: target.actor!.deviceId, importedAt: '2025-03-01T12:00:00.000Z' };
    const plan = await planMerge(target, bundle, local, importedBy, undefined);
    const photos = await planPhotoImport(target, bundle, { written: new Set(), keptLocal: new Set() }, 'merge');
    // Meanwhile (another tab, a team pull) the same observation arrives.
    await target.db.transaction('rw', ['observations'], () => tableRows(target.db, 'observations').add([bundle.tables.observations[0]!]));
    const before = await dumpAll(target);
    const error = (await writeMerge(target, plan, importAudits(target, bundle, plan, importedBy.importedAt, plan.counts), photos).catch((e: unknown) => e)) as StoreError;
    expect(error.code).toBe('VersionConflict');
    expect(error.message).toMatch(/changed during the import; nothing was imported/);
    expect(await dumpAll(target)).toEqual(before);
    target.close();
  });
});

describe('the checksum of a file as written', () => {
  it('equals node:crypto SHA-256 over "{" and the slice, for ASCII and non-ASCII bodies', async () => {
    // Oracle: node:crypto's SHA-256 of the UTF-8 text, outside the project's code.
    const cases = [
      { head: '{"checksum":"x",', body: '"a":1}', tail: '\n' },
      { head: '{"k":0,', body: '"note":"Ñandú café 🙂 ĳ — 東京"}', tail: ' \r\n\t' },
      { head: '{"k":0,', body: `"big":"${'é'.repeat(70_000)}${'a'.repeat(70_001)}"}`, tail: '' },
    ];
    for (const { head, body, tail } of cases) {
      const text = head + body + tail;
      const expected = createHash('sha256').update(`{${body}`, 'utf8').digest('hex');
      expect(await sha256HexOfBraceAndSlice(text, head.length, head.length + body.length)).toBe(expected);
    }
  });
});
