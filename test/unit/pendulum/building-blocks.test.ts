import fc from 'fast-check';
import { median } from 'simple-statistics';
import { describe, expect, it } from 'vitest';
import { medianInPlace } from '../../../src/lib/pendulum/index';
import { centralDifference } from '../../../src/lib/pendulum/central-difference';
import { fitDampedCosine } from '../../../src/lib/pendulum/fit-damped-cosine';
import { integrateGyro } from '../../../src/lib/pendulum/integrate-gyro';
import { median5At, removeSpikes } from '../../../src/lib/pendulum/remove-spikes';
import { prominentPeaks } from '../../../src/lib/pendulum/prominent-peaks';
import { quickselect } from '../../../src/lib/pendulum/quickselect';
import { resampleLinear } from '../../../src/lib/pendulum/resample-linear';
import { uniformSampleRate } from '../../../src/lib/pendulum/uniform-sample-rate';

describe('quickselect / medianInPlace', () => {
  it('agrees with simple-statistics median (7.12.1) on random arrays', () => {
    fc.assert(
      fc.property(fc.array(fc.double({ min: -1e6, max: 1e6, noNaN: true }), { minLength: 1, maxLength: 60 }), (values) => {
        expect(medianInPlace(Float64Array.from(values))).toBeCloseTo(median(values), 9);
      }),
      { seed: 4, numRuns: 200 },
    );
  });
  it('returns every order statistic of a sorted copy', () => {
    const values = [5, 3, 3, 9, -1, 0, 7, 7, 2];
    const sorted = [...values].sort((a, b) => a - b);
    sorted.forEach((v, k) => expect(quickselect(Float64Array.from(values), k)).toBe(v));
    expect(() => quickselect(new Float64Array(3), 3)).toThrow(RangeError);
    expect(Number.isNaN(medianInPlace(new Float64Array(0)))).toBe(true);
  });
});

describe('prominentPeaks', () => {
  // Signal and expected indices from scipy 1.17.1:
  //   t = np.arange(0, 6, 0.05); v = np.round(10*np.exp(-t/2)*np.cos(2*np.pi*t) + 0.3*np.sin(17*t), 4)
  //   scipy.signal.find_peaks(v, prominence=1.0)[0]  → [19, 39, 60, 82, 98]
  //   scipy.signal.find_peaks(-v, prominence=1.0)[0] → [10, 29, 50, 71, 88, 109]
  const t = Array.from({ length: 120 }, (_, i) => i * 0.05);
  const v = Float64Array.from(t, (x) => Math.round((10 * Math.exp(-x / 2) * Math.cos(2 * Math.PI * x) + 0.3 * Math.sin(17 * x)) * 1e4) / 1e4);
  it('matches scipy.signal.find_peaks(prominence = 1)', () => {
    const out = new Int32Array(20);
    const maxima = prominentPeaks(v, 0, v.length, 1, out, 1);
    expect(Array.from(out.subarray(0, maxima))).toEqual([19, 39, 60, 82, 98]);
    const minima = prominentPeaks(v, 0, v.length, 1, out, -1);
    expect(Array.from(out.subarray(0, minima))).toEqual([10, 29, 50, 71, 88, 109]);
  });
  it('finds nothing in a constant signal and one peak on a flat top (at its middle)', () => {
    const out = new Int32Array(4);
    expect(prominentPeaks(new Float64Array(50).fill(3), 0, 50, 0.1, out)).toBe(0);
    const plateau = Float64Array.from([0, 1, 2, 2, 2, 2, 1, 0]);
    expect(prominentPeaks(plateau, 0, plateau.length, 1, out)).toBe(1);
    expect(out[0]).toBe(3);
  });
});

describe('median5At', () => {
  it('equals the middle of the sorted five for every ordering of five values (120 permutations, ties too)', () => {
    const permute = (xs: number[]): number[][] => (xs.length <= 1 ? [xs] : xs.flatMap((x, i) => permute([...xs.slice(0, i), ...xs.slice(i + 1)]).map((p) => [x, ...p])));
    for (const values of [[1, 2, 3, 4, 5], [1, 1, 2, 3, 3], [7, 7, 7, 1, 9]]) {
      const expected = [...values].sort((a, b) => a - b)[2];
      for (const p of permute(values)) expect(median5At(Float64Array.from(p), 2)).toBe(expected);
    }
  });
});

