// Team server under load on 127.0.0.1: 50 simulated devices pushing and pulling 2,000 observations
// each at once, then the same with 10 SIGKILLs of the server during the pushes. PGlite always;
// PostgreSQL when TEAM_SERVER_TEST_DATABASE_URL is set (e.g. after `source .ci/throwaway-postgres.sh;
// start_throwaway_postgres`). Sizes: KINNOTE_BENCH_DEVICES / KINNOTE_BENCH_RECORDS / KINNOTE_BENCH_KILLS to
// shrink them. Each line also gives the run's wall time, to estimate the full size from a small one.
import { runLoad, type LoadResult } from '../server-load/load-run';

const devices = Number(process.env.KINNOTE_BENCH_DEVICES ?? 50);
const records = Number(process.env.KINNOTE_BENCH_RECORDS ?? 2000);
const kills = Number(process.env.KINNOTE_BENCH_KILLS ?? 10);

async function timed(options: Parameters<typeof runLoad>[0]): Promise<LoadResult & { seconds: number }> {
  const t0 = performance.now();
  const r = await runLoad(options);
  return { ...r, seconds: (performance.now() - t0) / 1000 };
}

function line(label: string, r: LoadResult & { seconds: number }): string {
  const same = new Set(r.checksums).size === 1;
  return [
    `${label} on ${r.store}: ${r.pushed} pushed, ${r.distinctOnServer} on the server`,
    `${Math.round(r.pushRecordsPerSecond)} records/s`,
    `p95 push ${r.pushP95Ms.toFixed(0)} ms, p95 pull ${r.pullP95Ms.toFixed(0)} ms`,
    `${r.kills} kills, ${r.partialBatches} partial batches, ${r.retries} retried requests`,
    `checksums ${same ? 'all equal' : 'DIFFER'} (${r.checksums.length} copies)`,
    `${r.seconds.toFixed(0)} s in all, bench process peak ${(r.peakRssBytes / 2 ** 20).toFixed(0)} MB`,
  ].join('; ');
}

export async function run(print: (line: string) => void): Promise<void> {
  // KINNOTE_BENCH_STORES=pglite or postgres runs one store only (the full size of both does not fit one 20-minute window on 2 cores).
  const only = process.env.KINNOTE_BENCH_STORES;
  const stores: (string | undefined)[] = only === 'postgres' ? [] : [undefined];
  if (process.env.TEAM_SERVER_TEST_DATABASE_URL && only !== 'pglite') stores.push(process.env.TEAM_SERVER_TEST_DATABASE_URL);
  for (const databaseUrl of stores) {
    // The run with kills first: it is the figure the issue asks for, and a full-size run may not reach the second.
    print(line(`${devices} devices × ${records} with SIGKILLs`, await timed({ devices, recordsPerDevice: records, batchSize: 200, kills, databaseUrl })));
    print(line(`${devices} devices × ${records}`, await timed({ devices, recordsPerDevice: records, batchSize: 200, kills: 0, databaseUrl })));
  }
}
