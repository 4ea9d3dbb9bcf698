import { describe, expect, it } from 'vitest';
import { butterworthLowPass } from '../../../src/lib/pendulum/butterworth-low-pass';
import { zeroPhaseFilter } from '../../../src/lib/pendulum/zero-phase-filter';

/** Multiplies the sections into one transfer function b(z)/a(z). */
function transferFunction(sos: Float64Array): { b: number[]; a: number[] } {
  let b = [1];
  let a = [1];
  const multiply = (p: number[], q: number[]): number[] => {
    const r = new Array<number>(p.length + q.length - 1).fill(0);
    for (let i = 0; i < p.length; i++) for (let j = 0; j < q.length; j++) r[i + j] += p[i] * q[j];
    return r;
  };
  for (let s = 0; s < sos.length / 6; s++) {
    b = multiply(b, [sos[s * 6], sos[s * 6 + 1], sos[s * 6 + 2]]);
    a = multiply(a, [1, sos[s * 6 + 4], sos[s * 6 + 5]]);
  }
  return { b, a };
}

const SCIPY = 'scipy 1.17.1: scipy.signal.sos2tf(scipy.signal.butter(N, Wn, output="sos"))';
const designs = [
  {
    input: { order: 2, cutoffHz: 10, rateHz: 100 },
    expected: {
      b: [0.0674552738890719, 0.1349105477781438, 0.0674552738890719],
      a: [1.0, -1.1429805025399011, 0.41280159809618877],
    },
    tolerance: 1e-12,
    source: `${SCIPY}, N = 2, Wn = 0.2`,
  },
  {
    input: { order: 4, cutoffHz: 10, rateHz: 1000 },
    expected: {
      b: [8.984861463970648e-7, 3.593944585588259e-6, 5.390916878382389e-6, 3.593944585588259e-6, 8.984861463970648e-7],
      a: [1.0, -3.835825540647348, 5.520819136622228, -3.5335352194630145, 0.848555999266477],
    },
    tolerance: 1e-9,
    source: `${SCIPY}, N = 4, Wn = 0.02`,
  },
  {
    input: { order: 3, cutoffHz: 15, rateHz: 100 },
    expected: {
      b: [0.04953299635725319, 0.14859898907175956, 0.14859898907175956, 0.04953299635725319, 0],
      a: [1.0, -1.1619174836717325, 0.6959427557896507, -0.13776130125989283, 0],
    },
    tolerance: 1e-12,
    source: `${SCIPY}, N = 3, Wn = 0.3`,
  },
];

describe('butterworthLowPass', () => {
  it.each(designs)('matches $source', ({ input, expected, tolerance }) => {
    const { b, a } = transferFunction(butterworthLowPass(input.order, input.cutoffHz, input.rateHz));
    expect(b.length).toBe(expected.b.length);
    for (let i = 0; i < b.length; i++) {
      expect(Math.abs(b[i] - expected.b[i])).toBeLessThanOrEqual(tolerance * Math.max(1e-6, Math.abs(expected.b[i])) + 1e-18);
      expect(Math.abs(a[i] - expected.a[i])).toBeLessThanOrEqual(tolerance * Math.max(1, Math.abs(expected.a[i])));
    }
  });

  it('has the half-band textbook coefficients at fc = fs/4 (K = tan(π/4) = 1, worked by hand)', () => {
    // b0 = 1/(2 + √2), a1 = 0, a2 = (2 − √2)/(2 + √2): bilinear transform of 1/(s² + √2 s + 1).
    const sos = butterworthLowPass(2, 25, 100);
    expect(sos[0]).toBeCloseTo(1 / (2 + Math.SQRT2), 14);
    expect(sos[4]).toBeCloseTo(0, 14);
    expect(sos[5]).toBeCloseTo((2 - Math.SQRT2) / (2 + Math.SQRT2), 14);
  });

  it('has the Butterworth magnitude |H|² = 1/(1 + (tan(πf/fs)/tan(πfc/fs))^(2N)) (bilinear-transform identity)', () => {
    for (const order of [1, 2, 3, 4, 6]) {
      const fs = 200;
      const fc = 12;
      const sos = butterworthLowPass(order, fc, fs);
      for (const f of [0, 1, 5, 12, 20, 50, 90]) {
        const w = (2 * Math.PI * f) / fs;
        let re = 1;
        let im = 0;
        for (let s = 0; s < sos.length / 6; s++) {
          const o = s * 6;
          // H(e^{jw}) per section = (b0 + b1 e^{-jw} + b2 e^{-2jw}) / (1 + a1 e^{-jw} + a2 e^{-2jw})
          const nr = sos[o] + sos[o + 1] * Math.cos(w) + sos[o + 2] * Math.cos(2 * w);
          const ni = -sos[o + 1] * Math.sin(w) - sos[o + 2] * Math.sin(2 * w);
          const dr = 1 + sos[o + 4] * Math.cos(w) + sos[o + 5] * Math.cos(2 * w);
          const di = -sos[o + 4] * Math.sin(w) - sos[o + 5] * Math.sin(2 * w);
          const qr = (nr * dr + ni * di) / (dr * dr + di * di);
          const qi = (ni * dr - nr * di) / (dr * dr + di * di);
          [re, im] = [re * qr - im * qi, re * qi + im * qr];
        }
        const expected = 1 / (1 + (Math.tan((Math.PI * f) / fs) / Math.tan((Math.PI * fc) / fs)) ** (2 * order));
        expect(re * re + im * im).toBeCloseTo(expected, 10);
      }
    }
  });

  it('refuses a cut-off at or beyond Nyquist and a bad order', () => {
    expect(() => butterworthLowPass(2, 50, 100)).toThrow(RangeError);
    expect(() => butterworthLowPass(0, 10, 100)).toThrow(RangeError);
    expect(() => butterworthLowPass(2, Number.NaN, 100)).toThrow(RangeError);
  });
});

