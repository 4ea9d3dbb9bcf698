import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { runCli } from '../../../src/cli/main';

const cwd = new URL('../../fixtures/pendulum/', import.meta.url).pathname;

async function run(argv: string[]): Promise<{ status: number; stdout: string; stderr: string }> {
  let stdout = '';
  let stderr = '';
  const status = await runCli(argv, {
    stdout: (t) => (stdout += t),
    stderr: (t) => (stderr += `${t}\n`),
    env: {},
    cwd,
  });
  return { status, stdout, stderr };
}

const REQUIRED_KEYS = [
  'releaseTimeS', 'startAngleDeg', 'restAngleDeg', 'firstPeakDeg', 'firstPeakTimeS', 'a0Deg', 'a1Deg', 'relaxationIndex',
  'normalizedRelaxationIndex', 'peakCount', 'firstPeriodS', 'peakFlexionVelocityDps', 'flexionAreaDegS', 'extensionAreaDegS',
  'dominantSide', 'fit', 'emg', 'sampleRateHz', 'warnings',
];

describe('kinnote pendulum', () => {
  it('prints one JSON object with the agreed keys', async () => {
    const { status, stdout, stderr } = await run(['pendulum', 'healthy-100hz.csv']);
    expect(stderr).toBe('');
    expect(status).toBe(0);
    const x = JSON.parse(stdout) as Record<string, unknown>;
    for (const key of REQUIRED_KEYS) expect(x).toHaveProperty(key);
    expect(Object.keys(x.fit as object).sort()).toEqual(['amplitudeDeg', 'converged', 'omegaRadS', 'phaseRad', 'r2', 'restDeg', 'tauS']);
    expect(x.emg).toBeNull();
    expect(x.sampleRateHz).toBe(100);
    // The fixture's simulated leg was released 1.3 s after the file's first time stamp, 12.5 s.
    expect(Math.abs((x.releaseTimeS as number) - 13.8)).toBeLessThan(0.02);
    expect(x.dominantSide).toMatch(/^(flexion|extension|balanced)$/);
  });

  it('reports EMG when the file has it', async () => {
    const x = JSON.parse((await run(['pendulum', 'extensor-moderate-emg-500hz.csv'])).stdout) as { emg: { bursts: { phase: string }[] } };
    expect(x.emg.bursts[0].phase).toBe('flexion 1');
  });

  it('reads time_ms + angle_rad and gyro-only files', async () => {
    const a = JSON.parse((await run(['pendulum', 'extensor-severe-ms-rad.csv'])).stdout) as Record<string, number>;
    expect(a.startAngleDeg).toBeCloseTo(10, 0);
    const g = await run(['pendulum', 'flexor-severe-gyro-only-200hz.csv', '--start-angle', '0']);
    const x = JSON.parse(g.stdout) as { angleSource: string; warnings: string[] };
    expect(x.angleSource).toBe('gyro');
    expect(x.warnings.join(' ')).toMatch(/reconstructed from gyro_dps/);
  });

  const refusals: [string, RegExp][] = [
    ['bad-no-rows.csv', /bad-no-rows\.csv: no data rows/],
    ['bad-unknown-column.csv', /bad-unknown-column\.csv: row 1: unknown column "torque_nm"/],
    ['bad-missing-angle.csv', /bad-missing-angle\.csv: row 1: missing angle column/],
    ['bad-non-numeric.csv', /bad-non-numeric\.csv: row 4: non-numeric value "abc"/],
    ['bad-non-finite.csv', /bad-non-finite\.csv: row 4: non-finite value/],
    ['bad-time-not-increasing.csv', /bad-time-not-increasing\.csv: row 4: time not strictly increasing/],
    ['bad-angle-range.csv', /bad-angle-range\.csv: row 4: angle 185 degrees outside -30\.\.180/],
    ['bad-never-falls.csv', /bad-never-falls\.csv: no release found/],
    ['bad-ends-before-rest.csv', /bad-ends-before-rest\.csv: row 351: the recording ends before the leg has come to rest/],
    ['bad-rate-under-20hz.csv', /bad-rate-under-20hz\.csv: sampling rate 10 Hz is under 20 Hz/],
    ['no-such-file.csv', /no-such-file\.csv: cannot read the file \(ENOENT\)/],
  ];
  it.each(refusals)('refuses %s: status 1, one line on stderr, nothing on stdout', async (file, reason) => {
    const { status, stdout, stderr } = await run(['pendulum', file]);
    expect(status).toBe(1);
    expect(stdout).toBe('');
    expect(stderr.trimEnd().split('\n')).toHaveLength(1);
    expect(stderr).toMatch(reason);
  });

  it('writes one RFC 4180 CSV row per file with --csv, refused files included with their reason', async () => {
    const { status, stdout } = await run(['pendulum', '--csv', 'healthy-100hz.csv', 'bad-non-numeric.csv', 'extensor-severe-ms-rad.csv']);
    expect(status).toBe(0);
    const parsed = Papa.parse<Record<string, string>>(stdout.trim(), { header: true });
    expect(parsed.errors).toEqual([]);
    expect(parsed.data.map((r) => r.status)).toEqual(['ok', 'refused', 'ok']);
    expect(parsed.data[1].reason).toMatch(/row 4: non-numeric value "abc"/);
    expect(Number(parsed.data[0].relaxationIndex)).toBeGreaterThan(1.4);
    expect(stdout).toContain('\r\n');
  });

  it('prints a JSON array for several files without --csv', async () => {
    const { stdout } = await run(['pendulum', 'healthy-100hz.csv', 'bad-no-rows.csv']);
    const list = JSON.parse(stdout) as { file: string; refused?: string }[];
    expect(list.map((x) => x.file)).toEqual(['healthy-100hz.csv', 'bad-no-rows.csv']);
    expect(list[1].refused).toMatch(/no data rows/);
  });

  it('refuses a bad option value', async () => {
    const { status, stderr } = await run(['pendulum', 'healthy-100hz.csv', '--start-angle', 'abc']);
    expect(status).toBe(1);
    expect(stderr).toMatch(/--start-angle/);
  });
});
