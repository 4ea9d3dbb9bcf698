// `npm run fuzz [-- CASES [SEED]]`: every importer fuzzed (default 10,000 cases each, seed 20261203),
// one line of counts per importer; exits 1 when any case crashed, wrote part of a refused import, or
// (backup) was accepted and left the store unsound.
import { fuzzImporters } from './importers';

const cases = Number(process.argv[2] ?? 10_000);
const seed = Number(process.argv[3] ?? 20261203);
const started = Date.now();
const results = await fuzzImporters(cases, seed);
console.log(`importer     tried  refused-cleanly  accepted  crashed  partial-writes  unsound   (seed ${seed})`);
let bad = 0;
for (const [name, c] of Object.entries(results)) {
  console.log(`${name.padEnd(11)} ${String(c.tried).padStart(6)}  ${String(c.refused).padStart(15)}  ${String(c.accepted).padStart(8)}  ${String(c.crashed).padStart(7)}  ${String(c.partialWrites).padStart(14)}  ${String(c.unsound).padStart(7)}`);
  for (const crash of c.crashes) console.log(`  crash: ${crash}`);
  bad += c.crashed + c.partialWrites + c.unsound;
}
console.log(`${((Date.now() - started) / 1000).toFixed(0)} s`);
process.exitCode = bad === 0 ? 0 : 1;
