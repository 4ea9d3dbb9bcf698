import { describe, expect, it } from 'vitest';
import { importBackup, StoreError, type KinnoteStore } from '../../../src/lib/store';
import { fuzzImporters, IMPORTER_NAMES } from '../../fuzz/importers';

// A few hundred seeded cases per importer on every run; `npm run fuzz` runs 10,000 each.
describe('fuzzed importers: every case accepted or refused cleanly, never a crash or a partial write', () => {
  it('pendulum, motion, reliability, backup, programme hand-off, home report (200 cases each, seed 7)', async () => {
    const results = await fuzzImporters(200, 7);
    expect(Object.keys(results)).toEqual([...IMPORTER_NAMES]);
    for (const [name, c] of Object.entries(results)) {
      expect({ name, crashed: c.crashed, partialWrites: c.partialWrites, unsound: c.unsound, crashes: c.crashes }).toEqual({ name, crashed: 0, partialWrites: 0, unsound: 0, crashes: [] });
      expect(c.tried).toBe(200);
      // Both outcomes occur, so the generator reaches past the first check and still breaks files.
      expect(c.refused, `${name} refused`).toBeGreaterThan(0);
      expect(c.accepted, `${name} accepted`).toBeGreaterThan(0);
    }
  }, 600_000);
});

// The harness must be able to fail: broken importers, as a regression would make them, are caught.
describe('fuzz harness self-check: deliberately broken backup imports are caught', () => {
  it('a write outside the import transaction shows as partial writes', async () => {
    let n = 0;
    const writesFirst = async (store: KinnoteStore, input: unknown) => {
      await store.db.table('meta').put({ key: `fuzz-mutant-${n++}`, value: true });
      return importBackup(store, input);
    };
    const { backup } = await fuzzImporters(40, 7, { only: ['backup'], importBackup: writesFirst });
    expect(backup!.refused).toBeGreaterThan(0);
    expect(backup!.partialWrites).toBe(backup!.refused);
  }, 300_000);

  it('an import that skips its record checks shows as unsound acceptances', async () => {
    const noChecks = async (store: KinnoteStore, input: unknown) => {
      const tables = (input as { tables?: Record<string, unknown> } | null)?.tables;
      if (!tables || typeof tables !== 'object') throw new StoreError('ValidationFailed', 'not a backup bundle');
      // Every record of the bundle written as it comes, in one transaction (so never a partial write).
      await store.db.transaction('rw', store.db.tables, async () => {
        for (const table of store.db.tables) {
          const rows = tables[table.name];
          if (Array.isArray(rows)) await table.bulkPut(rows.filter((r): r is { id: string } => typeof (r as { id?: unknown } | null)?.id === 'string'));
        }
      });
    };
    const { backup } = await fuzzImporters(100, 7, { only: ['backup'], importBackup: noChecks });
    expect(backup!.unsound, JSON.stringify(backup)).toBeGreaterThan(0);
    expect(backup!.crashes.join('\n')).toMatch(/accepted, then: .*(stamped|no patient|no assessment)/);
  }, 300_000);
});
