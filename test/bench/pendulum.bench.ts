// Pendulum engine: median time to analyse a 20 s trace at 1 kHz and at 100 Hz (fit included), and a
// batch of 200 CSV files (parse + analyse). Figures are printed, never asserted.
import { performance } from 'node:perf_hooks';
import { analysePendulumCsv, analysePendulumTrace } from '../../src/lib/pendulum/index';
import { addNoise, mulberry32, reflexForSeverity, sampleTrace, simulatePendulum, toCsv } from '../reference/pendulum/simulator';
import { formatMs, medianOfSorted, timeRuns } from './timing';

export async function run(print: (line: string) => void): Promise<void> {
  const rng = mulberry32(99);
  const sim = simulatePendulum({ durationS: 20, holdS: 1.5 });
  for (const rateHz of [1000, 100]) {
    const s = sampleTrace(sim, rateHz);
    const angle = addNoise(s.angleDeg as Float64Array, 0.3, rng);
    const sorted = timeRuns(() => void analysePendulumTrace({ timeS: s.timeS, angleDeg: angle }), rateHz === 1000 ? 60 : 200);
    print(`analyse 20 s trace at ${rateHz} Hz (${s.timeS.length} samples, fit included): median ${formatMs(medianOfSorted(sorted))}, p90 ${formatMs(sorted[Math.floor(0.9 * sorted.length)])}`);
  }

  // 200 files of 12 s at 200 Hz, four kinds of leg, as CSV text (the parse is part of the cost).
  const kinds = [{}, { reflex: reflexForSeverity('extensor', 'moderate') }, { reflex: reflexForSeverity('extensor', 'severe') }, { reflex: reflexForSeverity('flexor', 'moderate') }];
  const files = kinds.map((k) => {
    const s = sampleTrace(simulatePendulum({ durationS: 12, ...k }), 200);
    return toCsv({ time_s: s.timeS, angle_deg: addNoise(s.angleDeg as Float64Array, 0.2, rng) }, 3);
  });
  const batches = new Float64Array(5);
  for (let b = 0; b < batches.length; b++) {
    const start = performance.now();
    for (let i = 0; i < 200; i++) analysePendulumCsv(files[i % files.length], `leg-${i}.csv`);
    batches[b] = performance.now() - start;
  }
  batches.sort();
  print(`batch of 200 CSV files (12 s at 200 Hz each, ${(files[0].length / 1024).toFixed(0)} KiB): median ${formatMs(medianOfSorted(batches))} (${formatMs(medianOfSorted(batches) / 200)} per file)`);
}
