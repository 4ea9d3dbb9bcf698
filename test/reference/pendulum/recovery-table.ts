// Prints the recovery errors per condition (worst over the simulated legs): figures for reports.
//   npx tsx test/reference/pendulum/recovery-table.ts
import { CONDITIONS, LEGS, errors, recover } from './recovery-cases';

const keys = ['releaseMs', 'startDeg', 'restDeg', 'firstPeakDeg', 'firstPeakMs', 'r2', 'peakCount', 'periodMs', 'velocityPct', 'flexionAreaDegS', 'extensionAreaDegS'];
console.log(['condition', ...keys].join(' | '));
for (const condition of Object.keys(CONDITIONS)) {
  const worst: Record<string, number> = {};
  for (const leg of Object.keys(LEGS)) {
    try {
      const e = errors(recover(leg, condition));
      for (const k of keys) worst[k] = Math.max(worst[k] ?? 0, e[k]);
    } catch (error) {
      console.log(`${condition} / ${leg}: ${(error as Error).message}`);
    }
  }
  console.log([condition, ...keys.map((k) => (worst[k] ?? Number.NaN).toFixed(k === 'r2' ? 4 : 2))].join(' | '));
}