describe('removeSpikes', () => {
  it('removes isolated spikes and leaves a smooth swing untouched', () => {
    const n = 1000;
    const clean = Float64Array.from({ length: n }, (_, i) => 45 + 40 * Math.sin((2 * Math.PI * i) / 500));
    const spiky = clean.slice();
    spiky[100] += 30;
    spiky[600] -= 50;
    spiky[601] -= 50;
    expect(removeSpikes(spiky, 3)).toBe(3);
    // A replaced sample takes the five-sample median: a neighbour value, within 2 samples of slope (0.5°) here.
    for (let i = 0; i < n; i++) expect(Math.abs(spiky[i] - clean[i])).toBeLessThan(0.5);
    const again = clean.slice();
    expect(removeSpikes(again, 3)).toBe(0);
    expect(Array.from(again)).toEqual(Array.from(clean));
  });
});

describe('resampleLinear and uniformSampleRate', () => {
  it('reproduces a line exactly from irregular times', () => {
    const t = Float64Array.from([0, 0.011, 0.019, 0.032, 0.04, 0.049, 0.061]);
    const y = t.map((x) => 2 + 3 * x);
    const out = resampleLinear(t, y, 0, 100, new Float64Array(7));
    out.forEach((value, k) => expect(value).toBeCloseTo(2 + 3 * (k / 100), 12));
    const timing = uniformSampleRate(t);
    expect(timing.rateHz).toBe(100);
    expect(timing.maxIntervalS).toBeCloseTo(0.013, 12);
  });
  it('returns NaN rate for a single sample', () => {
    expect(Number.isNaN(uniformSampleRate(new Float64Array([1])).rateHz)).toBe(true);
  });
});

describe('centralDifference and integrateGyro', () => {
  it('differentiate and integrate a quadratic consistently', () => {
    const fs = 100;
    const angle = Float64Array.from({ length: 200 }, (_, i) => 0.5 * 30 * (i / fs) ** 2);
    const velocity = centralDifference(angle, fs, new Float64Array(200));
    for (let i = 1; i < 199; i++) expect(velocity[i]).toBeCloseTo(30 * (i / fs), 9);
    const exact = Float64Array.from({ length: 200 }, (_, i) => 30 * (i / fs) + 2);
    const back = integrateGyro(exact, fs, 2, 0, 2, 0, 0, new Float64Array(200));
    for (let i = 0; i < 200; i++) expect(back[i]).toBeCloseTo(angle[i], 9);
  });
});

describe('fitDampedCosine', () => {
  const fixtures = [
    { input: { rest: 90, a: 80, tau: 1.6, omega: 5.5, phase: Math.PI }, noiseDeg: 0, tolerance: 1e-6 },
    { input: { rest: 70, a: 40, tau: 0.6, omega: 7, phase: 3 }, noiseDeg: 0, tolerance: 1e-6 },
    { input: { rest: 85, a: 70, tau: 1.2, omega: 5, phase: -3 }, noiseDeg: 1, tolerance: 0.02 },
  ];
  it.each(fixtures)('recovers known parameters (synthetic, noise $noiseDeg°)', ({ input, noiseDeg, tolerance }) => {
    const fs = 100;
    const n = 800;
    const t = Float64Array.from({ length: n }, (_, i) => i / fs);
    let seed = 7;
    const noise = (): number => {
      seed = (seed * 16807) % 2147483647;
      return ((seed / 2147483647) * 2 - 1) * Math.sqrt(3);
    };
    const y = t.map((x) => input.rest + input.a * Math.exp(-x / input.tau) * Math.cos(input.omega * x + input.phase) + noiseDeg * noise());
    const fit = fitDampedCosine(t, y, 0, n, 1, { restDeg: input.rest + 2, amplitudeDeg: input.a * 0.8, tauS: input.tau * 1.5, omegaRadS: input.omega * 0.9, phaseRad: Math.PI });
    expect(fit.converged).toBe(true);
    expect(Math.abs(fit.amplitudeDeg / input.a - 1)).toBeLessThan(tolerance);
    expect(Math.abs(fit.tauS / input.tau - 1)).toBeLessThan(tolerance);
    expect(Math.abs(fit.omegaRadS / input.omega - 1)).toBeLessThan(tolerance);
    expect(fit.r2).toBeGreaterThan(noiseDeg === 0 ? 0.999999 : 0.99);
  });
  it('reports a growing oscillation as not converged', () => {
    const t = Float64Array.from({ length: 300 }, (_, i) => i / 100);
    const y = t.map((x) => 10 * Math.exp(x / 2) * Math.cos(5 * x));
    const fit = fitDampedCosine(t, y, 0, 300, 1, { restDeg: 0, amplitudeDeg: 10, tauS: 1, omegaRadS: 5, phaseRad: 0 });
    expect(fit.converged).toBe(false);
  });
});
