// Regenerates the example recordings in test/fixtures/pendulum from the simulator:
//   npx tsx test/reference/pendulum/make-fixtures.ts
// Invented data (simulated legs), small files for manual runs of `kinnote pendulum` and CLI tests.
import { writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import {
  addNoise,
  mulberry32,
  reflexForSeverity,
  sampleTrace,
  simulatePendulum,
  toCsv,
  toGyroOnly,
  withEmg,
} from './simulator';

const out = join(dirname(fileURLToPath(import.meta.url)), '../../fixtures/pendulum');
const rng = mulberry32(20240604);

const healthy = sampleTrace(simulatePendulum({ startAngleDeg: 5, holdS: 1.3, durationS: 13, timeOffsetS: 12.5 }), 100);
writeFileSync(join(out, 'healthy-100hz.csv'), toCsv({ time_s: healthy.timeS, angle_deg: addNoise(healthy.angleDeg as Float64Array, 0.2, rng) }, 3));

const moderate = sampleTrace(simulatePendulum({ reflex: reflexForSeverity('extensor', 'moderate'), durationS: 8 }), 500);
const moderateEmg = withEmg(moderate, 8, 60, rng);
writeFileSync(
  join(out, 'extensor-moderate-emg-500hz.csv'),
  toCsv({ time_s: moderate.timeS, angle_deg: addNoise(moderate.angleDeg as Float64Array, 0.1, rng), emg_uv: moderateEmg.emgUv }, 2),
);

const severe = sampleTrace(simulatePendulum({ reflex: reflexForSeverity('extensor', 'severe'), startAngleDeg: 10, hangingAngleDeg: 80, durationS: 8 }), 100);
const ms = severe.timeS.map((t) => t * 1000);
const rad = (severe.angleDeg as Float64Array).map((a) => (a * Math.PI) / 180);
writeFileSync(join(out, 'extensor-severe-ms-rad.csv'), toCsv({ time_ms: ms, angle_rad: rad }, 5));

const flexor = sampleTrace(simulatePendulum({ reflex: reflexForSeverity('flexor', 'severe'), durationS: 9 }), 200);
const gyro = toGyroOnly(flexor, { biasDps: 1.5, biasDriftDpsPerS: 0.05, noiseDps: 1 }, rng);
writeFileSync(join(out, 'flexor-severe-gyro-only-200hz.csv'), toCsv({ time_s: gyro.timeS, gyro_dps: gyro.gyroDps }, 3));
