import { describe, expect, it } from 'vitest';
import { runLoad } from '../../server-load/load-run';
import { BACKENDS } from './team-fixture';

// Small versions of the bench's load and fault runs (the bench runs 50 devices × 2,000 observations
// and 10 kills); a real server process on 127.0.0.1, killed with SIGKILL in the middle of pushes.
describe.each(BACKENDS)('team server process on %s', (kind) => {
  const databaseUrl = kind === 'postgres' ? process.env.TEAM_SERVER_TEST_DATABASE_URL : undefined;

  // Each server start costs PGlite a WebAssembly compile (20–30 s on a loaded 2-core machine).
  const slow = 400_000;
  it('devices pushing and pulling at once end with the same records, none lost or duplicated', { timeout: slow }, async () => {
    const r = await runLoad({ devices: 6, recordsPerDevice: 120, batchSize: 40, kills: 0, databaseUrl });
    expect(r.distinctOnServer).toBe(r.pushed);
    expect(new Set(r.checksums).size).toBe(1);
  });

  it('SIGKILL in the middle of pushes: no partial batch, and every device converges after restarts', { timeout: slow }, async () => {
    // Each PGlite restart costs a WebAssembly compile: one kill there, three on PostgreSQL (ten in the bench).
    const kills = kind === 'pglite' ? 1 : 3;
    const r = await runLoad({ devices: 4, recordsPerDevice: 150, batchSize: 25, kills, databaseUrl });
    expect(r.kills).toBe(kills);
    expect(r.partialBatches).toBe(0);
    expect(r.distinctOnServer).toBe(r.pushed);
    expect(new Set(r.checksums).size).toBe(1);
  });
});
