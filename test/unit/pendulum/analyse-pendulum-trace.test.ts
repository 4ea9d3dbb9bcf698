import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { analysePendulumCsv, analysePendulumTrace, PendulumInputError } from '../../../src/lib/pendulum/index';
import { gaussian, mulberry32, reflexForSeverity, sampleTrace, simulatePendulum, toCsv, withEmg } from '../../reference/pendulum/simulator';

const relaxed = sampleTrace(simulatePendulum({ startAngleDeg: 10, durationS: 12 }), 100);

function refusal(run: () => unknown): PendulumInputError {
  try {
    run();
  } catch (error) {
    if (error instanceof PendulumInputError) return error;
    throw error;
  }
  throw new Error('expected a refusal');
}

describe('analysePendulumTrace edge cases', () => {
  it('refuses n = 0, n = 1, NaN, a constant trace and unequal columns', () => {
    expect(refusal(() => analysePendulumTrace({ timeS: new Float64Array(0), angleDeg: new Float64Array(0) })).reason).toMatch(/no data rows/);
    expect(refusal(() => analysePendulumTrace({ timeS: new Float64Array([0]), angleDeg: new Float64Array([1]) })).reason).toMatch(/one data row/);
    const nan = relaxed.angleDeg?.slice() as Float64Array;
    nan[40] = Number.NaN;
    const error = refusal(() => analysePendulumTrace({ timeS: relaxed.timeS, angleDeg: nan }, { fileName: 'x.csv' }));
    expect(error.line).toBe(42);
    expect(error.message).toMatch(/^x\.csv: row 42: non-finite angle/);
    const flat = new Float64Array(relaxed.timeS.length).fill(20);
    expect(refusal(() => analysePendulumTrace({ timeS: relaxed.timeS, angleDeg: flat })).reason).toMatch(/no release found/);
    expect(refusal(() => analysePendulumTrace({ timeS: relaxed.timeS, angleDeg: new Float64Array(3) })).reason).toMatch(/3 samples/);
  });

  it('refuses a recording cut before rest and a rate under 20 Hz', () => {
    const cut = Math.round(3.5 * 100);
    expect(refusal(() => analysePendulumTrace({ timeS: relaxed.timeS.slice(0, cut), angleDeg: relaxed.angleDeg?.slice(0, cut) })).reason).toMatch(
      /ends before the leg has come to rest/,
    );
    const slow = sampleTrace(simulatePendulum({ durationS: 12 }), 15);
    expect(refusal(() => analysePendulumTrace({ timeS: slow.timeS, angleDeg: slow.angleDeg })).reason).toMatch(/under 20 Hz/);
  });

  it('does not modify its input', () => {
    const angle = relaxed.angleDeg?.slice() as Float64Array;
    const time = relaxed.timeS.slice();
    analysePendulumTrace({ timeS: time, angleDeg: angle });
    expect(angle).toEqual(relaxed.angleDeg);
    expect(time).toEqual(relaxed.timeS);
  });
});

describe('invariants (fast-check)', () => {
  const reference = analysePendulumTrace({ timeS: relaxed.timeS, angleDeg: relaxed.angleDeg }).indices;
  it('shifting the time axis leaves R2 and the relative times unchanged', () => {
    fc.assert(
      fc.property(fc.double({ min: -5000, max: 5000, noNaN: true }), (shift) => {
        const x = analysePendulumTrace({ timeS: relaxed.timeS.map((t) => t + shift), angleDeg: relaxed.angleDeg }).indices;
        expect(x.relaxationIndex).toBeCloseTo(reference.relaxationIndex, 6);
        expect(x.firstPeakTimeS).toBeCloseTo(reference.firstPeakTimeS, 6);
        expect(x.releaseTimeS - shift).toBeCloseTo(reference.releaseTimeS, 6);
      }),
      { seed: 1, numRuns: 12 },
    );
  });
  it('adding a constant angle offset leaves R2, A0, A1 and the areas unchanged', () => {
    fc.assert(
      fc.property(fc.double({ min: -25, max: 25, noNaN: true }), (offset) => {
        const x = analysePendulumTrace({ timeS: relaxed.timeS, angleDeg: relaxed.angleDeg?.map((a) => a + offset) }).indices;
        expect(x.relaxationIndex).toBeCloseTo(reference.relaxationIndex, 6);
        expect(x.a0Deg).toBeCloseTo(reference.a0Deg, 6);
        expect(x.a1Deg).toBeCloseTo(reference.a1Deg, 6);
        expect(x.startAngleDeg - offset).toBeCloseTo(reference.startAngleDeg, 6);
        expect(x.flexionAreaDegS).toBeCloseTo(reference.flexionAreaDegS, 5);
      }),
      { seed: 2, numRuns: 12 },
    );
  });
});

