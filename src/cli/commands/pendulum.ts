import { readFile } from 'node:fs/promises';
import { basename, resolve } from 'node:path';
import { analysePendulumCsv, PendulumInputError, type PendulumIndices } from '../../lib/pendulum/index';
import { csvRow } from '../../lib/export/index';
import { optionDecimal, parseOptions, RefusedInput, type CliCommand } from '../command';

const usage = `kinnote pendulum FILE.csv [FILE.csv ...] [--csv] [--start-angle DEG] [--emg-k K]

Analyses knee pendulum recordings (CSV with a header: time_s or time_ms; angle_deg or angle_rad;
optional gyro_dps; optional emg_uv) and prints one JSON object per file: release, starting and
resting angles, first flexion peak, A0, A1, relaxation index R2 and R2/1.6, peak count, period,
peak flexion velocity, side areas, damped-cosine fit, EMG bursts, and warnings.

  --csv            one CSV row per file (RFC 4180); refused files appear as rows with the reason
  --start-angle    gyro-only files: the angle the leg was held at before release (default 0)
  --emg-k          EMG burst threshold: baseline median + k·robust SD (default 3)

One file: refused input exits with status 1 and one line on stderr. Several files: a JSON array
(or CSV), refused files reported in place, status 0 unless every file was refused.
Not a diagnostic device: the indices support, and never replace, a clinician's judgement.`;

/** Scalar columns of the CSV output, in order. */
const CSV_COLUMNS = [
  'releaseTimeS',
  'startAngleDeg',
  'restAngleDeg',
  'firstPeakDeg',
  'firstPeakTimeS',
  'a0Deg',
  'a1Deg',
  'relaxationIndex',
  'normalizedRelaxationIndex',
  'peakCount',
  'firstPeriodS',
  'peakFlexionVelocityDps',
  'flexionAreaDegS',
  'extensionAreaDegS',
  'dominantSide',
  'fitAmplitudeDeg',
  'fitTauS',
  'fitOmegaRadS',
  'fitR2',
  'fitConverged',
  'emgBurstCount',
  'sampleRateHz',
  'restOnsetS',
  'angleSource',
  'warnings',
] as const;

type Outcome = { file: string; indices: PendulumIndices } | { file: string; reason: string };

export const pendulumCommand: CliCommand = {
  name: 'pendulum',
  summary: 'analyse knee pendulum recordings (CSV) into relaxation index and swing indices',
  usage,
  async run(args, io) {
    const { positional, values, switches } = parseOptions(args, ['start-angle', 'emg-k'], ['csv']);
    if (positional.length === 0) throw new RefusedInput('no file given; usage: kinnote pendulum FILE.csv [--csv]');
    const startAngle = optionDecimal(values.get('start-angle'), 'start-angle', -30, 180);
    const emgK = optionDecimal(values.get('emg-k'), 'emg-k', 0, 100);
    const options = { ...(startAngle === undefined ? {} : { gyroStartAngleDeg: startAngle }), ...(emgK === undefined ? {} : { emgThresholdK: emgK }) };

    const outcomes: Outcome[] = [];
    for (const name of positional) {
      let text: string;
      try {
        text = await readFile(resolve(io.cwd, name), 'utf8');
      } catch (error) {
        const code = (error as NodeJS.ErrnoException).code;
        outcomes.push({ file: name, reason: `${name}: cannot read the file (${code ?? 'error'})` });
        continue;
      }
      try {
        outcomes.push({ file: name, indices: analysePendulumCsv(text, basename(name), options).indices });
      } catch (error) {
        if (error instanceof PendulumInputError) outcomes.push({ file: name, reason: error.message });
        else throw error;
      }
    }

    const single = positional.length === 1;
    if (single && 'reason' in outcomes[0]) throw new RefusedInput(outcomes[0].reason);
    if (switches.has('csv')) {
      io.stdout(toCsv(outcomes));
    } else if (single) {
      io.stdout(JSON.stringify(forJson((outcomes[0] as { indices: PendulumIndices }).indices), null, 2));
    } else {
      io.stdout(JSON.stringify(outcomes.map((o) => ('reason' in o ? { file: o.file, refused: o.reason } : { file: o.file, ...forJson(o.indices) })), null, 2));
    }
    const refused = outcomes.filter((o) => 'reason' in o);
    for (const o of refused) io.stderr(`kinnote pendulum: refused ${'reason' in o ? o.reason : ''}`);
    return refused.length === outcomes.length ? 1 : 0;
  },
};

/**
 * The indices as printed by `kinnote pendulum` and `kinnote motion`: numbers rounded to 4 decimals
 * (far below any measurement error), non-finite numbers as null.
 */
export function forJson(indices: PendulumIndices): PendulumIndices {
  return JSON.parse(JSON.stringify(indices, (_key, value: unknown) => (typeof value === 'number' ? roundForPrint(value) : value))) as PendulumIndices;
}

function roundForPrint(x: number): number | null {
  if (!Number.isFinite(x)) return null;
  return Math.round(x * 1e4) / 1e4;
}

function toCsv(outcomes: readonly Outcome[]): string {
  const rows: Array<Array<string | number | boolean | null>> = [['file', 'status', 'reason', ...CSV_COLUMNS]];
  for (const o of outcomes) {
    if ('reason' in o) {
      rows.push([o.file, 'refused', o.reason, ...CSV_COLUMNS.map(() => '')]);
      continue;
    }
    const x = o.indices;
    const cell = (column: (typeof CSV_COLUMNS)[number]): string | number | boolean | null => {
      switch (column) {
        case 'fitAmplitudeDeg':
          return numberCell(x.fit.amplitudeDeg);
        case 'fitTauS':
          return numberCell(x.fit.tauS);
        case 'fitOmegaRadS':
          return numberCell(x.fit.omegaRadS);
        case 'fitR2':
          return numberCell(x.fit.r2);
        case 'fitConverged':
          return x.fit.converged;
        case 'emgBurstCount':
          return x.emg ? String(x.emg.bursts.length) : '';
        case 'warnings':
          return x.warnings.join('; ');
        default: {
          const value = x[column];
          return typeof value === 'number' ? numberCell(value) : value === null ? null : String(value);
        }
      }
    };
    rows.push([o.file, 'ok', '', ...CSV_COLUMNS.map(cell)]);
  }
  // csvRow: RFC 4180 quoting and formula neutralising, shared with every other CSV Kinnote writes.
  return rows.map((r) => csvRow(r)).join('');
}

function numberCell(x: number | null): number | null {
  return x === null ? null : roundForPrint(x);
}
