import { describe, expect, it } from 'vitest';
import { fuzzImporters } from '../../fuzz/importers';

// A few hundred seeded cases per importer on every run; `npm run fuzz` runs 10,000 each.
describe('fuzzed importers: every case accepted or refused cleanly, never a crash or a partial write', () => {
  it('pendulum, motion, reliability, backup, programme hand-off, home report (200 cases each, seed 7)', async () => {
    const results = await fuzzImporters(200, 7);
    expect(Object.keys(results)).toEqual(['pendulum', 'motion', 'reliability', 'backup', 'programme', 'report']);
    for (const [name, c] of Object.entries(results)) {
      expect({ name, crashed: c.crashed, partialWrites: c.partialWrites, crashes: c.crashes }).toEqual({ name, crashed: 0, partialWrites: 0, crashes: [] });
      expect(c.tried).toBe(200);
      // Both outcomes occur, so the generator reaches past the first check and still breaks files.
      expect(c.refused, `${name} refused`).toBeGreaterThan(0);
      expect(c.accepted, `${name} accepted`).toBeGreaterThan(0);
    }
  }, 600_000);
});