describe('warnings and patterns', () => {
  it('never lets R2 alone call a flexor-type leg unaffected', () => {
    const s = sampleTrace(simulatePendulum({ reflex: reflexForSeverity('flexor', 'severe'), durationS: 12 }), 200);
    const x = analysePendulumTrace({ timeS: s.timeS, angleDeg: s.angleDeg }).indices;
    expect(x.relaxationIndex).toBeGreaterThan(1.5);
    expect(x.warnings.some((w) => /do not read this leg as unaffected on R2 alone/.test(w))).toBe(true);
  });
  it('reads an extensor-type catch as extension-dominant with a low R2', () => {
    const s = sampleTrace(simulatePendulum({ reflex: reflexForSeverity('extensor', 'severe'), durationS: 10 }), 200);
    const x = analysePendulumTrace({ timeS: s.timeS, angleDeg: s.angleDeg }).indices;
    expect(x.relaxationIndex).toBeLessThan(1.2);
    expect(x.dominantSide).toBe('extension');
  });
  it('finds EMG bursts in the first flexion phase of an extensor catch and none for a relaxed leg', () => {
    const rng = mulberry32(5);
    const caught = withEmg(sampleTrace(simulatePendulum({ reflex: reflexForSeverity('extensor', 'moderate'), durationS: 9 }), 1000), 5, 50, rng);
    const quiet = withEmg(sampleTrace(simulatePendulum({ durationS: 12 }), 1000), 5, 50, rng);
    const a = analysePendulumTrace({ timeS: caught.timeS, angleDeg: caught.angleDeg, emgUv: caught.emgUv }).indices.emg;
    const b = analysePendulumTrace({ timeS: quiet.timeS, angleDeg: quiet.angleDeg, emgUv: quiet.emgUv }).indices.emg;
    expect(a?.bursts[0]?.phase).toBe('flexion 1');
    // The reflex starts 60 ms after the stretch velocity passes 30 deg/s, a few tens of ms after release.
    expect(a?.bursts[0]?.onsetS).toBeGreaterThan(0.04);
    expect(a?.bursts[0]?.onsetS).toBeLessThan(0.2);
    expect(b?.bursts.length).toBe(0);
    expect(analysePendulumTrace({ timeS: quiet.timeS, angleDeg: quiet.angleDeg }).indices.emg).toBeNull();
  });
  it('analyses CSV text with the same result as the typed arrays', () => {
    const text = toCsv({ time_s: relaxed.timeS, angle_deg: relaxed.angleDeg }, 6);
    const fromCsv = analysePendulumCsv(text, 'leg.csv').indices;
    const direct = analysePendulumTrace({ timeS: relaxed.timeS, angleDeg: relaxed.angleDeg }).indices;
    expect(fromCsv.relaxationIndex).toBeCloseTo(direct.relaxationIndex, 5);
    expect(() => analysePendulumCsv('time_s,angle_deg\n', 'empty.csv')).toThrow(/empty\.csv: no data rows/);
  });
});

