import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { runCli } from '../../../src/cli/main';

const cwd = new URL('../../fixtures/sensors/', import.meta.url).pathname;

async function run(argv: string[]): Promise<{ status: number; stdout: string; stderr: string }> {
  let stdout = '';
  let stderr = '';
  const status = await runCli(argv, { stdout: (t) => (stdout += t), stderr: (t) => (stderr += `${t}\n`), env: {}, cwd });
  return { status, stdout, stderr };
}

describe('kinnote motion', () => {
  it('prints the pendulum JSON for a phone recording; indices near the simulated leg\'s own (test/reference/sensors/phone-pendulum-simulator.ts, case 8 of seed 901 at 60 Hz: its 1 kHz trajectory gives R2 1.910, A0 74.30°, rest 90.62°, phone tilt on the shank 6.0°)', async () => {
    const { status, stdout, stderr } = await run(['motion', 'healthy-phone-60hz.csv']);
    expect(stderr).toBe('');
    expect(status).toBe(0);
    const x = JSON.parse(stdout) as Record<string, unknown>;
    for (const key of ['releaseTimeS', 'startAngleDeg', 'restAngleDeg', 'a0Deg', 'a1Deg', 'relaxationIndex', 'normalizedRelaxationIndex', 'peakCount', 'fit', 'emg', 'sampleRateHz', 'warnings']) {
      expect(x).toHaveProperty(key);
    }
    expect(Math.abs((x.relaxationIndex as number) - 1.91)).toBeLessThan(0.1);
    expect(Math.abs((x.a0Deg as number) - 74.3)).toBeLessThan(3);
    // Issue 13's goal: 2° plus the phone's tilt on the shank.
    expect(Math.abs((x.restAngleDeg as number) - 90.62)).toBeLessThan(2 + 6);
    expect(x.angleSource).toBe('angle');
  });

  it('has the same keys as `kinnote pendulum` on the trace it writes with --trace', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'kinnote-motion-'));
    try {
      const out = join(dir, 'trace.csv');
      const a = await run(['motion', 'extensor-severe-phone-30hz.csv', '--trace', out]);
      expect(a.status).toBe(0);
      const parsed = Papa.parse<string[]>(readFileSync(out, 'utf8').trim(), { skipEmptyLines: true });
      expect(parsed.data[0]).toEqual(['time_s', 'angle_deg']);
      expect(parsed.data.length).toBeGreaterThan(200);
      let stdout = '';
      const status = await runCli(['pendulum', out], { stdout: (t) => (stdout += t), stderr: () => undefined, env: {}, cwd });
      expect(status).toBe(0);
      const fromTrace = JSON.parse(stdout) as Record<string, unknown>;
      const fromMotion = JSON.parse(a.stdout) as Record<string, unknown>;
      expect(Object.keys(fromMotion).sort()).toEqual(Object.keys(fromTrace).sort());
      // Same angle, same engine: the indices agree (the trace file rounds to 1e-4°).
      expect(Math.abs((fromMotion.relaxationIndex as number) - (fromTrace.relaxationIndex as number))).toBeLessThan(1e-3);
      // The 30 Hz recording is flagged.
      expect((fromMotion.warnings as string[]).some((w) => /under 50/.test(w))).toBe(true);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });

  const refusals: Array<[string, RegExp]> = [
    ['bad-unknown-column.csv', /^kinnote motion: bad-unknown-column\.csv: row 1: unknown column "acc_w_ms2"/],
    ['bad-non-numeric.csv', /^kinnote motion: bad-non-numeric\.csv: row 4: non-numeric value "abc" in column acc_z_ms2/],
    ['bad-time-not-increasing.csv', /^kinnote motion: bad-time-not-increasing\.csv: row 5: time_ms not strictly increasing/],
    ['bad-missing-field.csv', /^kinnote motion: bad-missing-field\.csv: row 3: 6 fields, the header has 7/],
    ['bad-no-swing.csv', /^kinnote motion: bad-no-swing\.csv: no fall found: the phone never turned faster than/],
    ['bad-no-hold.csv', /^kinnote motion: bad-no-hold\.csv: the recording starts 0\.\d+ s before the leg starts to fall/],
    ['no-such-file.csv', /^kinnote motion: no-such-file\.csv: cannot read the file \(ENOENT\)/],
  ];
  for (const [file, message] of refusals) {
    it(`refuses ${file} with one line, nothing on stdout, status 1`, async () => {
      const { status, stdout, stderr } = await run(['motion', file]);
      expect(status).toBe(1);
      expect(stdout).toBe('');
      expect(stderr.trim().split('\n')).toHaveLength(1);
      expect(stderr).toMatch(message);
    });
  }
});
