// `npm run bench`: runs every test/bench/*.bench.ts in turn and prints its figures.
// Figures are printed, never asserted: timings are not tests. Pass a name to run one file:
// `npm run bench -- pendulum`.
import { readdirSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { cpus } from 'node:os';

export interface BenchModule {
  /** Runs the benchmark and prints its figures through `print`. */
  run: (print: (line: string) => void) => Promise<void>;
}

const here = dirname(fileURLToPath(import.meta.url));
const only = process.argv.slice(2).filter((a) => !a.startsWith('-'));
const files = readdirSync(here)
  .filter((f) => f.endsWith('.bench.ts'))
  .filter((f) => only.length === 0 || only.some((o) => f.startsWith(o)))
  .sort();

console.log(`Kinnote benchmarks on Node ${process.version}, ${cpus()[0]?.model ?? 'unknown CPU'} (${cpus().length} cores)`);
for (const file of files) {
  const module = (await import(join(here, file))) as BenchModule;
  console.log(`\n## ${file.replace(/\.bench\.ts$/, '')}`);
  await module.run((line) => console.log(line));
}