describe('first period and dominant side (issue 13)', () => {
  // A hand-drawn trace: held at 5°, an early catch at 40° (below rest), then swings about a 60° rest.
  // Between successive extremes a half-cosine (zero velocity at each extreme). Flexion peaks above
  // rest + 1°: 85° at 2.0 s and 72° at 3.1 s, so the first period is 1.1 s by construction.
  const extremes: Array<[number, number]> = [
    [0, 5], [1, 5], [1.3, 40], [1.45, 37], [2.0, 85], [2.55, 45], [3.1, 72], [3.65, 52], [4.2, 64], [4.75, 57], [5.3, 60.8], [5.85, 59.6], [6.4, 60], [10, 60],
  ];
  const rate = 200;
  const n = 10 * rate + 1;
  const timeS = new Float64Array(n);
  const angleDeg = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const t = i / rate;
    let k = 0;
    while (k < extremes.length - 2 && t > extremes[k + 1][0]) k++;
    const [t0, a0] = extremes[k];
    const [t1, a1] = extremes[k + 1];
    const u = Math.min(1, Math.max(0, (t - t0) / (t1 - t0)));
    timeS[i] = t;
    angleDeg[i] = a0 + (a1 - a0) * 0.5 * (1 - Math.cos(Math.PI * u));
  }
  const x = analysePendulumTrace({ timeS, angleDeg }).indices;
  it('reports the first period between the first two flexion peaks that stand > 1° above rest, past an early catch', () => {
    expect(x.peakCount).toBe(3);
    expect(x.firstPeriodS).not.toBeNull();
    expect(Math.abs((x.firstPeriodS as number) - 1.1)).toBeLessThan(0.02);
  });
  it('names the dominant side exactly when one area is at least 1.5 times the other', () => {
    const ratio = Math.max(x.flexionAreaDegS, x.extensionAreaDegS) / Math.min(x.flexionAreaDegS, x.extensionAreaDegS);
    const named = x.flexionAreaDegS >= x.extensionAreaDegS ? 'flexion' : 'extension';
    expect(x.dominantSide).toBe(ratio >= 1.5 ? named : 'balanced');
  });
});

describe('EMG bursts hold their false-alarm rate over long silent stretches (issue 13)', () => {
  // Independent EMG: resting level 3–6 µV (Gaussian) that wanders by ±35 % over tens of seconds (skin
  // and electrode contact change), 50 Hz mains hum of 1–8 µV whose amplitude drifts too, on a relaxed
  // leg's 30 s recording; bursts added as 150 ms of 10× the resting level.
  const leg = sampleTrace(simulatePendulum({ durationS: 30 }), 1000);
  const releaseS = analysePendulumTrace({ timeS: leg.timeS, angleDeg: leg.angleDeg }).indices.releaseTimeS;
  const emgFor = (seed: number, burstStartsS: readonly number[]) => {
    const rng = mulberry32(seed);
    const resting = 3 + 3 * rng();
    const hum = 1 + 7 * rng();
    const drift = 2 * Math.PI * (0.05 + 0.2 * rng());
    const wander = 2 * Math.PI * (0.03 + 0.07 * rng());
    const phase = 2 * Math.PI * rng();
    const emg = new Float64Array(leg.timeS.length);
    for (let i = 0; i < emg.length; i++) {
      const t = leg.timeS[i];
      const inBurst = burstStartsS.some((b) => t >= releaseS + b && t < releaseS + b + 0.15);
      emg[i] = resting * (1 + 0.35 * Math.sin(wander * t + phase)) * (inBurst ? 10 : 1) * gaussian(rng) + hum * (1 + 0.3 * Math.sin(drift * t)) * Math.sin(2 * Math.PI * 50 * t);
    }
    return emg;
  };
  it('finds no burst in 12 silent 30 s recordings with hum and noise', () => {
    let falseBursts = 0;
    for (let seed = 1; seed <= 12; seed++) {
      const x = analysePendulumTrace({ timeS: leg.timeS, angleDeg: leg.angleDeg, emgUv: emgFor(seed, []) }).indices.emg;
      falseBursts += x?.bursts.length ?? 0;
    }
    expect(falseBursts).toBe(0);
  });
  it('still finds every clear burst, its onset within 60 ms, in the same noise', () => {
    const starts = [0.08, 4, 9];
    for (let seed = 21; seed <= 26; seed++) {
      const x = analysePendulumTrace({ timeS: leg.timeS, angleDeg: leg.angleDeg, emgUv: emgFor(seed, starts) }).indices.emg;
      expect(x?.bursts.length).toBe(3);
      x?.bursts.forEach((b, j) => expect(Math.abs(b.onsetS - starts[j])).toBeLessThan(0.06));
    }
  });
});
