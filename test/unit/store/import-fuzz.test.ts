import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { canonicalJson, importBackup, serializeBundle, StoreError } from '../../../src/lib/store';
import { exportBackup } from '../../../src/lib/store/export-backup';
import { sha256Hex } from '../../../src/lib/store/crypto-box';
import { type BackupBundle } from '../../../src/lib/store/backup-bundle';
import { dumpAll, freshStore, seedPatient } from './store-helpers';

/**
 * Fuzzes the import: random edits to a valid bundle, as text (cuts, flipped characters) and as
 * data (values replaced by arbitrary JSON, then re-signed so that the record checks are reached).
 * Invariant: the import either succeeds or throws a StoreError, and a failed import leaves the
 * store exactly as it was.
 */
describe('bundle import fuzzing', async () => {
  const source = await freshStore();
  await seedPatient(source);
  await seedPatient(source, 'BBBB-3333');
  const bundle = await exportBackup(source, { protectedContent: 'include' });
  const text = serializeBundle(bundle);
  source.close();

  async function check(input: unknown) {
    const target = await freshStore();
    const before = await dumpAll(target);
    try {
      await importBackup(target, input);
    } catch (error) {
      expect(error).toBeInstanceOf(StoreError);
      expect(await dumpAll(target)).toEqual(before);
    } finally {
      target.close();
    }
  }

  it('text edits: truncation and character changes', async () => {
    await fc.assert(
      fc.asyncProperty(fc.nat({ max: text.length - 1 }), fc.oneof(fc.constant(''), fc.string({ minLength: 1, maxLength: 1 }), fc.constantFrom('"', '}', ']', ',', '0', 'e')), fc.boolean(), async (at, ch, cut) => {
        await check(cut ? text.slice(0, at) : text.slice(0, at) + ch + text.slice(at + 1));
      }),
      { numRuns: 20 },
    );
  });

  it('data edits behind a valid checksum', async () => {
    const paths: [string, number, string][] = [];
    for (const [table, records] of Object.entries(bundle.tables)) {
      records.forEach((r, i) => Object.keys(r).forEach((k) => paths.push([table, i, k])));
    }
    await fc.assert(
      fc.asyncProperty(fc.constantFrom(...paths), fc.jsonValue({ maxDepth: 2 }), async ([table, index, key], value) => {
        const tables = JSON.parse(JSON.stringify(bundle.tables)) as Record<string, Record<string, unknown>[]>;
        tables[table]![index]![key] = value;
        const { checksum: _checksum, ...rest } = bundle;
        const body = { ...rest, tables } as unknown as Omit<BackupBundle, 'checksum'>;
        const resigned = { ...body, checksum: { algorithm: 'SHA-256', value: await sha256Hex(canonicalJson(body)) } };
        await check(resigned);
      }),
      { numRuns: 20 },
    );
  });

  it('arbitrary JSON', async () => {
    await fc.assert(fc.asyncProperty(fc.jsonValue({ maxDepth: 3 }), async (value) => check(value)), { numRuns: 15 });
  });
});
