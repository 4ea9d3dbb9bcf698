// Issue 20: "a motion file with minutes of stillness is refused". A leg held by hand for 2–5 minutes
// before the release (tremor, sway, gyro bias and noise all the while), written as a motion CSV and run
// through the `kinnote motion` entry point. Before the fix the gyro was integrated back through the whole
// stillness from the hold, so the residual bias (the rest's mean rate carries the noise: 1.4 deg/s over
// 1.5 s at 60 Hz leaves ~0.15 deg/s, ~45° over 5 minutes) walked the reconstructed angle out of
// -30..180 long before the test began, and the engine refused a sound recording. Each case must now be
// within the issue-13 goal figures (A1 ±3°, R2 ±0.10, rest ±(2° + the phone's tilt), peaks ±1) or
// refused with a reason about the recording; here all are sound recordings, so all must be analysed.
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli } from '../../../src/cli/main';
import { formatMotionCsv } from '../../../src/lib/sensors';
import { phonePendulumCases, simulatePhonePendulum } from '../../reference/sensors/phone-pendulum-simulator';

const HOLDS_S = [120, 180, 300, 150, 240];

describe('kinnote motion with minutes of hand-held stillness before the release (issue 20)', () => {
  it('analyses each recording within the goal figures (the independent simulator, holds of 2–5 min)', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'kinnote-still-'));
    const lines: string[] = [];
    try {
      const cases = phonePendulumCases(14, 77);
      // Six of them: before the fix five of these were refused ("angle … outside -30..180"), one analysed.
      for (const k of [0, 2, 4, 7, 11, 13]) {
        const base = cases[k]!;
        const holdS = HOLDS_S[k % HOLDS_S.length]!;
        const release = Math.round(holdS * base.rateHz);
        // The case's own dropped runs stay (now inside the hold), plus one in the fast first fall.
        const c = { ...base, holdS, drops: [...base.drops, [release + Math.round(0.12 * base.rateHz), 3] as const] };
        const { recording, truth } = simulatePhonePendulum(c);
        const file = `hold-${holdS}s-case-${k + 1}.csv`;
        writeFileSync(join(dir, file), formatMotionCsv(recording));
        let stdout = '';
        let stderr = '';
        const status = await runCli(['motion', file], { stdout: (t) => (stdout += t), stderr: (t) => (stderr += t), env: {}, cwd: dir });
        if (status !== 0) {
          lines.push(`${file} (${c.name}): refused: ${stderr.trim()}`);
          continue;
        }
        const x = JSON.parse(stdout) as { relaxationIndex: number; a1Deg: number; restAngleDeg: number; peakCount: number };
        const errors = {
          r2: Math.abs(x.relaxationIndex - truth.r2),
          a1: Math.abs(x.a1Deg - truth.a1Deg),
          rest: Math.abs(x.restAngleDeg - truth.restDeg),
          peaks: Math.abs(x.peakCount - truth.peakCount),
        };
        const ok = errors.r2 < 0.1 && errors.a1 < 3 && errors.rest < 2 + c.tiltDeg && errors.peaks <= 1;
        lines.push(`${file} (${c.name}): R2 ${x.relaxationIndex.toFixed(3)} (true ${truth.r2.toFixed(3)}), A1 ${x.a1Deg.toFixed(1)}° (${truth.a1Deg.toFixed(1)}°), rest ${x.restAngleDeg.toFixed(1)}° (${truth.restDeg.toFixed(1)}°, tilt ${c.tiltDeg.toFixed(1)}°), peaks ${x.peakCount} (${truth.peakCount})${ok ? '' : '  OUT OF TOLERANCE'}`);
      }
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
    console.log(lines.join('\n'));
    expect(lines.filter((l) => /refused|OUT OF TOLERANCE/.test(l))).toEqual([]);
  }, 120_000);
});
