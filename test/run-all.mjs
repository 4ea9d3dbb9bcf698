// `npm test`: every check in order, stopping at the first failure, with the time each stage took.
import { spawnSync } from 'node:child_process';

const stages = [
  ['lint', 'npm', ['run', '-s', 'lint']],
  ['unit and reference tests', 'npx', ['vitest', 'run', '--project', 'unit']],
  ['production build', 'npm', ['run', '-s', 'build']],
  ['browser tests (Chromium)', 'npx', ['vitest', 'run', '--project', 'e2e']],
];

const started = Date.now();
for (const [name, command, args] of stages) {
  const t0 = Date.now();
  console.log(`\n== npm test: ${name}`);
  const result = spawnSync(command, args, { stdio: 'inherit' });
  const seconds = ((Date.now() - t0) / 1000).toFixed(0);
  if (result.status !== 0) {
    console.error(`== npm test: FAILED in "${name}" after ${seconds} s (exit ${result.status ?? result.signal})`);
    process.exit(result.status ?? 1);
  }
  console.log(`== npm test: ${name}: ${seconds} s`);
}
console.log(`== npm test: all stages passed in ${((Date.now() - started) / 1000).toFixed(0)} s`);