describe('zeroPhaseFilter', () => {
  const x = new Float64Array([0, 1, 3, 2, 5, 4, 4.5, 7, 6, 8, 7.5, 9, 12, 11, 10, 13, 12.5, 14, 15, 13]);
  it('matches scipy.signal.sosfiltfilt (scipy 1.17.1, butter(2, 0.25), default padding)', () => {
    const expected = [
      0.0026938179528784856, 1.1206130125077969, 2.1481123208671846, 3.0449548466270833, 3.8188141928219204, 4.513525459216462, 5.20243878542986,
      5.925446919090478, 6.679212562107121, 7.487472307835917, 8.393883681120409, 9.368191471558475, 10.27018197986658, 11.007895654806823,
      11.67499486480459, 12.377683533472268, 13.033874833896084, 13.42791366852273, 13.388617269147048, 12.9912977048833,
    ];
    const y = zeroPhaseFilter(butterworthLowPass(2, 12.5, 100), x, new Float64Array(x.length));
    for (let i = 0; i < x.length; i++) expect(y[i]).toBeCloseTo(expected[i], 10);
  });

  it('matches scipy.signal.sosfiltfilt (scipy 1.17.1, butter(4, 0.2), padlen = 10)', () => {
    const expected = [
      0.051765111072359066, 1.0941418200745519, 2.0837317274484253, 2.989194891826215, 3.801372763389697, 4.536268739397631, 5.229740344751814,
      5.926528650490254, 6.667594158807424, 7.478920291656097, 8.36372549263032, 9.299758766614637, 10.242634716634138, 11.133671776707473,
      11.909122953267628, 12.510279417890048, 12.897421127760254, 13.067958491430675, 13.070475799662455, 13.00100357099285,
    ];
    const y = zeroPhaseFilter(butterworthLowPass(4, 10, 100), x, new Float64Array(x.length), 10);
    for (let i = 0; i < x.length; i++) expect(y[i]).toBeCloseTo(expected[i], 10);
  });

  it('passes a constant and, with padding of three time constants (3·fs/fc), a ramp unchanged', () => {
    const sos = butterworthLowPass(2, 10, 1000);
    const constant = new Float64Array(500).fill(42.5);
    const ramp = Float64Array.from({ length: 500 }, (_, i) => 3 + 0.25 * i);
    const c = zeroPhaseFilter(sos, constant, new Float64Array(500));
    const r = zeroPhaseFilter(sos, ramp, new Float64Array(500), 300);
    for (let i = 0; i < 500; i++) {
      expect(c[i]).toBeCloseTo(42.5, 9);
      expect(Math.abs(r[i] - ramp[i])).toBeLessThan(1e-4);
    }
  });

  it('adds no phase lag: a 1 Hz sine keeps its zero crossings', () => {
    const fs = 500;
    const n = 5 * fs;
    const sine = Float64Array.from({ length: n }, (_, i) => Math.sin((2 * Math.PI * i) / fs));
    const y = zeroPhaseFilter(butterworthLowPass(2, 10, fs), sine, new Float64Array(n));
    for (let i = fs; i < n - fs; i++) expect(Math.abs(y[i] - sine[i])).toBeLessThan(1e-3);
  });

  it('handles n = 0 and n = 1', () => {
    const sos = butterworthLowPass(2, 10, 100);
    expect(zeroPhaseFilter(sos, new Float64Array(0), new Float64Array(0)).length).toBe(0);
    expect(zeroPhaseFilter(sos, new Float64Array([7]), new Float64Array(1))[0]).toBeCloseTo(7, 12);
  });
});
